import { create } from 'zustand';
import { createJSONStorage, persist, type StateStorage } from 'zustand/middleware';
import { scenarioToSetup, setupToScenario } from '../scenario/scenario';
import { createCutSlice, cutFromJson, type CutSlice } from './cutSlice';
import { createMapSlice, type MapSlice } from './mapSlice';
import { createProbeSlice, pinsFromJson, type ProbeSlice } from './probeSlice';
import { createSetupSlice, type SetupSlice } from './setupSlice';
import { createViewSlice, type ViewSlice } from './viewSlice';

export type FourfoldState = SetupSlice & MapSlice & ViewSlice & ProbeSlice & CutSlice;

/**
 * What survives a reload, in one table: each persisted key with how it is written and read
 * back. Only these are stored; everything else (map results, hover) is recomputed.
 */
export const PERSISTED = {
  setup: {
    save: (s: FourfoldState) => setupToScenario(s.setup),
    // A stored scenario that no longer validates is ignored (the default stays).
    load: (json: unknown) => scenarioToSetup(json),
  },
  pins: {
    save: (s: FourfoldState) => s.probe.pins,
    load: (json: unknown) => pinsFromJson(json),
  },
  cut: {
    save: (s: FourfoldState) => ({ spec: s.cut.spec, n: s.cut.n }),
    load: (json: unknown) => cutFromJson(json),
  },
} as const;

export const STORAGE_KEY = 'fourfold.autosave.v1';

/**
 * localStorage that skips writing a value it wrote last: the store changes on every hover and
 * map update, the persisted setup only when the user edits it.
 */
function unchangedSkippingStorage(): StateStorage {
  let last: string | null = null;
  return {
    getItem: (name) => localStorage.getItem(name),
    setItem: (name, value) => {
      if (value === last) return;
      last = value;
      localStorage.setItem(name, value);
    },
    removeItem: (name) => localStorage.removeItem(name),
  };
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
      version: 1,
      storage: createJSONStorage(unchangedSkippingStorage),
      partialize: (s) =>
        Object.fromEntries(
          Object.entries(PERSISTED).map(([key, entry]) => [key, entry.save(s)]),
        ) as unknown as FourfoldState,
      merge: (persisted, current) => {
        const out: FourfoldState = { ...current };
        if (persisted && typeof persisted === 'object' && 'setup' in persisted) {
          try {
            Object.assign(out, { setup: PERSISTED.setup.load(persisted.setup) });
          } catch {
            // Keep the default setup; the stored one came from an older or edited copy.
          }
        }
        if (persisted && typeof persisted === 'object' && 'pins' in persisted) {
          const pins = PERSISTED.pins.load(persisted.pins);
          Object.assign(out, {
            probe: { pins, selected: pins[pins.length - 1]?.id ?? null, results: {} },
          });
        }
        if (persisted && typeof persisted === 'object' && 'cut' in persisted) {
          Object.assign(out, { cut: { ...out.cut, ...PERSISTED.cut.load(persisted.cut) } });
        }
        return out;
      },
    },
  ),
);
