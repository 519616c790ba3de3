/**
 * Seeded pseudo-random numbers: mulberry32, a 32-bit generator in the public domain
 * (common practice for reproducible, fast, non-cryptographic streams).
 */
export type RandomSource = () => number;

/** Uniform numbers in [0, 1) from a 32-bit seed; the same seed gives the same stream. */
export function seededRandom(seed: number): RandomSource {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal deviate by the Box-Muller transform. */
export function gaussian(random: RandomSource): number {
  let u = random();
  while (u <= 0) u = random();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * random());
}
