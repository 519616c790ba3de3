/**
 * Fixed-decimal text for a number, with values that round to zero shown as plain "0"
 * (so -0.0000 never appears) and non-finite values spelled out.
 */
export function formatFixed(value: number, decimals: number): string {
  if (!Number.isFinite(value)) return String(value);
  const text = value.toFixed(decimals);
  return Number(text) === 0 ? '0' : text;
}

/**
 * An angle given in radians as fixed-decimal degrees in the half-open interval (-180, 180]: a
 * phase and its value plus or minus 360 degrees print the same, and a value that rounds to
 * -180 prints as 180 (so one phase never shows as both 180.0 and -180.0).
 */
export function formatDegrees(radians: number, decimals: number): string {
  if (!Number.isFinite(radians)) return String(radians);
  const degrees = (radians * 180) / Math.PI;
  const wrapped = degrees - 360 * Math.ceil((degrees - 180) / 360);
  const text = formatFixed(wrapped, decimals);
  return Number(text) <= -180 ? formatFixed(180, decimals) : text;
}

/**
 * An integer with commas between groups of three digits ('65,536'), as toLocaleString('en-US')
 * writes it, without loading the browser's locale data (about 30 ms at page load).
 */
export function groupThousands(value: number): string {
  return String(value).replace(/\B(?=(\d{3})+(?!\d))/g, ',');
}
