import type { StateCreator } from 'zustand';
import type { CutResult } from '../../solver/index';
import type { FourfoldState } from './index';

/** Quantities a sweep at a pinned point can run over. */
export type SweepKind = 'x' | 'y' | 'zeeman' | 'valleyZeeman' | 'tilt';

/**
 * What the user asked the Cut to follow, in plane coordinates. A tilt sweep takes its Zeeman
 * energy at zero tilt from the Setup when it runs (so it follows the Setup's field).
 */
export type CutSpec =
  | {
      readonly kind: 'line';
      readonly from: readonly [number, number];
      readonly to: readonly [number, number];
    }
  | {
      readonly kind: SweepKind;
      readonly at: readonly [number, number];
      readonly from: number;
      readonly to: number;
    };

/** Samples along a Cut in the app (the CLI takes up to MAX_CUT_POINTS). */
export const DEFAULT_CUT_POINTS = 200;
export const MAX_APP_CUT_POINTS = 2000;

export type CutStatus = 'idle' | 'running' | 'done' | 'failed';

export interface CutSlice {
  readonly cut: {
    readonly spec: CutSpec | null;
    readonly n: number;
    /** The latest finished Cut (stays on screen while a newer one runs). */
    readonly result: CutResult | null;
    readonly status: CutStatus;
    /** Why the Cut could not be computed, one line (null when fine). */
    readonly problem: string | null;
    /** Milliseconds from the request to the result, as the page measured it. */
    readonly ms: number | null;
    /** Sample under the pointer in the charts (also marked on the Map), or null. */
    readonly hover: number | null;
    /** The line being dragged on the Map, plane coordinates (null when not dragging). */
    readonly draft: { readonly from: [number, number]; readonly to: [number, number] } | null;
  };
  setCutSpec(spec: CutSpec | null): void;
  setCutPoints(n: number): void;
  setCutRun(patch: Partial<Pick<CutSlice['cut'], 'result' | 'status' | 'problem' | 'ms'>>): void;
  setCutHover(sample: number | null): void;
  setCutDraft(draft: CutSlice['cut']['draft']): void;
}

export const createCutSlice: StateCreator<FourfoldState, [], [], CutSlice> = (set) => ({
  cut: {
    spec: null,
    n: DEFAULT_CUT_POINTS,
    result: null,
    status: 'idle',
    problem: null,
    ms: null,
    hover: null,
    draft: null,
  },
  setCutSpec: (spec) => set((s) => ({ cut: { ...s.cut, spec } })),
  setCutPoints: (n) => set((s) => ({ cut: { ...s.cut, n } })),
  setCutRun: (patch) => set((s) => ({ cut: { ...s.cut, ...patch } })),
  setCutHover: (hover) => set((s) => (s.cut.hover === hover ? s : { cut: { ...s.cut, hover } })),
  setCutDraft: (draft) => set((s) => ({ cut: { ...s.cut, draft } })),
});

function finitePair(value: unknown): [number, number] | null {
  if (!Array.isArray(value) || value.length !== 2) return null;
  const [a, b] = value as unknown[];
  return typeof a === 'number' && Number.isFinite(a) && typeof b === 'number' && Number.isFinite(b)
    ? [a, b]
    : null;
}

/** A stored Cut read back (autosave): anything malformed gives null (no Cut). */
export function cutFromJson(json: unknown): { spec: CutSpec | null; n: number } {
  const fallback = { spec: null, n: DEFAULT_CUT_POINTS };
  if (json === null || typeof json !== 'object') return fallback;
  const { spec, n } = json as Record<string, unknown>;
  const points =
    typeof n === 'number' && Number.isInteger(n) && n >= 2 && n <= MAX_APP_CUT_POINTS
      ? n
      : DEFAULT_CUT_POINTS;
  if (spec === null || typeof spec !== 'object') return { spec: null, n: points };
  const s = spec as Record<string, unknown>;
  if (s.kind === 'line') {
    const from = finitePair(s.from);
    const to = finitePair(s.to);
    if (from && to && (from[0] !== to[0] || from[1] !== to[1]))
      return { spec: { kind: 'line', from, to }, n: points };
    return { spec: null, n: points };
  }
  const kinds: readonly SweepKind[] = ['x', 'y', 'zeeman', 'valleyZeeman', 'tilt'];
  const at = finitePair(s.at);
  const range = finitePair([s.from, s.to]);
  if (kinds.includes(s.kind as SweepKind) && at && range && range[0] !== range[1]) {
    return {
      spec: { kind: s.kind as SweepKind, at, from: range[0], to: range[1] },
      n: points,
    };
  }
  return { spec: null, n: points };
}
