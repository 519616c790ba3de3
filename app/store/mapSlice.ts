import type { StateCreator } from 'zustand';
import type { Boundary, MapGrid } from '../../solver/index';
import type { FourfoldState } from './index';

/** Where the current Map is in its progressive computation. */
export type MapPhase =
  'idle' | 'coarse' | 'refining' | 'boundaries' | 'verifying' | 'done' | 'failed';

const PHASE_RANK: Record<MapPhase, number> = {
  idle: 0,
  coarse: 1,
  refining: 2,
  boundaries: 3,
  verifying: 4,
  done: 5,
  failed: 5,
};

/**
 * The phase of one job only moves forward: a late result of an earlier stage (the remaining
 * coarse nodes arrive after the first frame is shown) keeps the later phase.
 */
export function laterPhase(current: MapPhase, next: MapPhase): MapPhase {
  return PHASE_RANK[next] >= PHASE_RANK[current] ? next : current;
}

export interface MapSlice {
  readonly map: {
    /** Increases with every setup change; results of older jobs are dropped. */
    readonly job: number;
    readonly phase: MapPhase;
    /**
     * The grid being filled (mutable, shared, never copied: redraw when `version` changes).
     * Null before the first valid setup has been mapped.
     */
    readonly grid: MapGrid | null;
    readonly version: number;
    readonly boundaries: readonly Boundary[];
    /** Pixels solved so far, out of all. */
    readonly solved: number;
    /** Milliseconds from the setup change to the first full coarse frame and to the end. */
    readonly coarseMs: number | null;
    readonly doneMs: number | null;
    /** A short message when something could not be computed (the map keeps what it has). */
    readonly problem: string | null;
    /** A line about the map workers: one was replaced, or none could start (else null). */
    readonly workers: string | null;
  };
  /** Merges `patch`; within one job (no new `job` in it) the phase only moves forward. */
  setMap(patch: Partial<MapSlice['map']>): void;
}

export const createMapSlice: StateCreator<FourfoldState, [], [], MapSlice> = (set) => ({
  map: {
    job: 0,
    phase: 'idle',
    grid: null,
    version: 0,
    boundaries: [],
    solved: 0,
    coarseMs: null,
    doneMs: null,
    problem: null,
    workers: null,
  },
  setMap: (patch) =>
    set((s) => {
      const sameJob = patch.job === undefined || patch.job === s.map.job;
      const phase =
        patch.phase === undefined
          ? s.map.phase
          : sameJob
            ? laterPhase(s.map.phase, patch.phase)
            : patch.phase;
      return { map: { ...s.map, ...patch, phase } };
    }),
});
