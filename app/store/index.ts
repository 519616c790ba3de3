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
import { historyFromJson, historyToJson, sameSetup } from '../history/historyJson';
import { startHistory, type SetupHistory } from '../history/setupHistory';
import { createCutSlice, cutFromJson, type CutSlice } from './cutSlice';
import { createHistorySlice, type HistorySlice } from './historySlice';
import { createMapSlice, type MapSlice } from './mapSlice';
import { createProbeSlice, type ProbeSlice } from './probeSlice';
import { createSetupSlice, type SetupSlice } from './setupSlice';
import { createViewSlice, type ViewSlice } from './viewSlice';

export { STORAGE_KEY } from './autosave';

export type FourfoldState = SetupSlice &
  MapSlice &
  ViewSlice &
  ProbeSlice &
  CutSlice &
  HistorySlice;

/** Where the autosave's setup comes from, in messages. */
export const AUTOSAVE_SOURCE = 'autosave';

/**
 * The last result of `save` for the same arguments (compared by identity): the store's parts
 * are immutable, so a part that did not change is saved as the same object, and the autosave
 * writes nothing when no saved part changed (every store update, a Map frame among them,
 * offers the state to the autosave).
 */
function sameResultForSameParts<A extends unknown[], R>(save: (...parts: A) => R) {
  let parts: A | null = null;
  let result: R;
  return (...next: A): R => {
    if (parts === null || parts.length !== next.length || parts.some((p, k) => p !== next[k])) {
      parts = next;
      result = save(...next);
    }
    return result;
  };
}

const saveSetup = sameResultForSameParts(
  (setup: FourfoldState['setup'], pins: FourfoldState['probe']['pins']) =>
    withPins(setupToScenario(setup), pins),
);
const saveCut = sameResultForSameParts((spec: FourfoldState['cut']['spec'], n: number) => ({
  spec,
  n,
}));
const saveHistory = sameResultForSameParts((history: SetupHistory) => historyToJson(history));

/**
 * What survives a reload, in one table: each persisted key with how it is written and read
 * back. Only these are stored; everything else (map results, hover) is recomputed. The setup
 * is stored as the scenario document with its pins (what the link and the file hold) and read
 * back by the same `readScenario`; the undo history as a bounded list of such documents, each
 * validated the same way.
 */
export const PERSISTED = {
  setup: {
    save: (s: FourfoldState) => saveSetup(s.setup, s.probe.pins),
    load: (json: unknown) => readScenario(json, AUTOSAVE_SOURCE),
  },
  cut: {
    save: (s: FourfoldState) => saveCut(s.cut.spec, s.cut.n),
    load: (json: unknown) => cutFromJson(json),
  },
  history: {
    save: (s: FourfoldState) => saveHistory(s.history),
    load: (json: unknown) => historyFromJson(json),
  },
} as const;

/**
 * The history read back for the setup the autosave holds: dropped with a one-line reason when
 * it does not validate, and continued with a step when its shown step is not that setup (an
 * autosave written by another tab, say). The shown step holds the store's own setup object.
 */
function historyFor(
  json: unknown,
  setup: FourfoldState['setup'],
): { history: SetupHistory; problem: string | null } {
  if (json === undefined) return { history: startHistory(setup, 'Opened'), problem: null };
  let history: SetupHistory;
  try {
    history = PERSISTED.history.load(json);
  } catch (error) {
    const reason = error instanceof ModelError ? error.message : errorLine(error);
    return {
      history: startHistory(setup, 'Opened'),
      problem: `The undo history in the autosave was not used (${reason}); it starts afresh.`,
    };
  }
  const shown = history.steps[history.index]!;
  if (!sameSetup(shown.setup, setup)) {
    const steps = [
      ...history.steps.slice(0, history.index + 1),
      { setup, label: 'Setup from the autosave', kind: 'load', at: shown.at },
    ].slice(-history.steps.length);
    return { history: { steps, index: steps.length - 1 }, problem: null };
  }
  const steps = history.steps.map((step, k) => (k === history.index ? { ...step, setup } : step));
  return { history: { steps, index: history.index }, problem: null };
}

/**
 * The store with the autosave read back: a stored setup that does not validate is kept aside
 * and reported (the default stays), one beyond the browser's grid is fitted and the notice
 * says so, naming the autosave.
 */
function mergeAutosave(persisted: unknown, current: FourfoldState): FourfoldState {
  const out: FourfoldState = { ...current };
  let note: string | null = null;
  let historyProblem: string | null = null;
  if (persisted && typeof persisted === 'object' && 'setup' in persisted) {
    try {
      const loaded = PERSISTED.setup.load(persisted.setup);
      const pins = loaded.pins ?? [];
      const { history, problem } = historyFor(
        'history' in persisted ? persisted.history : undefined,
        loaded.setup,
      );
      historyProblem = problem;
      Object.assign(out, {
        setup: loaded.setup,
        probe: { pins, selected: pins[pins.length - 1]?.id ?? null, results: {} },
        history,
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
      : historyProblem !== null
        ? { kind: 'error' as const, text: [note, historyProblem].filter(Boolean).join(' ') }
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
      ...createHistorySlice(...a),
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
