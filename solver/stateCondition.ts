import { ModelError } from './model';
import { ORDER_GROUPS, type OrderGroupKey } from './orderParameters';
import { ORDER_TOLERANCE } from './phaseLabel';

/**
 * What a `phase` observation says about the state (public/notes.html#observations): either a
 * label as the solver prints it (`CAF`, `CDW+SBxy`, ...), which must match exactly, or a
 * condition on the order-parameter groups for when a measurement cannot tell more, such as
 * "spin moment along the field" or "no spin moment": clauses joined by "and", each a group
 * phrase, negated by a leading "no".
 */
export type StateCondition =
  | { readonly kind: 'label'; readonly label: string }
  | {
      readonly kind: 'groups';
      readonly text: string;
      readonly clauses: readonly {
        readonly groups: readonly OrderGroupKey[];
        readonly present: boolean;
      }[];
    };

/**
 * Group phrases of a condition and the groups each stands for (any of them present counts as
 * present). Our own wording; the model notes list them.
 */
export const CONDITION_PHRASES: Readonly<Record<string, readonly OrderGroupKey[]>> = {
  'spin moment along the field': ['spinAlongField'],
  'spin moment in the plane': ['spinInPlane'],
  'spin moment': ['spinAlongField', 'spinInPlane'],
  'neel order along the field': ['neelAlongField'],
  'neel order in the plane': ['neelInPlane'],
  'neel order': ['neelAlongField', 'neelInPlane'],
  'sublattice imbalance': ['cdw'],
  'bond order': ['bondOrder'],
  'spin bond order': ['spinBondAlongField', 'spinBondInPlane'],
};

const TOKENS = new Set(ORDER_GROUPS.map((g) => g.token));

/** Whether `text` is a label the solver can print: `sym`, or group tokens joined by `+`. */
export function isPhaseLabel(text: string): boolean {
  if (text === 'sym') return true;
  const tokens = text.split('+');
  const order = ORDER_GROUPS.map((g) => g.token);
  let last = -1;
  for (const token of tokens) {
    const at = order.indexOf(token);
    if (!TOKENS.has(token) || at <= last) return false;
    last = at;
  }
  return tokens.length > 0;
}

/**
 * Reads the value of a `phase` observation. Throws ModelError (a short reason, for the caller to
 * prefix with the row and column) when it is neither a label nor a condition.
 */
export function parseStateCondition(value: string): StateCondition {
  const text = value.trim();
  if (isPhaseLabel(text)) return { kind: 'label', label: text };
  const normal = text
    .toLowerCase()
    .replace(/\u00e9/g, 'e')
    .replace(/\s+/g, ' ');
  const clauses = normal.split(' and ').map((clause) => {
    const present = !clause.startsWith('no ');
    const phrase = present ? clause : clause.slice(3);
    const groups = CONDITION_PHRASES[phrase];
    if (groups === undefined) {
      throw new ModelError(
        `expected a phase label (${[...TOKENS].join(', ')}, joined by +, or sym) or a condition such as "spin moment along the field" or "no spin moment"`,
      );
    }
    return { groups, present };
  });
  return { kind: 'groups', text, clauses };
}

const GROUP_INDEX = new Map(ORDER_GROUPS.map((g, i) => [g.key, i]));

/**
 * Whether a state with phase label `label` and group magnitudes `groups` (ORDER_GROUPS order,
 * `groupMagnitudes`) meets the condition; a group counts as present above ORDER_TOLERANCE, the
 * labels' own threshold.
 */
export function conditionHolds(
  condition: StateCondition,
  label: string,
  groups: ArrayLike<number>,
): boolean {
  if (condition.kind === 'label') return label === condition.label;
  return condition.clauses.every((clause) => {
    const present = clause.groups.some((g) => groups[GROUP_INDEX.get(g)!]! > ORDER_TOLERANCE);
    return present === clause.present;
  });
}
