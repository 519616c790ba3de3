/**
 * Where grid pixels sit on the plot. Grid column i covers the plot fraction [i / nx, (i + 1) / nx)
 * from the left; grid row j = 0 is the bottom row (y = from), so row j covers
 * [(ny - 1 - j) / ny, (ny - j) / ny) from the top. Drawing and hovering both use these, so the
 * pixel under the pointer is the one drawn there.
 */

/** Grid column shown at canvas column `px` (0..width-1) of a canvas `width` pixels wide. */
export function gridColumn(px: number, width: number, nx: number): number {
  return Math.min(nx - 1, Math.max(0, Math.floor((px * nx) / width)));
}

/** Grid row shown at canvas row `py` (0 at the top) of a canvas `height` pixels high. */
export function gridRow(py: number, height: number, ny: number): number {
  return ny - 1 - Math.min(ny - 1, Math.max(0, Math.floor((py * ny) / height)));
}

/**
 * The grid pixel under a point given as fractions of the plot box (fx from the left, fy from the
 * top), or null outside the box.
 */
export function pixelAtFraction(
  fx: number,
  fy: number,
  nx: number,
  ny: number,
): { i: number; j: number } | null {
  if (!(fx >= 0 && fx <= 1 && fy >= 0 && fy <= 1)) return null;
  return { i: gridColumn(fx, 1, nx), j: gridRow(fy, 1, ny) };
}
