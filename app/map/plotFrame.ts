/** Space around the plot for tick labels and axis titles, in CSS pixels. */
export const PLOT_MARGIN = { top: 14, right: 18, bottom: 46, left: 64 } as const;

/** Smallest and largest side of the square plot, in CSS pixels. */
export const PLOT_MIN = 360;
export const PLOT_MAX = 640;

/**
 * Side of the square plot (whole CSS pixels) that fits `availableWidth` with its margins,
 * clamped to [PLOT_MIN, PLOT_MAX].
 */
export function plotSide(availableWidth: number): number {
  const fit = Math.floor(availableWidth - PLOT_MARGIN.left - PLOT_MARGIN.right);
  return Math.min(PLOT_MAX, Math.max(PLOT_MIN, Number.isFinite(fit) ? fit : PLOT_MIN));
}
