import { lab } from 'd3';
import {
  CUT_DISTANCE_LABEL,
  ORDER_GROUPS,
  ORDER_TOLERANCE,
  type CutResult,
} from '../../solver/index';
import { TOKEN_COLOURS, UNKNOWN_TOKEN_COLOUR } from './palette';

/**
 * What the Cut's charts show, shared by the app's charts and the exported figure: one panel per
 * quantity, each with its series, over one horizontal axis.
 */
export interface CutSeries {
  readonly key: string;
  /** Legend text (typeset by the figure: 'u_perp', 'E_Z'). */
  readonly label: string;
  readonly colour: string;
  /** SVG dash pattern in units of the line width ('' for solid). */
  readonly dash: string;
  readonly values: Float64Array;
}

export interface CutChartPanel {
  readonly key: 'energy' | 'slope' | 'groups' | 'canting' | 'gap';
  /** Vertical axis title, typeset ('E', 'dE/dE_Z', 'theta_c (deg)'). */
  readonly title: string;
  readonly series: readonly CutSeries[];
  /** Order-parameter groups that stay zero along the whole cut (named under the panel). */
  readonly zeroGroups?: readonly string[];
}

/** Line colour of a label token: its region colour, darkened to L* <= 50 to read as a line. */
export function tokenLineColour(token: string): string {
  const c = lab(TOKEN_COLOURS[token] ?? UNKNOWN_TOKEN_COLOUR);
  c.l = Math.min(c.l, 50);
  return c.formatHex();
}

/** Dash patterns (in line widths) that tell the group curves apart in greyscale. */
const GROUP_DASHES = ['', '4 2', '1 1.5', '6 2 1 2', '2 2', '8 2', '1 3', '4 1 1 1 1 1'];

const INK = '#1a1a1a';

/**
 * Title of the horizontal axis, in the notation of `labelPieces`: the swept quantity ('u_perp',
 * 'E_Z'), the tilt angle theta in degrees, or the distance s along a slanted line.
 */
export function cutAxisTitle(cut: Pick<CutResult, 'axis'>): string {
  if (cut.axis.label === 'theta') return 'theta (deg)';
  if (cut.axis.label === CUT_DISTANCE_LABEL) return 's, distance along the cut';
  return cut.axis.label;
}

/** The horizontal quantity's symbol alone ('u_perp', 'theta', 's' for the distance). */
export function cutAxisSymbol(cut: Pick<CutResult, 'axis'>): string {
  return cut.axis.label === CUT_DISTANCE_LABEL ? 's' : cut.axis.label;
}

/** The quantity dE is taken against, for the slope panel's title. */
function slopeTitle(cut: Pick<CutResult, 'axis'>): string {
  if (cut.axis.label === 'theta') return 'dE/d\u03b8 (per deg)';
  if (cut.axis.label === CUT_DISTANCE_LABEL) return 'dE/ds';
  return `dE/d${cut.axis.label}`;
}

/**
 * The panels of a Cut, top to bottom: energy, its derivative along the horizontal axis, the
 * order-parameter groups that are nonzero somewhere (public/notes.html#order-parameters), the
 * canting angle and the quasiparticle gap.
 */
export function cutPanels(cut: CutResult): CutChartPanel[] {
  const n = cut.t.length;
  const groups: CutSeries[] = [];
  const zeroGroups: string[] = [];
  ORDER_GROUPS.forEach((g, k) => {
    const values = new Float64Array(n);
    let largest = 0;
    for (let i = 0; i < n; i++) {
      values[i] = cut.groups[ORDER_GROUPS.length * i + k]!;
      largest = Math.max(largest, values[i]!);
    }
    if (largest <= ORDER_TOLERANCE) {
      zeroGroups.push(g.title);
      return;
    }
    groups.push({
      key: g.key,
      label: g.title,
      colour: tokenLineColour(g.token),
      dash: GROUP_DASHES[k]!,
      values,
    });
  });
  const degrees = Float64Array.from(cut.canting, (v) => (v * 180) / Math.PI);
  const one = (key: string, label: string, values: Float64Array): CutSeries[] => [
    { key, label, colour: INK, dash: '', values },
  ];
  return [
    { key: 'energy', title: 'E', series: one('energy', 'energy', cut.energy) },
    { key: 'slope', title: slopeTitle(cut), series: one('slope', 'derivative', cut.slope) },
    { key: 'groups', title: '|o|', series: groups, zeroGroups },
    { key: 'canting', title: 'theta_c (deg)', series: one('canting', 'canting angle', degrees) },
    { key: 'gap', title: 'gap', series: one('gap', 'quasiparticle gap', cut.gap) },
  ];
}

/** Finite [min, max] of a panel's values, padded 5 percent (a flat line gets a unit span). */
export function panelExtent(panel: CutChartPanel): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const s of panel.series) {
    for (const v of s.values) {
      if (!Number.isFinite(v)) continue;
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    }
  }
  if (!Number.isFinite(lo)) return [0, 1];
  if (panel.key === 'groups' || panel.key === 'canting') lo = Math.min(lo, 0);
  const span = hi - lo;
  if (span <= 1e-12 * Math.max(1, Math.abs(hi))) return [lo - 0.5, hi + 0.5];
  return [lo - 0.05 * span, hi + 0.05 * span];
}

/** Phase segments along the cut: [start, end] in the horizontal quantity, with their label. */
export function phaseSegments(cut: CutResult): { from: number; to: number; label: string }[] {
  const out: { from: number; to: number; label: string }[] = [];
  const n = cut.t.length;
  let start = cut.s[0]!;
  let transition = 0;
  for (let i = 0; i + 1 < n; i++) {
    if (cut.labels[i] === cut.labels[i + 1]) continue;
    // The located transition between samples i and i + 1 (in order along the cut).
    const located = cut.transitions[transition++];
    const at = located ? located.s : (cut.s[i]! + cut.s[i + 1]!) / 2;
    out.push({ from: start, to: at, label: cut.labels[i]! });
    start = at;
  }
  out.push({ from: start, to: cut.s[n - 1]!, label: cut.labels[n - 1]! });
  return out;
}

/**
 * Index ranges [first, last] of samples that a curve joins: it breaks across each first-order
 * transition (the state jumps there), and runs on through continuous ones.
 */
export function curveRuns(cut: CutResult): [number, number][] {
  const runs: [number, number][] = [];
  let first = 0;
  let transition = 0;
  for (let i = 0; i + 1 < cut.t.length; i++) {
    if (cut.labels[i] === cut.labels[i + 1]) continue;
    const located = cut.transitions[transition++];
    if (located?.order === 'first') {
      runs.push([first, i]);
      first = i + 1;
    }
  }
  runs.push([first, cut.t.length - 1]);
  return runs;
}
