import type { StateCreator } from 'zustand';
import type { ProbeReport } from '../../solver/index';
import type { FourfoldState } from './index';

/** A pinned point of the plane, in axis coordinates (so it survives a change of resolution). */
export interface Pin {
  readonly id: number;
  readonly x: number;
  readonly y: number;
}

/** A pin's Probe: computed for the setup and point in `key`, pending, or failed. */
export type ProbeEntry =
  | { readonly key: string; readonly status: 'pending' }
  | { readonly key: string; readonly status: 'ready'; readonly report: ProbeReport }
  | { readonly key: string; readonly status: 'failed'; readonly message: string };

/** Pins allowed at once: each holds a full Probe (spinors, modes, competitors). */
export const MAX_PINS = 12;

export interface ProbeSlice {
  readonly probe: {
    readonly pins: readonly Pin[];
    /** The pin whose Probe is shown (null when none). */
    readonly selected: number | null;
    /** Probe results by pin id. */
    readonly results: Readonly<Record<number, ProbeEntry>>;
  };
  /** Pins a point and selects it; past MAX_PINS the oldest pin goes. */
  addPin(x: number, y: number): void;
  removePin(id: number): void;
  selectPin(id: number | null): void;
  replacePins(pins: readonly Pin[]): void;
  setProbeEntry(id: number, entry: ProbeEntry): void;
}

export const createProbeSlice: StateCreator<FourfoldState, [], [], ProbeSlice> = (set) => ({
  probe: { pins: [], selected: null, results: {} },
  addPin: (x, y) =>
    set((s) => {
      const id = s.probe.pins.reduce((m, p) => Math.max(m, p.id), 0) + 1;
      const pins = [...s.probe.pins, { id, x, y }].slice(-MAX_PINS);
      return { probe: { ...s.probe, pins, selected: id } };
    }),
  removePin: (id) =>
    set((s) => {
      const pins = s.probe.pins.filter((p) => p.id !== id);
      const selected =
        s.probe.selected === id ? (pins[pins.length - 1]?.id ?? null) : s.probe.selected;
      const results = { ...s.probe.results };
      delete results[id];
      return { probe: { pins, selected, results } };
    }),
  selectPin: (selected) => set((s) => ({ probe: { ...s.probe, selected } })),
  replacePins: (pins) =>
    set({
      probe: {
        pins: pins.slice(-MAX_PINS),
        selected: pins[pins.length - 1]?.id ?? null,
        results: {},
      },
    }),
  setProbeEntry: (id, entry) =>
    set((s) =>
      s.probe.pins.some((p) => p.id === id)
        ? { probe: { ...s.probe, results: { ...s.probe.results, [id]: entry } } }
        : {},
    ),
});
