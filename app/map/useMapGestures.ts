import { useCallback, useEffect, useMemo, useRef, type PointerEvent, type RefObject } from 'react';
import { useFourfold } from '../store/index';
import { commitExtent } from './mapNavigation';
import {
  boxExtent,
  panBy,
  wheelFactor,
  zoomAbout,
  type PlaneExtent,
  type PlotFraction,
} from './planeExtent';
import { shownExtent } from './shownExtent';

/** A press that moves less than this (CSS pixels) is a click (a pin), not a drag. */
const DRAG_PX = 6;

/** A wheel that has been still this long (ms) has finished its zoom: it becomes a plane change. */
export const WHEEL_SETTLE_MS = 250;

type Drag =
  | { kind: 'press' | 'box'; from: PlotFraction; x: number; y: number }
  | { kind: 'pan'; from: PlotFraction; extent: PlaneExtent; x: number; y: number };

interface Pinch {
  readonly distance: number;
  readonly at: PlotFraction;
  readonly extent: PlaneExtent;
}

/** Where a pointer is on the plot, as fractions of the canvas box (not clamped). */
function fractionAt(canvas: Element, clientX: number, clientY: number): PlotFraction {
  const box = canvas.getBoundingClientRect();
  return { fx: (clientX - box.left) / box.width, fy: (clientY - box.top) / box.height };
}

/** Pixels per line and per page of a wheel event that counts in those (Firefox, some mice). */
function wheelPixels(event: WheelEvent): number {
  const unit = event.deltaMode === 1 ? 16 : event.deltaMode === 2 ? 400 : 1;
  return event.deltaY * unit;
}

/**
 * Navigation of the plane with the pointer, each ending in a plane change (`commitExtent`):
 * the wheel (or a trackpad's pinch, which arrives as a wheel with Ctrl) zooms about the pointer,
 * shown at once and made a change once the wheel settles; a drag zooms to the box it draws;
 * a drag with Shift held, or in the pan mode, moves the plane with the pointer; two fingers
 * pinch. While the Map draws a Cut none of this applies (the drag draws the line). Escape drops
 * a drag or preview under way. `endsGesture()` is true once for the click that ends a drag, so
 * that it pins nothing. `ready`: the canvas is in the page (the wheel listener is put on it).
 */
