import { useId } from 'react';

export interface SwatchProps {
  /** One colour, or a composite label's token colours (drawn as diagonal stripes). */
  readonly colours: readonly string[];
  /** Side, CSS pixels (default 16). */
  readonly size?: number;
}

/** Stripe width across the stripe; 4 CSS px along a row on the canvas is 4 / sqrt(2) across. */
const STRIPE = 4 / Math.SQRT2;

/** A small square of a label's colour, striped like the canvas for a composite label. */
export function Swatch({ colours, size = 16 }: SwatchProps) {
  const patternId = `swatch-${useId().replace(/[^A-Za-z0-9_-]/g, '')}`;
  const striped = colours.length > 1;
  return (
    <svg className="legend-swatch" width={size} height={size} aria-hidden="true">
      {striped && (
        <defs>
          <pattern
            id={patternId}
            patternUnits="userSpaceOnUse"
            width={STRIPE * colours.length}
            height={STRIPE * colours.length}
            patternTransform="rotate(45)"
          >
            {colours.map((colour, n) => (
              <rect
                key={n}
                x={STRIPE * n}
                width={STRIPE}
                height={STRIPE * colours.length}
                fill={colour}
              />
            ))}
          </pattern>
        </defs>
      )}
      <rect
        x={0.5}
        y={0.5}
        width={size - 1}
        height={size - 1}
        fill={striped ? `url(#${patternId})` : colours[0]}
      />
    </svg>
  );
}
