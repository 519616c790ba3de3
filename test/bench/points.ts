import {
  DEFAULT_MINIMISE,
  couplingsOf,
  minimiseEnergy,
  type Couplings,
  type SearchPlan,
} from '../../solver/index';
import { median, microsPerCall, timed } from './measure';
import type { ModelPair } from './models';
import { NAIVE_DEFAULTS, NaiveWorkspace, naiveSolve } from './naive';

/** Calls per timed batch of one model (a cold point takes tens of microseconds). */
export const BATCH = 20;

/** An energy above the reference by more than this times the scale is a miss. */
export const MISS_TOLERANCE = 1e-9;

/** Starts of the long naive run that, with a wide search of ours, sets the reference. */
export const REFERENCE_STARTS = 256;

/** A wider search of ours for the reference (more library seeds and random frames). */
const WIDE_SEARCH = { rankedStarts: 24, randomStarts: 32, seed: 0x7e57 };

/** Naive start counts whose miss rates are reported (prefixes of the reference run). */
export const NAIVE_START_COUNTS = [1, 4, 8, 16, 32, 64, 128, REFERENCE_STARTS];

export interface Misses {
  readonly count: number;
  readonly total: number;
  /** Largest excess over the reference, relative to the scale (0 without a miss). */
  readonly worst: number;
}

/** Reference energies of a set of models: the best that any method found. */
export interface Reference {
  readonly couplings: Couplings[];
  readonly energy: Float64Array;
  /** Energy of the best of the first k naive starts, for k in NAIVE_START_COUNTS. */
  readonly naiveByStarts: Map<number, Float64Array>;
  /** Mean iterations per naive start and the fraction of starts that did not converge. */
  readonly naiveIterations: number;
  readonly naiveUnconverged: number;
}

export interface ColdPoints {
  readonly oursEnergy: Float64Array;
  readonly naiveEnergy: Float64Array;
  /** Microseconds per call of ours, one per model. */
  readonly oursMicros: number[];
  /** Milliseconds per naive solve, one per model. */
  readonly naiveMillis: number[];
  readonly oursMisses: Misses;
  readonly naiveMisses: Misses;
  readonly naiveMissesByStarts: { starts: number; misses: Misses }[];
  readonly reference: Reference;
}

/** Misses among the models `indices` (default all) of a set. */
export function countMisses(
  energy: ArrayLike<number>,
  reference: Reference,
  indices: readonly number[] = Array.from(reference.energy, (_, n) => n),
): Misses {
  let count = 0;
  let worst = 0;
  for (const n of indices) {
    const scale = reference.couplings[n]!.scale;
    const excess = (energy[n]! - reference.energy[n]!) / scale;
    if (excess > MISS_TOLERANCE) {
      count++;
      worst = Math.max(worst, excess);
    }
  }
  return { count, total: indices.length, worst };
}

/** Seed of the naive random stream for model n of a set. */
function naiveSeed(setSeed: number, n: number): number {
  return setSeed * 100_003 + n;
}

function buildReference(
  couplings: Couplings[],
  ours: Float64Array,
  setSeed: number,
  ws: NaiveWorkspace,
): Reference {
  const energy = Float64Array.from(ours);
  const naiveByStarts = new Map(
    NAIVE_START_COUNTS.map((k) => [k, new Float64Array(couplings.length)]),
  );
  let iterations = 0;
  let unconverged = 0;
  couplings.forEach((c, n) => {
    const long = naiveSolve(
      c,
      { ...NAIVE_DEFAULTS, starts: REFERENCE_STARTS },
      naiveSeed(setSeed, n),
      ws,
    );
    iterations += long.iterations;
    unconverged += long.unconverged;
    let best = Infinity;
    for (let s = 0; s < REFERENCE_STARTS; s++) {
      best = Math.min(best, long.startEnergies[s]!);
      naiveByStarts.get(s + 1)?.set([best], n);
    }
    const wide = minimiseEnergy(c, WIDE_SEARCH).energy;
    energy[n] = Math.min(energy[n]!, wide, long.energy);
  });
  const starts = couplings.length * REFERENCE_STARTS;
  return {
    couplings,
    energy,
    naiveByStarts,
    naiveIterations: iterations / starts,
    naiveUnconverged: unconverged / starts,
  };
}

/**
 * Cold single points: ours as `minimiseEnergy(couplingsOf(model))`, timed per model over a batch
 * after a warm-up; the naive baseline with `naiveStarts` starts, timed once per model (each solve
 * takes milliseconds; `naiveRepeats` times, median, for small sets). Then the reference and the miss rates of both.
 */
