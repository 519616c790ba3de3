import type { StateCreator } from 'zustand';
import type { FourfoldState } from './index';

/** A grid pixel (i along x, j along y). */
export interface PixelRef {
  readonly i: number;
  readonly j: number;
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
  };
  setHover(hover: PixelRef | null): void;
  setNotice(notice: ViewSlice['view']['notice']): void;
  setSetupProblem(problem: string | null): void;
  setMapGesture(gesture: 'pin' | 'cut'): void;
}

export const createViewSlice: StateCreator<FourfoldState, [], [], ViewSlice> = (set) => ({
  view: { hover: null, notice: null, setupProblem: null, mapGesture: 'pin' },
  setHover: (hover) => set((s) => ({ view: { ...s.view, hover } })),
  setNotice: (notice) => set((s) => ({ view: { ...s.view, notice } })),
  setSetupProblem: (setupProblem) => set((s) => ({ view: { ...s.view, setupProblem } })),
  setMapGesture: (mapGesture) => set((s) => ({ view: { ...s.view, mapGesture } })),
});
