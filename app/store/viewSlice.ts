import type { StateCreator } from 'zustand';
import type { PlaneExtent, PlotFraction } from '../map/planeExtent';
import type { FourfoldState } from './index';

/** What a press on the Map does: pin a Probe point (a drag zooms to a box), pan, or draw a Cut. */
export type MapGesture = 'pin' | 'pan' | 'cut';

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
    /** What a press on the Map does: pin a Probe point, pan (drag), or draw a Cut (drag). */
    readonly mapGesture: MapGesture;
    /**
     * The extent shown while a navigation is under way (a wheel turning, a pan being dragged,
     * a pinch), before it becomes a plane change; null otherwise.
     */
    readonly preview: PlaneExtent | null;
    /** The box being dragged to zoom to (plot fractions), or null. */
    readonly zoomBox: { readonly from: PlotFraction; readonly to: PlotFraction } | null;
    /** The hovered pixel was set by the keyboard (arrow keys on the Map), not the pointer. */
    readonly keyboardHover: boolean;
    /** The pin the pin comparison takes differences against (null: the first pin). */
    readonly compareReference: number | null;
    /** What the last fit in the page found consistent (drawn on the Map), or null. */
    readonly consistency: ConsistencyShown | null;
  };
  setHover(hover: PixelRef | null): void;
  setNotice(notice: ViewSlice['view']['notice']): void;
  setSetupProblem(problem: string | null): void;
  setMapGesture(gesture: MapGesture): void;
  setPreview(preview: PlaneExtent | null): void;
  setZoomBox(box: ViewSlice['view']['zoomBox']): void;
  /** Sets the hovered pixel from the keyboard (it stays when the pointer leaves the Map). */
  setKeyboardHover(hover: PixelRef | null): void;
  setCompareReference(pin: number | null): void;
  setConsistency(consistency: ConsistencyShown | null): void;
}

export const createViewSlice: StateCreator<FourfoldState, [], [], ViewSlice> = (set) => ({
  view: {
    hover: null,
    notice: null,
    setupProblem: null,
    mapGesture: 'pin',
    preview: null,
    zoomBox: null,
    keyboardHover: false,
    compareReference: null,
    consistency: null,
  },
  setHover: (hover) => set((s) => ({ view: { ...s.view, hover, keyboardHover: false } })),
  setKeyboardHover: (hover) =>
    set((s) => ({ view: { ...s.view, hover, keyboardHover: hover !== null } })),
  setNotice: (notice) => set((s) => ({ view: { ...s.view, notice } })),
  setSetupProblem: (setupProblem) => set((s) => ({ view: { ...s.view, setupProblem } })),
  setMapGesture: (mapGesture) => set((s) => ({ view: { ...s.view, mapGesture } })),
  setPreview: (preview) =>
    set((s) => (s.view.preview === preview ? s : { view: { ...s.view, preview } })),
  setCompareReference: (compareReference) =>
    set((s) => ({ view: { ...s.view, compareReference } })),
  setZoomBox: (zoomBox) =>
    set((s) => (s.view.zoomBox === zoomBox ? s : { view: { ...s.view, zoomBox } })),
  setConsistency: (consistency) => set((s) => ({ view: { ...s.view, consistency } })),
});
