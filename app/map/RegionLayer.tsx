import {
  useEffect,
  useLayoutEffect,
  useRef,
  useState,
  type MouseEventHandler,
  type PointerEventHandler,
} from 'react';
import type { MapGrid } from '../../solver/index';
import { useFourfold } from '../store/index';
import { drawRegions } from './drawRegions';
import { frameLimiter } from './frameLimiter';
import { PLOT_MARGIN } from './plotFrame';
import { useDevicePixelRatio } from './useDevicePixelRatio';

export interface RegionLayerProps {
  /** Side of the square plot, CSS pixels. */
  readonly side: number;
  readonly onPointerMove?: PointerEventHandler<HTMLCanvasElement>;
  readonly onPointerLeave?: PointerEventHandler<HTMLCanvasElement>;
  readonly onPointerDown?: PointerEventHandler<HTMLCanvasElement>;
  readonly onPointerUp?: PointerEventHandler<HTMLCanvasElement>;
  readonly onClick?: MouseEventHandler<HTMLCanvasElement>;
}

/** Composite stripes about 4 CSS pixels wide along a row (a two-token period of about 8). */
const STRIPE_CSS_PX = 4;

/**
 * The Map's filled regions on a canvas of side x devicePixelRatio device pixels, placed exactly
 * on the plot box. Redrawn at most once per animation frame after the grid changes (`putImageData`
 * of a buffer kept between draws).
 */
export function RegionLayer({
  side,
  onPointerMove,
  onPointerLeave,
  onPointerDown,
  onPointerUp,
  onClick,
}: RegionLayerProps) {
  const grid = useFourfold((s) => s.map.grid);
  const version = useFourfold((s) => s.map.version);
  const ratio = useDevicePixelRatio();
  const deviceSide = Math.max(1, Math.round(side * ratio));
  const stripeWidth = Math.max(2, Math.round(STRIPE_CSS_PX * ratio));

  const canvasRef = useRef<HTMLCanvasElement>(null);
  const latestRef = useRef<{ grid: MapGrid | null; stripeWidth: number }>({
    grid: null,
    stripeWidth,
  });
  // One draw per animation frame at most, reading the latest grid; the Map driver updates the
  // store in an animation-frame callback, so the draw lands in the frame being prepared.
  const [limiter] = useState(() => {
    let image: ImageData | null = null;
    return frameLimiter(() => {
      const canvas = canvasRef.current;
      const context = canvas?.getContext('2d', { alpha: false });
      const latest = latestRef.current;
      if (!canvas || !context || latest.grid === null) return;
      if (image === null || image.width !== canvas.width || image.height !== canvas.height) {
        image = context.createImageData(canvas.width, canvas.height);
      }
      drawRegions(image, latest.grid, { stripeWidth: latest.stripeWidth });
      context.putImageData(image, 0, 0);
    });
  });

  useLayoutEffect(() => {
    latestRef.current = { grid, stripeWidth };
    limiter.request();
  }, [limiter, grid, version, deviceSide, stripeWidth]);

  useEffect(() => () => limiter.cancel(), [limiter]);

  const plane = grid?.input.plane;
  return (
    <canvas
      ref={canvasRef}
      className="map-plot"
      data-testid="map-plot"
      width={deviceSide}
      height={deviceSide}
      style={{ left: PLOT_MARGIN.left, top: PLOT_MARGIN.top, width: side, height: side }}
      role="img"
      aria-label={
        plane
          ? `Map of ground-state regions over ${plane.x.label || 'x'} from ${plane.x.from} to ${plane.x.to} and ${plane.y.label || 'y'} from ${plane.y.from} to ${plane.y.to}`
          : 'Map of ground-state regions'
      }
      onPointerMove={onPointerMove}
      onPointerLeave={onPointerLeave}
      onPointerDown={onPointerDown}
      onPointerUp={onPointerUp}
      onClick={onClick}
    />
  );
}
