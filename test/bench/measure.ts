/** Timing and summary statistics for the benchmark (wall clock, performance.now()). */

export function median(values: readonly number[]): number {
  return quantile(values, 0.5);
}

/** Linear-interpolated quantile q in [0, 1] of the values. */
export function quantile(values: readonly number[], q: number): number {
  if (values.length === 0) return NaN;
  const sorted = [...values].sort((a, b) => a - b);
  const at = q * (sorted.length - 1);
  const lo = Math.floor(at);
  const hi = Math.min(lo + 1, sorted.length - 1);
  return sorted[lo]! + (at - lo) * (sorted[hi]! - sorted[lo]!);
}

/**
 * Microseconds per call of `call`, timed over one batch of `repetitions` back-to-back calls so
 * that the batch is far above the timer's resolution.
 */
export function microsPerCall(call: () => unknown, repetitions: number): number {
  const start = performance.now();
  for (let k = 0; k < repetitions; k++) call();
  return ((performance.now() - start) * 1000) / repetitions;
}

/** Milliseconds taken by one call, with its result. */
export function timed<T>(call: () => T): { millis: number; value: T } {
  const start = performance.now();
  const value = call();
  return { millis: performance.now() - start, value };
}

/** Milliseconds taken by one asynchronous call, with its result. */
export async function timedAsync<T>(call: () => Promise<T>): Promise<{ millis: number; value: T }> {
  const start = performance.now();
  const value = await call();
  return { millis: performance.now() - start, value };
}
