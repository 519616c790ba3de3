import { useCallback, type MouseEvent, type PointerEvent } from 'react';
import { useCutDrawing } from '../cut/useCutDrawing';
import { useContentWidth } from '../useContentWidth';
import { useFourfold } from '../store/index';
import './map.css';
import { Overlay } from './Overlay';
import { PLOT_MARGIN, plotSide } from './plotFrame';
import { pixelAtFraction } from './plotPixels';
import { PIN_MARK_RADIUS } from '../probe/PinLayer';
import { RegionLayer } from './RegionLayer';

/**
 * The Map: the region canvas with its vector overlay (axes, boundaries, crosshair) in a square
 * plot that fits the available width. Moving the pointer over the plot sets the hovered pixel.
 */
export function MapView() {
  const hasGrid = useFourfold((s) => s.map.grid !== null);
  const [ref, width] = useContentWidth();
  const side = plotSide(width);
  const drawing = useCutDrawing();

  const onPointerMove = useCallback((event: PointerEvent<HTMLCanvasElement>) => {
    const { map, view, setHover } = useFourfold.getState();
    if (map.grid === null) return;
    const box = event.currentTarget.getBoundingClientRect();
    const pixel = pixelAtFraction(
      (event.clientX - box.left) / box.width,
      (event.clientY - box.top) / box.height,
      map.grid.nx,
      map.grid.ny,
    );
    const current = view.hover;
    if (pixel === null) {
      if (current !== null) setHover(null);
    } else if (current === null || current.i !== pixel.i || current.j !== pixel.j) {
      setHover(pixel);
    }
  }, []);
  // A click pins the pixel's centre (the point the hover readout shows) for the Probe; a click
  // on a pin's mark selects that pin instead.
  const { endsLine } = drawing;
  const onClick = useCallback(
    (event: MouseEvent<HTMLCanvasElement>) => {
      const { map, view, probe, addPin, selectPin } = useFourfold.getState();
      if (endsLine() || map.grid === null || view.mapGesture !== 'pin') return;
      const box = event.currentTarget.getBoundingClientRect();
      const fx = (event.clientX - box.left) / box.width;
      const fy = (event.clientY - box.top) / box.height;
      const { x, y } = map.grid.input.plane;
      const hit = probe.pins.find(
        (pin) =>
          Math.hypot(
            ((pin.x - x.from) / (x.to - x.from) - fx) * box.width,
            ((y.to - pin.y) / (y.to - y.from) - fy) * box.height,
          ) <= PIN_MARK_RADIUS,
      );
      if (hit) {
        selectPin(hit.id);
        return;
      }
      const pixel = pixelAtFraction(fx, fy, map.grid.nx, map.grid.ny);
      if (pixel !== null) addPin(map.grid.x[pixel.i]!, map.grid.y[pixel.j]!);
    },
    [endsLine],
  );
  const onPointerLeave = useCallback(() => {
    const { view, setHover } = useFourfold.getState();
    if (view.hover !== null) setHover(null);
  }, []);

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
          <RegionLayer
            side={side}
            onPointerMove={(event) => {
              drawing.onPointerMove(event);
              onPointerMove(event);
            }}
            onPointerLeave={onPointerLeave}
            onPointerDown={drawing.onPointerDown}
            onPointerUp={drawing.onPointerUp}
            onClick={onClick}
          />
          <Overlay side={side} />
        </div>
      ) : (
        <p className="map-placeholder">The Map appears here once the Setup has been mapped.</p>
      )}
    </div>
  );
}
