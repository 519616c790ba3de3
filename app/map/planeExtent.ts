import type { Setup } from '../scenario/setup';

/**
 * The part of the plane the Map shows: each axis from its value at the left (bottom) edge of
 * the plot to its value at the right (top) edge. An axis may run backwards (from > to).
 */
export interface PlaneExtent {
  readonly x: readonly [number, number];
  readonly y: readonly [number, number];
}

/** A point of the plot as fractions of its box: fx from the left edge, fy from the top edge. */
export interface PlotFraction {
  readonly fx: number;
  readonly fy: number;
}

/** The extent a setup's axes set. */
export function extentOf(setup: Pick<Setup, 'x' | 'y'>): PlaneExtent {
  return { x: [setup.x.from, setup.x.to], y: [setup.y.from, setup.y.to] };
}

export function sameExtent(a: PlaneExtent, b: PlaneExtent): boolean {
  return a.x[0] === b.x[0] && a.x[1] === b.x[1] && a.y[0] === b.y[0] && a.y[1] === b.y[1];
}

/** The setup change that shows `extent` (the axes keep what they sweep). */
export function withExtent(setup: Pick<Setup, 'x' | 'y'>, extent: PlaneExtent): Partial<Setup> {
  return {
    x: { ...setup.x, from: extent.x[0], to: extent.x[1] },
    y: { ...setup.y, from: extent.y[0], to: extent.y[1] },
  };
}

/** Plane coordinates at a point of the plot. */
export function pointAt(extent: PlaneExtent, at: PlotFraction): [number, number] {
  return [
    extent.x[0] + at.fx * (extent.x[1] - extent.x[0]),
    extent.y[1] + at.fy * (extent.y[0] - extent.y[1]),
  ];
}

/** Where a plane point sits on the plot (fractions of the box; outside it below 0 or above 1). */
export function fractionOf(extent: PlaneExtent, x: number, y: number): PlotFraction {
  return {
    fx: (x - extent.x[0]) / (extent.x[1] - extent.x[0]),
    fy: (extent.y[1] - y) / (extent.y[1] - extent.y[0]),
  };
}

/**
 * An axis range with its ends rounded to about 1e-7 of its span (the fewest digits that keep
 * the ends within that of the exact ones), so that a zoomed extent reads well in the fields and
 * keeps the link short; the span never collapses.
 */
function tidy(from: number, to: number): [number, number] {
  const span = Math.abs(to - from);
  if (!(span > 0) || !Number.isFinite(span)) return [from, to];
  const step = 10 ** (Math.floor(Math.log10(span)) - 7);
  const round = (v: number) => {
    const r = Math.round(v / step) * step;
    // Strip the float noise of the multiplication (0.30000000000000004 -> 0.3).
    return Number(r.toPrecision(15));
  };
  const a = round(from);
  const b = round(to);
  return a === b ? [from, to] : [a, b];
}

function tidyExtent(x: readonly [number, number], y: readonly [number, number]): PlaneExtent {
  return { x: tidy(x[0], x[1]), y: tidy(y[0], y[1]) };
}

/**
 * The extent scaled by `factor` about a point of the plot (that point stays where it is on the
 * screen): factor < 1 zooms in, > 1 zooms out.
 */
export function zoomAbout(extent: PlaneExtent, at: PlotFraction, factor: number): PlaneExtent {
  const [cx, cy] = pointAt(extent, at);
  const scale = (from: number, to: number, c: number): [number, number] => [
    c + (from - c) * factor,
    c + (to - c) * factor,
  ];
  return tidyExtent(scale(extent.x[0], extent.x[1], cx), scale(extent.y[0], extent.y[1], cy));
}

/**
 * The extent of a box dragged on the plot between two points (fractions), each axis in its own
 * direction; null for a box too thin to zoom to (less than `minFraction` of the plot on a side).
 */
export function boxExtent(
  extent: PlaneExtent,
  a: PlotFraction,
  b: PlotFraction,
  minFraction = 0.01,
): PlaneExtent | null {
  const clamp = (v: number) => Math.min(1, Math.max(0, v));
  const left = clamp(Math.min(a.fx, b.fx));
  const right = clamp(Math.max(a.fx, b.fx));
  const top = clamp(Math.min(a.fy, b.fy));
  const bottom = clamp(Math.max(a.fy, b.fy));
  if (right - left < minFraction || bottom - top < minFraction) return null;
  const [x0, y0] = pointAt(extent, { fx: left, fy: bottom });
  const [x1, y1] = pointAt(extent, { fx: right, fy: top });
  return tidyExtent([x0, x1], [y0, y1]);
}

/**
 * The extent moved so that the plane point under the plot fraction `from` comes under `to` (a
 * drag of the plane with the pointer).
 */
export function panBy(extent: PlaneExtent, from: PlotFraction, to: PlotFraction): PlaneExtent {
  const dx = (to.fx - from.fx) * (extent.x[1] - extent.x[0]);
  const dy = (to.fy - from.fy) * (extent.y[0] - extent.y[1]);
  return tidyExtent([extent.x[0] - dx, extent.x[1] - dx], [extent.y[0] - dy, extent.y[1] - dy]);
}

/** Zoom factor of one step of the buttons and keys (and of one notch of a wheel, 100 px). */
export const ZOOM_STEP = 0.8;

/** Zoom factor of a wheel turn of `deltaY` CSS pixels (negative: towards the user, zoom in). */
export function wheelFactor(deltaY: number): number {
  return ZOOM_STEP ** (-deltaY / 100);
}