export function coldPoints(
  pairs: readonly ModelPair[],
  naiveStarts: number,
  setSeed: number,
  naiveRepeats = 1,
): ColdPoints {
  const ws = new NaiveWorkspace();
  const couplings = pairs.map((p) => couplingsOf(p.model));
  const naiveOptions = { ...NAIVE_DEFAULTS, starts: naiveStarts };
  // Warm-up: let the JIT compile both methods on this kind of model before any timing.
  for (let n = 0; n < Math.min(20, pairs.length); n++) {
    for (let k = 0; k < 5; k++) minimiseEnergy(couplingsOf(pairs[n]!.model));
    naiveSolve(couplings[n]!, { ...NAIVE_DEFAULTS, starts: 4 }, 1, ws);
  }
  const ours = Float64Array.from(couplings, (c) => minimiseEnergy(c).energy);
  const oursMicros = pairs.map(({ model }) =>
    microsPerCall(() => minimiseEnergy(couplingsOf(model)), BATCH),
  );
  const naive = new Float64Array(pairs.length);
  const naiveMillis = pairs.map(({ model }, n) => {
    const runs = Array.from({ length: naiveRepeats }, () =>
      timed(() => naiveSolve(couplingsOf(model), naiveOptions, naiveSeed(setSeed, n), ws)),
    );
    naive[n] = runs[0]!.value.energy;
    return median(runs.map((run) => run.millis));
  });
  const reference = buildReference(couplings, ours, setSeed, ws);
  return {
    oursEnergy: ours,
    naiveEnergy: naive,
    oursMicros,
    naiveMillis,
    oursMisses: countMisses(ours, reference),
    naiveMisses: countMisses(naive, reference),
    naiveMissesByStarts: NAIVE_START_COUNTS.map((starts) => ({
      starts,
      misses: countMisses(reference.naiveByStarts.get(starts)!, reference),
    })),
    reference,
  };
}

export interface EqualCorrectness {
  /** Fewest naive starts (among NAIVE_START_COUNTS) with no more misses than ours. */
  readonly starts: number;
  readonly misses: Misses;
  /** Median milliseconds of a naive solve with that many starts. */
  readonly medianMillis: number;
}

/**
 * The naive baseline at equal correctness: the fewest starts whose miss count does not exceed
 * ours, timed on the same models (undefined when no start count up to REFERENCE_STARTS does).
 * The longest run is part of the reference, so the count at REFERENCE_STARTS flatters the
 * naive method.
 */
export function equalCorrectness(
  pairs: readonly ModelPair[],
  cold: ColdPoints,
  setSeed: number,
): EqualCorrectness | undefined {
  const match = cold.naiveMissesByStarts.find(
    ({ misses }) => misses.count <= cold.oursMisses.count,
  );
  if (match === undefined) return undefined;
  const ws = new NaiveWorkspace();
  const options = { ...NAIVE_DEFAULTS, starts: match.starts };
  const millis = pairs.map(
    ({ model }, n) =>
      timed(() => naiveSolve(couplingsOf(model), options, naiveSeed(setSeed, n), ws)).millis,
  );
  return { starts: match.starts, misses: match.misses, medianMillis: median(millis) };
}

export interface WarmPoints {
  readonly oursMicros: number[];
  readonly oursMisses: Misses;
}

/**
 * Warm-started points: each model solved from the ground state of its neighbour only
 * (`coldSearch: false`), as a map pixel is solved from the one next to it.
 */
export function warmPoints(pairs: readonly ModelPair[], reference: Reference): WarmPoints {
  const plans: SearchPlan[] = pairs.map(({ neighbour }) => ({
    warmStarts: [minimiseEnergy(couplingsOf(neighbour)).frame],
    coldSearch: false,
  }));
  const solveWarm = (n: number) =>
    minimiseEnergy(couplingsOf(pairs[n]!.model), DEFAULT_MINIMISE, plans[n]);
  for (let n = 0; n < Math.min(20, pairs.length); n++) for (let k = 0; k < 5; k++) solveWarm(n);
  const energy = pairs.map((_, n) => solveWarm(n).energy);
  const oursMicros = pairs.map((_, n) => microsPerCall(() => solveWarm(n), BATCH));
  return { oursMicros, oursMisses: countMisses(energy, reference) };
}

/** Median microseconds per call of one model over `batches` batches (for a single model row). */
export function singleModelMicros(pair: ModelPair, batches: number): number {
  const call = () => minimiseEnergy(couplingsOf(pair.model));
  for (let k = 0; k < 50; k++) call();
  return median(Array.from({ length: batches }, () => microsPerCall(call, BATCH)));
}
