import { useCallback, useMemo, useRef, type PointerEvent } from 'react';
import { pointAt } from '../map/planeExtent';
import { shownExtent } from '../map/shownExtent';
import { useFourfold } from '../store/index';

/** A drag shorter than this (CSS pixels) is a click, not a cut. */
const MIN_DRAG_PX = 6;

type Pair = [number, number];

/** Plane coordinates of a pointer over the plot canvas, clamped to the plot, 6 digits. */
function planePoint(event: PointerEvent<HTMLCanvasElement>): Pair | null {
  const extent = shownExtent(useFourfold.getState());
  if (extent === null) return null;
  const box = event.currentTarget.getBoundingClientRect();
  const fx = Math.min(1, Math.max(0, (event.clientX - box.left) / box.width));
  const fy = Math.min(1, Math.max(0, (event.clientY - box.top) / box.height));
  const round = (v: number): number => Number(v.toPrecision(6));
  const [x, y] = pointAt(extent, { fx, fy });
  return [round(x), round(y)];
}

/**
 * Pointer handlers that draw a Cut on the Map while the Map's gesture is 'cut': press, drag,
 * release sets the Cut to the straight line between the two points (plane coordinates) and
 * returns the Map to pinning. A press without a drag draws nothing and stays in the mode. The
 * canvas keeps the pointer during the drag.
 */
export function useCutDrawing() {
  const start = useRef<{ point: Pair; x: number; y: number } | null>(null);
  // The click that ends a drawn line's press must not pin a point (the Map is back to pinning
  // by then); a new press forgets it in case no click followed.
  const lineJustDrawn = useRef(false);
  const onPointerDown = useCallback((event: PointerEvent<HTMLCanvasElement>) => {
    lineJustDrawn.current = false;
    if (useFourfold.getState().view.mapGesture !== 'cut' || event.button !== 0) return;
    const point = planePoint(event);
    if (point === null) return;
    event.currentTarget.setPointerCapture(event.pointerId);
    start.current = { point, x: event.clientX, y: event.clientY };
    useFourfold.getState().setCutDraft({ from: point, to: point });
  }, []);
  const onPointerMove = useCallback((event: PointerEvent<HTMLCanvasElement>) => {
    const from = start.current;
    if (from === null || useFourfold.getState().view.mapGesture !== 'cut') return;
    const point = planePoint(event);
    if (point !== null) useFourfold.getState().setCutDraft({ from: from.point, to: point });
  }, []);
  const onPointerUp = useCallback((event: PointerEvent<HTMLCanvasElement>) => {
    const from = start.current;
    if (from === null) return;
    start.current = null;
    const { view, setCutDraft, setCutSpec, setMapGesture } = useFourfold.getState();
    setCutDraft(null);
    // Escape during the drag left the drawing mode: the line is dropped.
    if (view.mapGesture !== 'cut') return;
    const point = planePoint(event);
    const moved = Math.hypot(event.clientX - from.x, event.clientY - from.y);
    if (point === null || moved < MIN_DRAG_PX) return;
    if (point[0] === from.point[0] && point[1] === from.point[1]) return;
    setCutSpec({ kind: 'line', from: from.point, to: point });
    // One line per press of the button: the next click on the Map pins a point again.
    setMapGesture('pin');
    lineJustDrawn.current = true;
  }, []);
  /** True once for the click that ends a drawn line (the caller then ignores that click). */
  const endsLine = useCallback((): boolean => {
    const ends = lineJustDrawn.current;
    lineJustDrawn.current = false;
    return ends;
  }, []);
  return useMemo(
    () => ({ onPointerDown, onPointerMove, onPointerUp, endsLine }),
    [onPointerDown, onPointerMove, onPointerUp, endsLine],
  );
}
