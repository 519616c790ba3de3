import type { StateCreator } from 'zustand';
import type { FourfoldState } from './index';

/** A grid pixel (i along x, j along y). */
export interface PixelRef {
  readonly i: number;
  readonly j: number;
}

/**
 * The consistency grid of the last fit run in the page, in the Map's axis units: per pixel
 * centre (x[i], y[j]), how many of `total` rows hold. `key` names the setup it belongs to.
 */
export interface ConsistencyShown {
  readonly key: string;
  readonly x: Float64Array;
  readonly y: Float64Array;
  readonly held: Uint16Array;
  readonly total: number;
}

export interface ViewSlice {
  readonly view: {
    /** Pixel under the pointer, or null. */
    readonly hover: PixelRef | null;
    /** A transient message about the setup, a file or the URL (null when none). */
    readonly notice: { readonly kind: 'error' | 'info'; readonly text: string } | null;
    /** The setup cannot be mapped as it stands (the last valid map stays on screen). */
    readonly setupProblem: string | null;
    /** What a press on the Map does: pin a Probe point, or draw a Cut (drag). */
    readonly mapGesture: 'pin' | 'cut';
    /** What the last fit in the page found consistent (drawn on the Map), or null. */
    readonly consistency: ConsistencyShown | null;
  };
  setHover(hover: PixelRef | null): void;
  setNotice(notice: ViewSlice['view']['notice']): void;
  setSetupProblem(problem: string | null): void;
  setMapGesture(gesture: 'pin' | 'cut'): void;
  setConsistency(consistency: ConsistencyShown | null): void;
}

export const createViewSlice: StateCreator<FourfoldState, [], [], ViewSlice> = (set) => ({
  view: { hover: null, notice: null, setupProblem: null, mapGesture: 'pin', consistency: null },
  setHover: (hover) => set((s) => ({ view: { ...s.view, hover } })),
  setNotice: (notice) => set((s) => ({ view: { ...s.view, notice } })),
  setSetupProblem: (setupProblem) => set((s) => ({ view: { ...s.view, setupProblem } })),
  setMapGesture: (mapGesture) => set((s) => ({ view: { ...s.view, mapGesture } })),
  setConsistency: (consistency) => set((s) => ({ view: { ...s.view, consistency } })),
});
