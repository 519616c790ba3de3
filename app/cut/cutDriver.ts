import { checkCut, parseMapInput, type CutPath, errorLine } from '../../solver/index';
import { setupToScenario } from '../scenario/scenario';
import { SIDE_TASK_QUIET_MS, runSideTask } from '../sidePool';
import { useFourfold } from '../store/index';
import { cutPathOf } from './cutPath';

/** Performance-timeline name of a finished Cut (request to result on screen). */
export const MARK_CUT = 'fourfold:cut';

/**
 * Keeps the Cut in step with its definition and the Setup: each change (after a short quiet
 * time) sends one Cut to the Map's worker pool as a side task; a newer request supersedes an
 * older one, whose result is ignored. Bad input is reported in one line and the last Cut stays.
 * Returns a function that stops the driver.
 */
export function startCutDriver(): () => void {
  const store = useFourfold;
  let request = 0;
  let timer: ReturnType<typeof setTimeout> | undefined;

  const run = (): void => {
    timer = undefined;
    const { cut, setup, setCutRun } = store.getState();
    const id = ++request;
    if (cut.spec === null) {
      setCutRun({ status: 'idle', problem: null, result: null, ms: null });
      return;
    }
    let json: string;
    let path: CutPath;
    try {
      const scenario = setupToScenario(setup);
      const input = parseMapInput(scenario);
      path = cutPathOf(cut.spec, input, setup);
      checkCut(input, path, cut.n);
      json = JSON.stringify(scenario);
    } catch (error) {
      setCutRun({ status: 'failed', problem: `${errorLine(error)}. The last Cut stays.` });
      return;
    }
    const n = cut.n;
    const started = performance.now();
    setCutRun({ status: 'running', problem: null });
    runSideTask((api) => api.cut(json, path, n)).then(
      (result) => {
        if (id !== request) return;
        const ms = performance.now() - started;
        setCutRun({ result, status: 'done', ms });
        requestAnimationFrame(() =>
          setTimeout(() => performance.measure(MARK_CUT, { start: started, detail: { n } }), 0),
        );
      },
      (error: unknown) => {
        if (id !== request) return;
        setCutRun({ status: 'failed', problem: `The Cut failed: ${errorLine(error)}` });
      },
    );
  };

  const schedule = (): void => {
    if (timer !== undefined) clearTimeout(timer);
    timer = setTimeout(run, SIDE_TASK_QUIET_MS);
  };

  const unsubscribe = store.subscribe((state, previous) => {
    if (
      state.cut.spec !== previous.cut.spec ||
      state.cut.n !== previous.cut.n ||
      state.setup !== previous.setup
    ) {
      schedule();
    }
  });
  // A Cut restored from the autosave runs at once.
  if (store.getState().cut.spec !== null) schedule();
  return () => {
    unsubscribe();
    if (timer !== undefined) clearTimeout(timer);
    request++;
  };
}
