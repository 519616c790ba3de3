import type { StateCreator } from 'zustand';
import type { Boundary, MapGrid } from '../../solver/index';
import type { FourfoldState } from './index';

/** Where the current Map is in its progressive computation. */
export type MapPhase = 'idle' | 'coarse' | 'refining' | 'boundaries' | 'done' | 'failed';

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
  };
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
  },
  setMap: (patch) => set((s) => ({ map: { ...s.map, ...patch } })),
});
