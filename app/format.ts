/**
 * Fixed-decimal text for a number, with values that round to zero shown as plain "0"
 * (so -0.0000 never appears) and non-finite values spelled out.
 */
export function formatFixed(value: number, decimals: number): string {
  if (!Number.isFinite(value)) return String(value);
  const text = value.toFixed(decimals);
  return Number(text) === 0 ? '0' : text;
}
