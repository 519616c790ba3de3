/** An axis title as a symbol with an optional subscript, for SVG text with a subscript tspan. */
export interface AxisTitle {
  readonly symbol: string;
  readonly subscript: string;
}

const NAMED: Readonly<Record<string, AxisTitle>> = {
  u_perp: { symbol: 'u', subscript: '\u22a5' },
  E_Z: { symbol: 'E', subscript: 'Z' },
  Delta_V: { symbol: '\u0394', subscript: 'V' },
};

/**
 * Typesets a plane axis label: 'u_perp' -> u with subscript ⊥, 'E_Z' -> E with subscript Z,
 * 'Delta_V' -> Δ with subscript V, 'u_' + a channel name ('u_z', 'u_zz', 'u_x0') -> u with that
 * subscript; any other label is plain text (empty subscript), '' becomes `fallback`.
 */
export function axisTitle(label: string, fallback: string): AxisTitle {
  const named = NAMED[label];
  if (named !== undefined) return named;
  const channel = /^u_([0xyz]{1,2})$/.exec(label);
  if (channel !== null) return { symbol: 'u', subscript: channel[1]! };
  return { symbol: label === '' ? fallback : label, subscript: '' };
}
