import { useCallback, useMemo, type KeyboardEvent } from 'react';
import { useFourfold } from '../store/index';
import type { PixelRef } from '../store/viewSlice';
import { fractionOf } from './planeExtent';
import { zoomIn, zoomOut } from './mapNavigation';
import { pixelAtPoint, shownExtent } from './shownExtent';

/** Pixels an arrow key moves the crosshair; with Shift, PAGE_STEP of them. */
const PAGE_STEP = 10;

const MOVES: Readonly<Record<string, readonly [number, number]>> = {
  ArrowLeft: [-1, 0],
  ArrowRight: [1, 0],
  ArrowUp: [0, 1],
  ArrowDown: [0, -1],
};

/** The pixel at the centre of the shown extent (where the keyboard's crosshair starts). */
function centrePixel(): PixelRef | null {
  const state = useFourfold.getState();
  const grid = state.map.grid;
  const extent = shownExtent(state);
  if (grid === null || extent === null) return null;
  const x = (extent.x[0] + extent.x[1]) / 2;
  const y = (extent.y[0] + extent.y[1]) / 2;
  return pixelAtPoint(grid, x, y) ?? { i: Math.floor(grid.nx / 2), j: Math.floor(grid.ny / 2) };
}

/**
 * The Map from the keyboard, once it has focus: the arrow keys move a crosshair a pixel at a
 * time (ten with Shift), and the readout shows the state under it as under the pointer; Enter
 * pins that point for the Probe; + and - zoom about it. Focus puts the crosshair at the centre;
 * leaving takes it away.
 */
export function useMapKeyboard() {
  const onKeyDown = useCallback((event: KeyboardEvent<HTMLCanvasElement>) => {
    if (event.ctrlKey || event.metaKey || event.altKey) return;
    const state = useFourfold.getState();
    const grid = state.map.grid;
    if (grid === null) return;
    const hover = state.view.hover ?? centrePixel();
    if (hover === null) return;
    const move = MOVES[event.key];
    if (move !== undefined) {
      const step = event.shiftKey ? PAGE_STEP : 1;
      const i = Math.min(grid.nx - 1, Math.max(0, hover.i + move[0] * step));
      const j = Math.min(grid.ny - 1, Math.max(0, hover.j + move[1] * step));
      state.setKeyboardHover({ i, j });
      event.preventDefault();
      return;
    }
    const x = grid.x[hover.i]!;
    const y = grid.y[hover.j]!;
    if (event.key === 'Enter') {
      state.addPin(x, y);
      event.preventDefault();
      return;
    }
    const extent = shownExtent(state);
    if (extent === null) return;
    if (event.key === '+' || event.key === '=') zoomIn(fractionOf(extent, x, y));
    else if (event.key === '-' || event.key === '_') zoomOut(fractionOf(extent, x, y));
    else return;
    event.preventDefault();
  }, []);
  const onFocus = useCallback(() => {
    const state = useFourfold.getState();
    if (state.view.hover === null) {
      const centre = centrePixel();
      if (centre !== null) state.setKeyboardHover(centre);
    }
  }, []);
  const onBlur = useCallback(() => {
    const state = useFourfold.getState();
    if (state.view.keyboardHover) state.setHover(null);
  }, []);
  return useMemo(() => ({ onKeyDown, onFocus, onBlur }), [onKeyDown, onFocus, onBlur]);
}
