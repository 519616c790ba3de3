import {
  useEffect,
  useLayoutEffect,
  useRef,
  useState,
  type DOMAttributes,
  type RefObject,
} from 'react';
import type { MapGrid } from '../../solver/index';
import { useFourfold } from '../store/index';
import { drawRegions } from './drawRegions';
import { frameLimiter } from './frameLimiter';
import { fractionOf, sameExtent, type PlaneExtent } from './planeExtent';
import { PLOT_MARGIN } from './plotFrame';
import { gridExtent, useShownExtent } from './shownExtent';
import { useDevicePixelRatio } from './useDevicePixelRatio';

export interface RegionLayerProps {
  /** Side of the square plot, CSS pixels. */
  readonly side: number;
  readonly canvasRef: RefObject<HTMLCanvasElement | null>;
  /** Pointer, click, key and focus handlers of the plot (the Map's gestures). */
  readonly handlers: DOMAttributes<HTMLCanvasElement>;
  /** The plot's accessible description: how to work the Map from the keyboard. */
  readonly describedBy?: string;
}

/** Composite stripes about 4 CSS pixels wide along a row (a two-token period of about 8). */
const STRIPE_CSS_PX = 4;

/** Where a new extent reaches beyond the grid on screen, before its own grid arrives. */
const OUTSIDE_COLOUR = '#e4e2dc';

/**
 * The Map's filled regions on a canvas of side x devicePixelRatio device pixels, placed exactly
 * on the plot box. Redrawn at most once per animation frame after the grid changes (`putImageData`
 * of a buffer kept between draws). While the shown extent differs from the grid's (a zoom or pan
 * whose map is still being computed, or under way), the grid on screen is drawn moved and scaled
 * to where it lies in the new extent, the rest in a plain grey. The canvas carries the shown
 * limits (`data-x-from`, `data-x-to`, `data-y-from`, `data-y-to`) and is focusable.
 */
export function RegionLayer({ side, canvasRef, handlers, describedBy }: RegionLayerProps) {
  const grid = useFourfold((s) => s.map.grid);
  const version = useFourfold((s) => s.map.version);
  const shown = useShownExtent();
  const ratio = useDevicePixelRatio();
  const deviceSide = Math.max(1, Math.round(side * ratio));
  const stripeWidth = Math.max(2, Math.round(STRIPE_CSS_PX * ratio));

  const latestRef = useRef<{
    grid: MapGrid | null;
    stripeWidth: number;
    shown: PlaneExtent | null;
  }>({ grid: null, stripeWidth, shown: null });
  // One draw per animation frame at most, reading the latest grid; the Map driver updates the
  // store in an animation-frame callback, so the draw lands in the frame being prepared.
  const [limiter] = useState(() => {
    let image: ImageData | null = null;
    let moved: HTMLCanvasElement | null = null;
    return frameLimiter(() => {
      const canvas = canvasRef.current;
      const context = canvas?.getContext('2d', { alpha: false });
      const latest = latestRef.current;
      if (!canvas || !context || latest.grid === null) return;
      if (image === null || image.width !== canvas.width || image.height !== canvas.height) {
        image = context.createImageData(canvas.width, canvas.height);
      }
      drawRegions(image, latest.grid, { stripeWidth: latest.stripeWidth });
      const own = gridExtent(latest.grid.input.plane);
      if (latest.shown === null || sameExtent(latest.shown, own)) {
        context.putImageData(image, 0, 0);
        return;
      }
      // The grid's image, placed where its corners fall in the shown extent.
      moved ??= document.createElement('canvas');
      if (moved.width !== canvas.width || moved.height !== canvas.height) {
        moved.width = canvas.width;
        moved.height = canvas.height;
      }
      moved.getContext('2d')!.putImageData(image, 0, 0);
      const topLeft = fractionOf(latest.shown, own.x[0], own.y[1]);
      const bottomRight = fractionOf(latest.shown, own.x[1], own.y[0]);
      context.fillStyle = OUTSIDE_COLOUR;
      context.fillRect(0, 0, canvas.width, canvas.height);
      context.imageSmoothingEnabled = false;
      context.drawImage(
        moved,
        topLeft.fx * canvas.width,
        topLeft.fy * canvas.height,
        (bottomRight.fx - topLeft.fx) * canvas.width,
        (bottomRight.fy - topLeft.fy) * canvas.height,
      );
    });
  });

  useLayoutEffect(() => {
    latestRef.current = { grid, stripeWidth, shown };
    limiter.request();
  }, [limiter, grid, version, deviceSide, stripeWidth, shown]);

  useEffect(() => () => limiter.cancel(), [limiter]);

  const plane = grid?.input.plane;
  return (
    <canvas
      ref={canvasRef}
      className="map-plot"
      data-testid="map-plot"
      data-x-from={shown?.x[0]}
      data-x-to={shown?.x[1]}
      data-y-from={shown?.y[0]}
      data-y-to={shown?.y[1]}
      width={deviceSide}
      height={deviceSide}
      style={{ left: PLOT_MARGIN.left, top: PLOT_MARGIN.top, width: side, height: side }}
      role="application"
      tabIndex={0}
      aria-roledescription="map of ground-state regions"
      aria-label={
        plane && shown
          ? `Map of ground-state regions over ${plane.x.label || 'x'} from ${shown.x[0]} to ${shown.x[1]} and ${plane.y.label || 'y'} from ${shown.y[0]} to ${shown.y[1]}`
          : 'Map of ground-state regions'
      }
      aria-describedby={describedBy}
      {...handlers}
    />
  );
}
