import type { Setup } from '../scenario/setup';
import { describeChange } from './describeChange';

/** One step of the history: the setup after it, and what it did. */
export interface HistoryStep {
  readonly setup: Setup;
  /** Short name of the step for the history list ('E_Z 0.6 → 0.8', 'Zoom in'). */
  readonly label: string;
  /**
   * What kind of change it was ('zeeman', 'extent', 'zoom-wheel', 'load', ...): consecutive
   * changes of one kind within MERGE_MS make one step (a slider drag, a number typed digit by
   * digit, a wheel turned several notches).
   */
  readonly kind: string;
  /** When it was made (ms since the epoch). */
  readonly at: number;
  /** For a step back to a previous extent: the step whose extent it went back to. */
  readonly backTo?: number;
}

/** The steps kept, oldest first, and the one shown (undo moves it back, redo forward). */
export interface SetupHistory {
  readonly steps: readonly HistoryStep[];
  readonly index: number;
}

/** Steps kept (and saved with the autosave): the oldest go first. */
export const HISTORY_LIMIT = 50;

/** Changes of one kind closer together than this (ms) make one step. */
export const MERGE_MS = 1000;

/** Kinds of step that never take in a later change: each is a step of its own. */
const SINGLE_KINDS = new Set([
  'start',
  'several',
  'load',
  'link',
  'demo',
  'zoom-box',
  'extent-back',
]);

/** What a caller says about the change it is about to make. */
export interface StepName {
  readonly label: string;
  readonly kind: string;
  readonly backTo?: number;
}

/** A history of one step: the setup the app starts with. */
export function startHistory(setup: Setup, label = 'Start', at = 0): SetupHistory {
  return { steps: [{ setup, label, kind: 'start', at }], index: 0 };
}

/** The setup the shown step stands for. */
export function currentSetup(history: SetupHistory): Setup {
  return history.steps[history.index]!.setup;
}

/**
 * The history after a change to `setup` at time `now`: a new step after the shown one (steps
 * that were undone are dropped, and the oldest beyond HISTORY_LIMIT), or, for a change of the
 * same kind as the last step within MERGE_MS of it, that step with the new setup (its label
 * then names the whole change). `name` overrides the label and kind found by `describeChange`.
 */
export function recordStep(
  history: SetupHistory,
  setup: Setup,
  now: number,
  name?: StepName,
): SetupHistory {
  const shown = history.steps[history.index]!;
  if (setup === shown.setup) return history;
  const found = name ?? describeChange(shown.setup, setup);
  const atEnd = history.index === history.steps.length - 1;
  if (
    atEnd &&
    history.index > 0 &&
    found.kind === shown.kind &&
    !SINGLE_KINDS.has(found.kind) &&
    now - shown.at <= MERGE_MS
  ) {
    const before = history.steps[history.index - 1]!.setup;
    const label = name?.label ?? describeChange(before, setup).label;
    const merged: HistoryStep = { ...shown, setup, label, at: now };
    return { steps: [...history.steps.slice(0, -1), merged], index: history.index };
  }
  const step: HistoryStep = {
    setup,
    label: found.label,
    kind: found.kind,
    at: now,
    ...(name?.backTo !== undefined ? { backTo: name.backTo } : {}),
  };
  const steps = [...history.steps.slice(0, history.index + 1), step];
  const dropped = Math.max(0, steps.length - HISTORY_LIMIT);
  const kept = steps.slice(dropped).map((s) =>
    // A step back to an extent that was dropped keeps no pointer to it.
    s.backTo === undefined
      ? s
      : s.backTo - dropped < 0
        ? { ...s, backTo: undefined }
        : { ...s, backTo: s.backTo - dropped },
  );
  return { steps: kept, index: kept.length - 1 };
}

/** The history shown at step `index` (undo, redo and the list move it); null when out of range. */
export function moveTo(history: SetupHistory, index: number): SetupHistory | null {
  if (!Number.isInteger(index) || index < 0 || index >= history.steps.length) return null;
  if (index === history.index) return null;
  return { steps: history.steps, index };
}