export function useMapGestures(canvasRef: RefObject<HTMLCanvasElement | null>, ready: boolean) {
  const drag = useRef<Drag | null>(null);
  const ended = useRef(false);
  const touches = useRef(new Map<number, { x: number; y: number }>());
  const pinch = useRef<Pinch | null>(null);

  const cancel = useCallback(() => {
    drag.current = null;
    pinch.current = null;
    const { setPreview, setZoomBox } = useFourfold.getState();
    setZoomBox(null);
    setPreview(null);
  }, []);

  const onPointerDown = useCallback((event: PointerEvent<HTMLCanvasElement>) => {
    ended.current = false;
    const state = useFourfold.getState();
    if (state.view.mapGesture === 'cut') return;
    const extent = shownExtent(state);
    if (extent === null) return;
    const canvas = event.currentTarget;
    if (event.pointerType === 'touch') {
      touches.current.set(event.pointerId, { x: event.clientX, y: event.clientY });
      if (touches.current.size === 2) {
        const [a, b] = [...touches.current.values()] as [
          { x: number; y: number },
          { x: number; y: number },
        ];
        drag.current = null;
        state.setZoomBox(null);
        pinch.current = {
          distance: Math.hypot(a.x - b.x, a.y - b.y),
          at: fractionAt(canvas, (a.x + b.x) / 2, (a.y + b.y) / 2),
          extent: state.view.preview ?? extent,
        };
        return;
      }
    }
    if (event.button !== 0) return;
    canvas.setPointerCapture?.(event.pointerId);
    const from = fractionAt(canvas, event.clientX, event.clientY);
    drag.current =
      event.shiftKey || state.view.mapGesture === 'pan'
        ? { kind: 'pan', from, extent, x: event.clientX, y: event.clientY }
        : { kind: 'press', from, x: event.clientX, y: event.clientY };
  }, []);

  const onPointerMove = useCallback((event: PointerEvent<HTMLCanvasElement>) => {
    const canvas = event.currentTarget;
    const { setPreview, setZoomBox } = useFourfold.getState();
    if (touches.current.has(event.pointerId)) {
      touches.current.set(event.pointerId, { x: event.clientX, y: event.clientY });
    }
    const p = pinch.current;
    if (p !== null && touches.current.size === 2) {
      const [a, b] = [...touches.current.values()] as [
        { x: number; y: number },
        { x: number; y: number },
      ];
      const distance = Math.hypot(a.x - b.x, a.y - b.y);
      if (distance > 0) setPreview(zoomAbout(p.extent, p.at, p.distance / distance));
      return;
    }
    const d = drag.current;
    if (d === null) return;
    const to = fractionAt(canvas, event.clientX, event.clientY);
    if (d.kind === 'pan') {
      setPreview(panBy(d.extent, d.from, to));
      return;
    }
    if (d.kind === 'press') {
      if (Math.hypot(event.clientX - d.x, event.clientY - d.y) < DRAG_PX) return;
      drag.current = { ...d, kind: 'box' };
    }
    setZoomBox({ from: d.from, to });
  }, []);

  const onPointerUp = useCallback((event: PointerEvent<HTMLCanvasElement>) => {
    touches.current.delete(event.pointerId);
    const state = useFourfold.getState();
    if (pinch.current !== null) {
      if (touches.current.size < 2) {
        pinch.current = null;
        ended.current = true;
        const preview = state.view.preview;
        if (preview !== null) commitExtent(preview, { label: 'Zoom (pinch)', kind: 'zoom-pinch' });
      }
      return;
    }
    const d = drag.current;
    drag.current = null;
    if (d === null) return;
    const to = fractionAt(event.currentTarget, event.clientX, event.clientY);
    const moved = Math.hypot(event.clientX - d.x, event.clientY - d.y) >= DRAG_PX;
    if (d.kind === 'pan') {
      const preview = state.view.preview;
      if (moved && preview !== null) {
        ended.current = true;
        commitExtent(preview, { label: 'Pan', kind: 'pan' });
      } else state.setPreview(null);
      return;
    }
    state.setZoomBox(null);
    if (d.kind !== 'box') return;
    ended.current = true;
    const extent = shownExtent(state);
    const box = extent === null ? null : boxExtent(extent, d.from, to);
    if (box !== null) commitExtent(box, { label: 'Zoom to box', kind: 'zoom-box' });
  }, []);

  const onPointerCancel = useCallback(
    (event: PointerEvent<HTMLCanvasElement>) => {
      touches.current.delete(event.pointerId);
      cancel();
    },
    [cancel],
  );

  // The wheel: a listener that may prevent the page from scrolling (React's is passive).
  useEffect(() => {
    const canvas = canvasRef.current;
    if (canvas === null) return;
    let timer: ReturnType<typeof setTimeout> | undefined;
    let net = 1;
    const settle = () => {
      timer = undefined;
      const preview = useFourfold.getState().view.preview;
      const zoomedIn = net < 1;
      net = 1;
      if (preview !== null) {
        commitExtent(preview, {
          label: zoomedIn ? 'Zoom in' : 'Zoom out',
          kind: 'zoom-wheel',
        });
      }
    };
    const onWheel = (event: WheelEvent) => {
      const state = useFourfold.getState();
      if (drag.current !== null || pinch.current !== null) return;
      const extent = state.view.preview ?? shownExtent(state);
      if (extent === null) return;
      const pixels = wheelPixels(event);
      if (pixels === 0) return;
      event.preventDefault();
      const factor = wheelFactor(pixels);
      net *= factor;
      state.setPreview(zoomAbout(extent, fractionAt(canvas, event.clientX, event.clientY), factor));
      clearTimeout(timer);
      timer = setTimeout(settle, WHEEL_SETTLE_MS);
    };
    canvas.addEventListener('wheel', onWheel, { passive: false });
    return () => {
      canvas.removeEventListener('wheel', onWheel);
      if (timer !== undefined) {
        clearTimeout(timer);
        settle();
      }
    };
  }, [canvasRef, ready]);

  // Escape drops a drag or a preview under way.
  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      if (event.key !== 'Escape') return;
      const { view } = useFourfold.getState();
      if (drag.current !== null || pinch.current !== null || view.preview !== null) cancel();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [cancel]);

  const endsGesture = useCallback((): boolean => {
    const ends = ended.current;
    ended.current = false;
    return ends;
  }, []);

  return useMemo(
    () => ({ onPointerDown, onPointerMove, onPointerUp, onPointerCancel, endsGesture }),
    [onPointerDown, onPointerMove, onPointerUp, onPointerCancel, endsGesture],
  );
}
