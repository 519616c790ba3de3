import { useFourfold } from '../store/index';
import { moveTo, recordStep, type StepName } from './setupHistory';

/** The name the next setup change takes (set by whoever makes it), or null. */
let nextName: StepName | null = null;
/** A move through the history is replacing the setup: that change is not a new step. */
let moving = false;

/**
 * Names the next change of the setup as a step of the history ('Zoom in', 'Loaded x.json');
 * without a name a step is named by what changed (`describeChange`). Call it just before the
 * change; a call with no change after it is forgotten at the next change's name.
 */
export function nameNextStep(name: StepName): void {
  nextName = name;
}

/** Shows step `index` of the history: its setup replaces the current one. False if none. */
export function goToStep(index: number): boolean {
  const { history, setHistory, replaceSetup } = useFourfold.getState();
  const moved = moveTo(history, index);
  if (moved === null) return false;
  moving = true;
  try {
    setHistory(moved);
    replaceSetup(moved.steps[moved.index]!.setup);
  } finally {
    moving = false;
  }
  return true;
}

/** Undo: back one step. False when there is none. */
export function undoStep(): boolean {
  return goToStep(useFourfold.getState().history.index - 1);
}

/** Redo: forward one step. False when there is none. */
export function redoStep(): boolean {
  return goToStep(useFourfold.getState().history.index + 1);
}

/**
 * Keeps the history in step with the setup: every change that is not a move through the
 * history becomes a step (or joins the last one, `recordStep`). Start once, before the app's
 * first render (the link's setup, applied then, is a step). Returns a function that stops it.
 */
export function startHistoryDriver(now: () => number = Date.now): () => void {
  return useFourfold.subscribe((state, previous) => {
    if (state.setup === previous.setup) return;
    const name = nextName;
    nextName = null;
    if (moving) return;
    const history = recordStep(state.history, state.setup, now(), name ?? undefined);
    if (history !== state.history) state.setHistory(history);
  });
}
