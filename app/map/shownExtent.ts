import { useMemo } from 'react';
import type { MapGrid, Plane } from '../../solver/index';
import { planeAxis } from '../scenario/scenario';
import type { Setup } from '../scenario/setup';
import { useFourfold, type FourfoldState } from '../store/index';
import type { PixelRef } from '../store/viewSlice';
import { extentOf, fractionOf, type PlaneExtent } from './planeExtent';
import { gridColumn, gridRow } from './plotPixels';

/** The extent of the grid on screen. */
export function gridExtent(plane: Pick<Plane, 'x' | 'y'>): PlaneExtent {
  return { x: [plane.x.from, plane.x.to], y: [plane.y.from, plane.y.to] };
}

function sameAxis(setup: Setup, name: 'x' | 'y', plane: Plane): boolean {
  const a = planeAxis(setup[name], setup);
  const b = plane[name];
  const keys = Object.keys(a.targets);
  return (
    a.label === b.label &&
    keys.length === Object.keys(b.targets).length &&
    keys.every((k) => a.targets[k] === b.targets[k])
  );
}

let memo: { x: unknown; y: unknown; ratios: unknown; plane: unknown; same: boolean } | null = null;

/** Whether the setup's axes sweep what the grid's do (then only their ranges may differ). */
function axesMatch(setup: Setup, plane: Plane): boolean {
  if (
    memo === null ||
    memo.x !== setup.x ||
    memo.y !== setup.y ||
    memo.ratios !== setup.ratios ||
    memo.plane !== plane
  ) {
    memo = {
      x: setup.x,
      y: setup.y,
      ratios: setup.ratios,
      plane,
      same: sameAxis(setup, 'x', plane) && sameAxis(setup, 'y', plane),
    };
  }
  return memo.same;
}

/**
 * The part of the plane the Map shows: a navigation's preview while one is under way, else the
 * setup's extent when its axes sweep what the grid on screen does (the grid of a new extent is
 * still being computed: the one on screen is drawn moved and scaled into place), else the
 * grid's own. Null before there is a grid.
 */
export function shownExtent(state: FourfoldState): PlaneExtent | null {
  const plane = state.map.grid?.input.plane;
  if (plane === undefined) return null;
  if (state.view.preview !== null) return state.view.preview;
  return axesMatch(state.setup, plane) ? extentOf(state.setup) : gridExtent(plane);
}

/** The shown extent as one object that changes only when one of its ends does. */
export function useShownExtent(): PlaneExtent | null {
  const x0 = useFourfold((s) => shownExtent(s)?.x[0]);
  const x1 = useFourfold((s) => shownExtent(s)?.x[1]);
  const y0 = useFourfold((s) => shownExtent(s)?.y[0]);
  const y1 = useFourfold((s) => shownExtent(s)?.y[1]);
  return useMemo(
    () =>
      x0 === undefined || x1 === undefined || y0 === undefined || y1 === undefined
        ? null
        : { x: [x0, x1], y: [y0, y1] },
    [x0, x1, y0, y1],
  );
}

/** The grid pixel that holds plane point (x, y), or null outside the grid. */
export function pixelAtPoint(grid: MapGrid, x: number, y: number): PixelRef | null {
  const f = fractionOf(gridExtent(grid.input.plane), x, y);
  if (!(f.fx >= 0 && f.fx <= 1 && f.fy >= 0 && f.fy <= 1)) return null;
  return { i: gridColumn(f.fx, 1, grid.nx), j: gridRow(f.fy, 1, grid.ny) };
}
