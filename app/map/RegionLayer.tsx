import { useEffect, useRef, type MouseEventHandler, type PointerEventHandler } from 'react';
import type { MapGrid } from '../../solver/index';
import { useFourfold } from '../store/index';
import { drawRegions } from './drawRegions';
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
 * on the plot box. Redrawn at most once per animation frame after the grid changes.
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
  const imageRef = useRef<ImageData | null>(null);
  const frameRef = useRef(0);
  const latestRef = useRef<{ grid: MapGrid | null; stripeWidth: number }>({
    grid: null,
    stripeWidth,
  });

  useEffect(() => {
    latestRef.current = { grid, stripeWidth };
    // One draw per frame however often the grid changes meanwhile; it reads the latest state.
    if (frameRef.current !== 0) return;
    frameRef.current = requestAnimationFrame(() => {
      frameRef.current = 0;
      const canvas = canvasRef.current;
      const context = canvas?.getContext('2d', { alpha: false });
      const latest = latestRef.current;
      if (!canvas || !context || latest.grid === null) return;
      let image = imageRef.current;
      if (image === null || image.width !== canvas.width || image.height !== canvas.height) {
        image = context.createImageData(canvas.width, canvas.height);
        imageRef.current = image;
      }
      drawRegions(image, latest.grid, { stripeWidth: latest.stripeWidth });
      context.putImageData(image, 0, 0);
    });
  }, [grid, version, deviceSide, stripeWidth]);

  useEffect(
    () => () => {
      cancelAnimationFrame(frameRef.current);
      frameRef.current = 0;
    },
    [],
  );

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
