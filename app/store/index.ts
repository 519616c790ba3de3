import { create } from 'zustand';
import { persist } from 'zustand/middleware';
import { ModelError, errorLine } from '../../solver/index';
import { setupToScenario } from '../scenario/scenario';
import { readScenario } from '../scenario/scenarioFile';
import { withPins } from '../scenario/scenarioPins';
import {
  AUTOSAVE_VERSION,
  STORAGE_KEY,
  autosaveStorage,
  keepAutosaveAside,
  takeAutosaveProblem,
} from './autosave';
import { createCutSlice, cutFromJson, type CutSlice } from './cutSlice';
import { createMapSlice, type MapSlice } from './mapSlice';
import { createProbeSlice, type ProbeSlice } from './probeSlice';
import { createSetupSlice, type SetupSlice } from './setupSlice';
import { createViewSlice, type ViewSlice } from './viewSlice';

export { STORAGE_KEY } from './autosave';

export type FourfoldState = SetupSlice & MapSlice & ViewSlice & ProbeSlice & CutSlice;

/** Where the autosave's setup comes from, in messages. */
export const AUTOSAVE_SOURCE = 'autosave';

/**
 * What survives a reload, in one table: each persisted key with how it is written and read
 * back. Only these are stored; everything else (map results, hover) is recomputed. The setup
 * is stored as the scenario document with its pins (what the link and the file hold) and read
 * back by the same `readScenario`.
 */
export const PERSISTED = {
  setup: {
    save: (s: FourfoldState) => withPins(setupToScenario(s.setup), s.probe.pins),
    load: (json: unknown) => readScenario(json, AUTOSAVE_SOURCE),
  },
  cut: {
    save: (s: FourfoldState) => ({ spec: s.cut.spec, n: s.cut.n }),
    load: (json: unknown) => cutFromJson(json),
  },
} as const;

/**
 * The store with the autosave read back: a stored setup that does not validate is kept aside
 * and reported (the default stays), one beyond the browser's grid is fitted and the notice
 * says so, naming the autosave.
 */
function mergeAutosave(persisted: unknown, current: FourfoldState): FourfoldState {
  const out: FourfoldState = { ...current };
  let note: string | null = null;
  if (persisted && typeof persisted === 'object' && 'setup' in persisted) {
    try {
      const loaded = PERSISTED.setup.load(persisted.setup);
      const pins = loaded.pins ?? [];
      Object.assign(out, {
        setup: loaded.setup,
        probe: { pins, selected: pins[pins.length - 1]?.id ?? null, results: {} },
      });
      if (loaded.note !== null) note = `Setup from the autosave: ${loaded.note}.`;
    } catch (error) {
      keepAutosaveAside(error instanceof ModelError ? error.message : errorLine(error));
    }
  }
  if (persisted && typeof persisted === 'object' && 'cut' in persisted) {
    Object.assign(out, { cut: { ...out.cut, ...PERSISTED.cut.load(persisted.cut) } });
  }
  const problem = takeAutosaveProblem();
  const notice =
    problem !== null
      ? { kind: 'error' as const, text: problem }
      : note !== null
        ? { kind: 'info' as const, text: note }
        : null;
  if (notice !== null) Object.assign(out, { view: { ...out.view, notice } });
  return out;
}

export const useFourfold = create<FourfoldState>()(
  persist(
    (...a) => ({
      ...createSetupSlice(...a),
      ...createMapSlice(...a),
      ...createViewSlice(...a),
      ...createProbeSlice(...a),
      ...createCutSlice(...a),
    }),
    {
      name: STORAGE_KEY,
      version: AUTOSAVE_VERSION,
      storage: autosaveStorage(),
      partialize: (s) =>
        Object.fromEntries(
          Object.entries(PERSISTED).map(([key, entry]) => [key, entry.save(s)]),
        ) as unknown as FourfoldState,
      merge: (persisted, current) => mergeAutosave(persisted, current),
    },
  ),
);
