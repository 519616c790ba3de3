import type { ScaleLinear } from 'd3';
import { useFourfold } from '../store/index';

type Scale = ScaleLinear<number, number>;

/** Radius of a pin's mark, CSS pixels: a click inside it selects the pin. */
export const PIN_MARK_RADIUS = 8;

/** Numbered marks of the pinned Probe points on the Map (the selected one ringed). */
export function PinLayer({ x, y }: { x: Scale; y: Scale }) {
  const pins = useFourfold((s) => s.probe.pins);
  const selected = useFourfold((s) => s.probe.selected);
  return (
    <g className="map-pins">
      {pins.map((pin) => {
        const cx = x(pin.x);
        const cy = y(pin.y);
        const isSelected = pin.id === selected;
        return (
          <g
            key={pin.id}
            className={isSelected ? 'map-pin map-pin-selected' : 'map-pin'}
            data-testid={`map-pin-${pin.id}`}
            transform={`translate(${cx},${cy})`}
          >
            {isSelected && <circle r={12} className="map-pin-ring" />}
            <circle r={PIN_MARK_RADIUS} className="map-pin-disc" />
            <text className="map-pin-number" textAnchor="middle" dy="0.35em">
              {pin.id}
            </text>
          </g>
        );
      })}
    </g>
  );
}
