import { errorLine } from '../../solver/index';
import { setupToMapInput, setupToScenario } from '../scenario/scenario';
import { runSideTask } from '../sidePool';
import { useFourfold, type FourfoldState } from '../store/index';

/**
 * Keeps every pin's Probe in step with the Setup: a pin whose point or setup changed is solved
 * again on the Map's worker pool (the selected pin first); a result for a setup or point that
 * has changed since it was asked for is dropped. Returns a function that stops the driver.
 */
export function startProbeDriver(): () => void {
  const store = useFourfold;
  let stopped = false;

  const refresh = (state: FourfoldState): void => {
    const { pins, selected, results } = state.probe;
    if (pins.length === 0) return;
    let json: string;
    try {
      setupToMapInput(state.setup);
      json = JSON.stringify(setupToScenario(state.setup));
    } catch {
      // The setup does not validate: the Setup panel says why; pins keep their last Probe.
      return;
    }
    const ordered = [...pins].sort((a, b) => Number(b.id === selected) - Number(a.id === selected));
    for (const pin of ordered) {
      const key = `${pin.x} ${pin.y} ${json}`;
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

  const unsubscribe = store.subscribe((state, previous) => {
    if (state.setup !== previous.setup || state.probe.pins !== previous.probe.pins) {
      refresh(state);
    }
  });
  refresh(store.getState());
  return () => {
    stopped = true;
    unsubscribe();
  };
}
