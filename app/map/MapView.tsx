import { useCallback, useId, useMemo, useRef, type MouseEvent, type PointerEvent } from 'react';
import { useCutDrawing } from '../cut/useCutDrawing';
import { PIN_MARK_RADIUS } from '../probe/PinLayer';
import { useFourfold } from '../store/index';
import { useContentWidth } from '../useContentWidth';
import './map.css';
import { Overlay } from './Overlay';
import { fractionOf, pointAt } from './planeExtent';
import { PLOT_MARGIN, PLOT_MIN, plotSide } from './plotFrame';
import { RegionLayer } from './RegionLayer';
import { pixelAtPoint, shownExtent } from './shownExtent';
import { useMapGestures } from './useMapGestures';
import { useFitHeight } from './useFitHeight';
import { useMapKeyboard } from './useMapKeyboard';

/** Height kept under the plot for the Map's status line (CSS pixels). */
const STATUS_RESERVE = 40;

/** Where a pointer event falls on the plot, as fractions of the canvas box. */
function plotFraction(event: MouseEvent<HTMLCanvasElement>) {
  const box = event.currentTarget.getBoundingClientRect();
  return { fx: (event.clientX - box.left) / box.width, fy: (event.clientY - box.top) / box.height };
}

/**
 * The Map: the region canvas with its vector overlay (axes, boundaries,
 * crosshair, pins, the Cut) in a square plot that fits the width available and the height the
 * page gives it (`--map-height`). The pointer over the plot sets the hovered pixel; a click
 * pins it; the wheel, a drag, Shift+drag and the keyboard navigate (`useMapGestures`,
 * `useMapKeyboard`).
 */
export function MapView() {
  const hasGrid = useFourfold((s) => s.map.grid !== null);
  const [ref, width] = useContentWidth();
  // The plot and the status line under it fit the window's height (down to PLOT_MIN).
  const height = useFitHeight(ref, STATUS_RESERVE);
  const side = Math.min(
    plotSide(width),
    Math.max(PLOT_MIN, height - PLOT_MARGIN.top - PLOT_MARGIN.bottom),
  );
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const drawing = useCutDrawing();
  const gestures = useMapGestures(canvasRef, hasGrid);
  const keyboard = useMapKeyboard();
  const keysId = useId();

  const onPointerMove = useCallback((event: PointerEvent<HTMLCanvasElement>) => {
    const state = useFourfold.getState();
    const grid = state.map.grid;
    const extent = shownExtent(state);
    if (grid === null || extent === null) return;
    const [x, y] = pointAt(extent, plotFraction(event));
    const pixel = pixelAtPoint(grid, x, y);
    const current = state.view.hover;
    if (pixel === null) {
      if (current !== null) state.setHover(null);
    } else if (
      current === null ||
      current.i !== pixel.i ||
      current.j !== pixel.j ||
      state.view.keyboardHover
    ) {
      state.setHover(pixel);
    }
  }, []);
  // A click pins the pixel's centre (the point the hover readout shows) for the Probe; a click
  // on a pin's mark selects that pin instead. The click that ends a drag (a Cut, a box, a pan)
  // pins nothing.
  const { endsLine } = drawing;
  const { endsGesture } = gestures;
  const onClick = useCallback(
    (event: MouseEvent<HTMLCanvasElement>) => {
      const state = useFourfold.getState();
      const line = endsLine();
      const gesture = endsGesture();
      const grid = state.map.grid;
      const extent = shownExtent(state);
      if (line || gesture || grid === null || extent === null) return;
      if (state.view.mapGesture !== 'pin') return;
      const box = event.currentTarget.getBoundingClientRect();
      const at = plotFraction(event);
      const hit = state.probe.pins.find((pin) => {
        const f = fractionOf(extent, pin.x, pin.y);
        return (
          Math.hypot((f.fx - at.fx) * box.width, (f.fy - at.fy) * box.height) <= PIN_MARK_RADIUS
        );
      });
      if (hit) {
        state.selectPin(hit.id);
        return;
      }
      const [x, y] = pointAt(extent, at);
      const pixel = pixelAtPoint(grid, x, y);
      if (pixel !== null) state.addPin(grid.x[pixel.i]!, grid.y[pixel.j]!);
    },
    [endsLine, endsGesture],
  );
  const onPointerLeave = useCallback(() => {
    const { view, setHover } = useFourfold.getState();
    if (view.hover !== null && !view.keyboardHover) setHover(null);
  }, []);

  const handlers = useMemo(
    () => ({
      onPointerMove: (event: PointerEvent<HTMLCanvasElement>) => {
        drawing.onPointerMove(event);
        gestures.onPointerMove(event);
        onPointerMove(event);
      },
      onPointerLeave,
      onPointerDown: (event: PointerEvent<HTMLCanvasElement>) => {
        drawing.onPointerDown(event);
        gestures.onPointerDown(event);
      },
      onPointerUp: (event: PointerEvent<HTMLCanvasElement>) => {
        drawing.onPointerUp(event);
        gestures.onPointerUp(event);
      },
      onPointerCancel: gestures.onPointerCancel,
      onClick,
      ...keyboard,
    }),
    [drawing, gestures, onPointerMove, onPointerLeave, onClick, keyboard],
  );

  return (
    <div className="map-view" data-testid="map" ref={ref}>
      {hasGrid ? (
        <div
          className="map-figure"
          style={{
            width: PLOT_MARGIN.left + side + PLOT_MARGIN.right,
            height: PLOT_MARGIN.top + side + PLOT_MARGIN.bottom,
          }}
        >
          <RegionLayer side={side} canvasRef={canvasRef} handlers={handlers} describedBy={keysId} />
          <Overlay side={side} />
          <p id={keysId} className="visually-hidden">
            Arrow keys move the crosshair (Shift: ten pixels) and the readout shows the state under
            it; Enter pins the point; plus and minus zoom about it; the wheel zooms, a drag zooms to
            a box, Shift and drag pans; Escape leaves a drawing or pan mode.
          </p>
        </div>
      ) : (
        <p className="map-placeholder">The Map appears here once the Setup has been mapped.</p>
      )}
    </div>
  );
}
