import { errorLine, parseMapInput } from '../../solver/index';
import { setupToScenario } from '../scenario/scenario';
import { SIDE_TASK_QUIET_MS, runSideTask } from '../sidePool';
import { useFourfold, type FourfoldState } from '../store/index';

/** The key of a pin's Probe: its point and the scenario document (JSON) it was solved for. */
export function probeKey(pin: { x: number; y: number }, json: string): string {
  return `${pin.x} ${pin.y} ${json}`;
}

/**
 * Keeps every pin's Probe in step with the Setup: a pin whose point or setup changed is solved
 * again on the Map's worker pool (the selected pin first), a setup change after a short quiet
 * time; a result for a setup or point that has changed since it was asked for is dropped. Returns a function that stops the driver.
 */
export function startProbeDriver(): () => void {
  const store = useFourfold;
  let stopped = false;

  const refresh = (state: FourfoldState): void => {
    const { pins, selected, results } = state.probe;
    if (pins.length === 0) return;
    let json: string;
    try {
      const scenario = setupToScenario(state.setup);
      parseMapInput(scenario);
      json = JSON.stringify(scenario);
    } catch {
      // The setup does not validate: the Setup panel says why; pins keep their last Probe.
      return;
    }
    const ordered = [...pins].sort((a, b) => Number(b.id === selected) - Number(a.id === selected));
    for (const pin of ordered) {
      const key = probeKey(pin, json);
      if (results[pin.id]?.key === key) continue;
      store.getState().setProbeEntry(pin.id, { key, status: 'pending' });
      const current = () => !stopped && store.getState().probe.results[pin.id]?.key === key;
      runSideTask((api) => api.probe(json, pin.x, pin.y))
        .then((report) => {
          if (current()) store.getState().setProbeEntry(pin.id, { key, status: 'ready', report });
        })
        .catch((error: unknown) => {
          if (current()) {
            store.getState().setProbeEntry(pin.id, {
              key,
              status: 'failed',
              message: `The Probe could not be computed: ${errorLine(error)}`,
            });
          }
        });
    }
  };

  // A new pin is solved at once; a setup change (a slider drag) waits for a quiet moment, so the
  // Probes do not queue ahead of every coarse Map frame of the drag.
  let timer: ReturnType<typeof setTimeout> | undefined;
  const unsubscribe = store.subscribe((state, previous) => {
    if (state.probe.pins !== previous.probe.pins) {
      clearTimeout(timer);
      timer = undefined;
      refresh(state);
    } else if (state.setup !== previous.setup) {
      clearTimeout(timer);
      timer = setTimeout(() => refresh(store.getState()), SIDE_TASK_QUIET_MS);
    }
  });
  refresh(store.getState());
  return () => {
    stopped = true;
    clearTimeout(timer);
    unsubscribe();
  };
}
