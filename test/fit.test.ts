import { describe, expect, test } from 'vitest';
import {
  DEFAULT_FIT_OPTIONS,
  axisValue,
  DEFAULT_SWEEP_FIELD,
  chiSquareRise,
  conditionKey,
  consistencyGrid,
  fitLikelihood,
  fitToJson,
  localFitRunners,
  parseFitPlane,
  parseMapInput,
  parseModel,
  predictRows,
  predictTilts,
  parseObservationsCsv,
  predictedTilt,
  runFit,
  seededRandom,
  solve,
  sweepConditionOf,
  tiltResidual,
  tiltSweep,
  type FitProblem,
  type FitResult,
  type Observation,
  type RandomSource,
  type RowPrediction,
  type TiltSweep,
} from '../solver/index';
import { errorOf, standardPlane } from './fixtures';

// The fit's checks (public/notes.html#fit): a closed-form transition recovered exactly, the
// reported 2-sigma region covering the truth in about 95 % of noisy draws, and phase rows alone
// giving a region rather than a number.

/**
 * The Bohr magneton in meV/T, CODATA 2018 (E. Tiesinga et al., Rev. Mod. Phys. 93, 025010
 * (2021)): 5.7883818060e-5 eV/T.
 */
const MU_B = 5.788381806e-2;
const G = 2;
/** E_Z per tesla of B_perp at zero tilt, meV/T. */
const A = G * MU_B;
const RAD = Math.PI / 180;

/** A contact-model plane (u_perp, u_z) in meV per tesla, at Delta_V = 0. */
function contactPlane(
  n: number,
  x: readonly [number, number],
  y: readonly [number, number],
): Record<string, unknown> {
  return {
    filling: 0,
    channels: {},
    zeeman: 0,
    valleyZeeman: 0,
    plane: standardPlane(n, n, x, y),
  };
}

const HEADER = 'bPerp_T,tilt_deg,valleyZeeman_meV,kind,value,sigma,pair';

function rowsOf(lines: string[]): Observation[] {
  return parseObservationsCsv([HEADER, ...lines].join('\n'));
}

/** Standard normal deviate (Box-Muller). */
function normal(random: RandomSource): number {
  let u = random();
  while (u <= 0) u = random();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * random());
}

describe('the ferromagnet / canted-antiferromagnet transition at E_Z = 4 |u_perp|', () => {
  // Phys. Rev. B 85, 155439 (2012), in the normalisation of public/notes.html#closed-forms: the
  // CAF turns into F where E_Z = g mu_B B_perp / cos(theta_c) reaches 4 |u_perp| B_perp, so
  // u_perp per tesla = -g mu_B / (4 cos theta_c) whatever B_perp.
  test('a transition tilt at several fields gives u_perp to 1e-6, sigma as the linearised formula', async () => {
    const thetaC = 60;
    const sigmas = [0.5, 1, 2];
    const rows = rowsOf([
      `2,,,transition_tilt,${thetaC},${sigmas[0]},CAF/F`,
      `5,,,transition_tilt,${thetaC},${sigmas[1]},CAF/F`,
      `9,,,transition_tilt,${thetaC},${sigmas[2]},`,
      '4,0,,phase,CAF,,',
    ]);
    const plane = parseFitPlane(contactPlane(8, [-0.12, -0.02], [0.15, 0.4]));
    const problem: FitProblem = { plane, rows, options: DEFAULT_FIT_OPTIONS };
    const { fit, grid } = await runFit(problem, localFitRunners, DEFAULT_SWEEP_FIELD);

    const truth = -A / (4 * Math.cos(thetaC * RAD));
    const [x, y] = fit.parameters;
    expect(Math.abs(x!.estimate! - truth)).toBeLessThan(1e-6 * Math.abs(truth));
    expect(x!.method).toBe('curvature');
    // Linearised: d theta / d u = A / (4 u^2 sin theta) (radians per meV/T); rows add as 1/sigma^2.
    const slope = A / (4 * truth ** 2 * Math.sin(thetaC * RAD)) / RAD;
    const information = sigmas.reduce((s, sigma) => s + (slope / sigma) ** 2, 0);
    expect(x!.sigma! / (1 / Math.sqrt(information))).toBeCloseTo(1, 4);
    expect(x!.interval[0]).toBeCloseTo(x!.estimate! - 2 * x!.sigma!, 12);
    expect(x!.interval[1]).toBeCloseTo(x!.estimate! + 2 * x!.sigma!, 12);
    // u_z does not move the transition: not constrained, the CAF row holds on the whole axis.
    expect(y!.sigma).toBeNull();
    expect(y!.estimate).toBeNull();
    expect(y!.interval).toEqual([0.15, 0.4]);
    expect(fit.chi2).toBeLessThan(1e-12);
    expect(fit.dof).toBe(2);
    expect(fit.predictions.map((p) => p.holds)).toEqual([true, true, true, true]);
    // Per pixel, the rows that hold: the CAF row where 4 |u_perp| > g mu_B, each transition row
    // where the closed-form tilt lies within 2 sigma (0 where the sweep starts in F).
    const held = Array.from(grid.x, (u) => {
      const tilt = Math.acos(Math.min(1, A / (4 * Math.abs(u)))) / RAD;
      return (u < -A / 4 ? 1 : 0) + sigmas.filter((s) => Math.abs(tilt - thetaC) <= 2 * s).length;
    });
    for (let j = 0; j < grid.ny; j++) {
      for (let i = 0; i < grid.nx; i++) expect(grid.held[j * grid.nx + i]).toBe(held[i]);
    }
    expect(new Set(held).size).toBeGreaterThan(1);
    // Prediction at another field: the same tilt (Delta_V = 0), with the band of the weighted
    // mean of the rows, 1 / sqrt(sum 1 / sigma^2), since theta_c depends on u_perp alone.
    const predictions = await predictTilts(problem, fit, 12, localFitRunners.rows);
    expect(predictions.map((p) => p.pair?.join('/') ?? null)).toEqual(['CAF/F', null]);
    for (const p of predictions) {
      expect(p.bPerpTesla).toBe(12);
      expect(Math.abs(p.tiltDeg! - thetaC)).toBeLessThan(1e-6);
      expect(p.sigmaDeg! * Math.sqrt(sigmas.reduce((s, v) => s + v ** -2, 0))).toBeCloseTo(1, 3);
    }
  });
});

/**
 * The sweep of the contact model at Delta_V = 0 in closed form (public/notes.html#closed-forms):
 * KD (energy u_perp) gives way to CAF (-u_z - E_Z^2 / (8 |u_perp|)) where E_Z^2 = 8 |u_perp|
 * (|u_perp| - u_z), and CAF to F where E_Z = 4 |u_perp| (u_perp < 0, |u_z| < |u_perp|).
 */
function closedFormSweep(uPerp: number, uZ: number): TiltSweep {
  const kdCaf = Math.sqrt(8 * -uPerp * (-uPerp - uZ));
  const cafF = 4 * -uPerp;
  const transitions: TiltSweep['transitions'][number][] = [];
  let start = 'F';
  if (cafF > A) {
    start = 'CAF';
    transitions.push({
      tiltDeg: Math.acos(A / cafF) / RAD,
      between: ['CAF', 'F'],
      order: 'continuous',
    });
  }
  if (kdCaf > A) {
    start = 'KD';
    transitions.unshift({
      tiltDeg: Math.acos(A / kdCaf) / RAD,
      between: ['KD', 'CAF'],
      order: 'first',
    });
  }
  return { start, end: 'F', transitions };
}

/** The rows' predictions at a point, from a sweep (as the fit judges a transition row). */
function judged(rows: readonly Observation[], sweep: TiltSweep): RowPrediction[] {
  return rows.map((row) => {
    const predicted = predictedTilt(sweep, row.tiltDeg ?? 0, row.pair);
    const residual = tiltResidual(predicted, row.value as number, row.sigma!, row.tiltDeg ?? 0);
    return { predicted, residual, holds: predicted !== null && Math.abs(residual) <= 2 };
  });
}

/** The fit of transition rows with a consistency grid from `sweeps` at the pixel centres. */
async function fitWith(
  problem: FitProblem,
  sweeps: readonly TiltSweep[],
  evaluate: (points: number[][]) => Promise<RowPrediction[][]>,
): Promise<FitResult> {
  const { plane, rows } = problem;
  const axes = parseMapInput(plane.document).plane;
  const [nx, ny] = axes.resolution;
  const x = Float64Array.from({ length: nx }, (_, i) => axisValue(axes.x, nx, i));
  const y = Float64Array.from({ length: ny }, (_, j) => axisValue(axes.y, ny, j));
  const judgedPixels = sweeps.map((s) => judged(rows, s));
  const field = {
    predicted: rows.map((_, r) =>
      Float64Array.from(judgedPixels, (p) =>
        p[r]!.predicted === null ? NaN : (p[r]!.predicted as number),
      ),
    ),
    residual: rows.map((_, r) => Float64Array.from(judgedPixels, (p) => p[r]!.residual!)),
    sweeps: sweeps.length,
    truncated: false,
  };
  const key = conditionKey(sweepConditionOf(parseFitPlane(plane.document), rows[0]!));
  const grid = consistencyGrid(
    problem,
    x,
    y,
    new Map(),
    new Map([[key, { rows: rows.map((_, k) => k), field }]]),
  );
  return fitLikelihood(problem, grid, evaluate);
}

describe('round trip on synthetic samples', () => {
  // An invented sample: KD at zero tilt, CAF from about 30 degrees, F from about 55 degrees.
  const truth = [-0.05, 0.005] as const;
  const sigma = 1;
  const document = contactPlane(8, [-0.08, -0.03], [-0.02, 0.03]);
  const plane = parseFitPlane(document);
  const exact = closedFormSweep(truth[0], truth[1]);
  const draw = (random: RandomSource): Observation[] =>
    rowsOf([
      `3,,,transition_tilt,${exact.transitions[0]!.tiltDeg + sigma * normal(random)},${sigma},KD/CAF`,
      `7,,,transition_tilt,${exact.transitions[1]!.tiltDeg + sigma * normal(random)},${sigma},CAF/F`,
    ]);
  const axes = parseMapInput(plane.document).plane;
  const pixels: [number, number][] = [];
  for (let j = 0; j < 8; j++) {
    for (let i = 0; i < 8; i++) {
      pixels.push([axisValue(axes.x, 8, i), axisValue(axes.y, 8, j)]);
    }
  }
  const closedForm = async (rows: readonly Observation[], points: number[][]) =>
    points.map((p) => judged(rows, closedFormSweep(p[0]!, p[1]!)));
  /** (p - estimate)^T C^-1 (p - estimate) of the truth, for the two constrained couplings. */
  const distance = (fit: FitResult): number => {
    const c = fit.covariance!;
    const d = [truth[0] - fit.point[0]!, truth[1] - fit.point[1]!];
    const det = c[0]![0]! * c[1]![1]! - c[0]![1]! * c[1]![0]!;
    return (d[0]! ** 2 * c[1]![1]! - 2 * d[0]! * d[1]! * c[0]![1]! + d[1]! ** 2 * c[0]![0]!) / det;
  };

  test('the solver\u2019s tilt sweeps follow the closed forms to 1e-6 degrees', () => {
    const random = seededRandom(14);
    for (let k = 0; k < 4; k++) {
      const u = -0.045 - 0.01 * random();
      const z = 0.01 * random();
      const input = parseMapInput({ ...plane.document, zeeman: 0, valleyZeeman: 0 });
      const sweep = tiltSweep(input, u, z, G, 0);
      const expected = closedFormSweep(u, z);
      expect(sweep.start).toBe(expected.start);
      expect(sweep.transitions.map((t) => t.between.join('/'))).toEqual(
        expected.transitions.map((t) => t.between.join('/')),
      );
      sweep.transitions.forEach((t, n) => {
        expect(Math.abs(t.tiltDeg - expected.transitions[n]!.tiltDeg)).toBeLessThan(1e-6);
      });
    }
  });

  test('the 2-sigma region holds the truth in about 95 % of 200 draws', async () => {
    // Rows predicted by the closed forms (which the solver follows, above), so that 200 fits
    // take a moment; the draws below show that the solver's fit gives the same answer.
    const random = seededRandom(2012);
    const sweeps = pixels.map(([u, z]) => closedFormSweep(u, z));
    let covered = 0;
    const draws = 200;
    for (let k = 0; k < draws; k++) {
      const rows = draw(random);
      const problem: FitProblem = { plane, rows, options: DEFAULT_FIT_OPTIONS };
      const fit = await fitWith(problem, sweeps, async (points) => closedForm(rows, points));
      expect(fit.parameters.every((p) => p.sigma !== null)).toBe(true);
      if (distance(fit) <= fit.deltaChi2) covered++;
    }
    expect(chiSquareRise(2)).toBeCloseTo(6.18, 2);
    // Expected 190.9 of 200 (binomial standard deviation 2.9).
    console.log(`fit coverage: ${covered} of ${draws} draws within the 2-sigma region`);
    expect(covered).toBeGreaterThanOrEqual(181);
    expect(covered).toBeLessThanOrEqual(199);
  });

  test('draws fitted through the solver agree with the closed-form fits', async () => {
    const random = seededRandom(155439);
    const sweeps = pixels.map(([u, z]) =>
      tiltSweep(parseMapInput({ ...plane.document, zeeman: 0, valleyZeeman: 0 }), u, z, G, 0),
    );
    for (let k = 0; k < 4; k++) {
      const rows = draw(random);
      const problem: FitProblem = { plane, rows, options: DEFAULT_FIT_OPTIONS };
      const solved = await fitWith(problem, sweeps, async (points) =>
        localFitRunners.rows(problem, points),
      );
      const closed = await fitWith(problem, sweeps, async (points) => closedForm(rows, points));
      solved.parameters.forEach((p, d) => {
        const q = closed.parameters[d]!;
        expect(Math.abs(p.estimate! - q.estimate!)).toBeLessThan(1e-3 * q.sigma!);
        expect(p.sigma! / q.sigma!).toBeCloseTo(1, 3);
      });
    }
  });
});

describe('phase rows alone', () => {
  test('give a region: sigma null, the interval where every row holds', async () => {
    // CAF at zero tilt needs E_Z = g mu_B B_perp < 4 |u_perp| B_perp; F at 60 degrees needs
    // 2 g mu_B > 4 |u_perp|: -g mu_B / 2 < u_perp < -g mu_B / 4 (public/notes.html#closed-forms),
    // any u_z above |u_perp| (no KD).
    const rows = rowsOf([
      '3,0,,phase,CAF,,',
      '3,60,,phase,F,,',
      '6,60,,phase,spin moment along the field,,',
    ]);
    const plane = parseFitPlane(contactPlane(10, [-0.08, 0], [0.1, 0.2]));
    const problem: FitProblem = { plane, rows, options: DEFAULT_FIT_OPTIONS };
    const { fit, grid } = await runFit(problem, localFitRunners, DEFAULT_SWEEP_FIELD);
    const [x, y] = fit.parameters;
    expect(x!.sigma).toBeNull();
    expect(x!.estimate).toBeNull();
    expect(x!.interval[0]).toBeCloseTo(-A / 2, 6);
    expect(x!.interval[1]).toBeCloseTo(-A / 4, 6);
    expect(y!.sigma).toBeNull();
    expect(y!.interval).toEqual([0.1, 0.2]);
    expect(fit.chi2).toBe(0);
    expect(fit.dof).toBe(0);
    expect(fit.predictions.every((p) => p.holds)).toBe(true);
    expect(fit.feasible).toBe(true);
    // Pixels between the two boundaries hold all three rows; the others not.
    for (let i = 0; i < grid.nx; i++) {
      const u = grid.x[i]!;
      expect(grid.held[i] === grid.total).toBe(u > -A / 2 && u < -A / 4);
    }
  });
});

describe('observations the plane cannot reproduce', () => {
  test('two states at one field and tilt: not feasible, and the JSON says so', async () => {
    const rows = rowsOf(['2,0,,phase,CAF,,', '2,0,,phase,F,,']);
    const plane = parseFitPlane(contactPlane(6, [-0.12, -0.02], [0.15, 0.4]));
    const problem: FitProblem = { plane, rows, options: DEFAULT_FIT_OPTIONS };
    const outcome = await runFit(problem, localFitRunners, DEFAULT_SWEEP_FIELD);
    expect(outcome.fit.feasible).toBe(false);
    expect(outcome.fit.predictions.filter((p) => p.holds)).toHaveLength(1);
    const json = fitToJson(problem, outcome) as { feasible: boolean; caution: string };
    expect(json.feasible).toBe(false);
    expect(json.caution).toContain(
      'No point of the grid reproduces every phase row (at most 1 of 2',
    );
  });
});

describe('the plane of a fit', () => {
  test('a scenario saved in physical units is read per tesla of B_perp', () => {
    // The app's scenario holds the model in meV at its B_perp (README, Physical units): the
    // plane of a fit is the same divided by B_perp, whatever its zeeman (E_Z comes from rows).
    const perTesla = parseFitPlane({
      ...contactPlane(8, [-0.12, -0.02], [0.15, 0.4]),
      channels: { zz: { hartree: 0.01, fock: 0.02 } },
      valleyZeeman: 0.3,
    });
    const scenario = parseFitPlane({
      filling: 0,
      channels: { zz: { hartree: 0.05, fock: 0.1 } },
      zeeman: 0.75,
      valleyZeeman: 0.3,
      plane: standardPlane(8, 8, [-0.6, -0.1], [0.75, 2]),
      fourfold: {
        physical: {
          bPerpTesla: 5,
          tiltDeg: 30,
          gFactor: 1.8,
          epsilonR: 4,
          exchangeInGap: false,
          tiltMaxDeg: 80,
        },
      },
    });
    expect(scenario.scaledFromTesla).toBe(5);
    expect(scenario.gFactor).toBe(1.8);
    expect(perTesla.gFactor).toBe(2);
    // Delta_V stays in meV (each row divides it by its own B_perp).
    expect(scenario.valleyZeemanMeV).toBe(0.3);
    const numbers = (doc: Record<string, unknown>) =>
      JSON.stringify(doc, (_, v) => (typeof v === 'number' ? Number(v.toPrecision(12)) : v));
    expect(numbers(scenario.document)).toBe(numbers(perTesla.document));
  });

  test('a grid side above 2048 is refused in one line (a fit holds its Maps whole)', () => {
    const plane = contactPlane(8, [-0.12, -0.02], [0.15, 0.4]);
    const wide = { ...plane, plane: { ...(plane.plane as object), resolution: [2049, 8] } };
    expect(errorOf(() => parseFitPlane(wide))).toBe(
      'plane.resolution[0]: 2049 is more than a fit maps (at most 2048 per side); give the plane a coarser grid',
    );
    const widest = { ...plane, plane: { ...(plane.plane as object), resolution: [2048, 2] } };
    expect(parseFitPlane(widest).input.plane.resolution).toEqual([2048, 2]);
  });
});

describe('rows at one point of the plane', () => {
  test('a phase and a gap row at B_perp are the Map and the gap of the model times B_perp', () => {
    // At (u_perp, u_z) = (-0.1, 0.06) meV/T and 6 T: KD, the Hartree-Fock gap of the model in
    // meV with E_Z = g mu_B 6 T; the gap row is compared, not fitted (fitGaps off).
    const plane = parseFitPlane(contactPlane(8, [-0.2, -0.04], [-0.04, 0.16]));
    const rows = rowsOf(['6,0,,phase,KD,,', '6,0,,phase,no spin moment,,', '6,0,,gap,0.8,0.15,']);
    const problem: FitProblem = { plane, rows, options: DEFAULT_FIT_OPTIONS };
    const [kd, noSpin, gap] = predictRows(problem, [-0.1, 0.06]);
    const model = parseModel({
      filling: 0,
      channels: {
        x0: { hartree: -0.6, fock: -0.6 },
        y0: { hartree: -0.6, fock: -0.6 },
        z0: { hartree: 0.36, fock: 0.36 },
      },
      zeeman: 6 * A,
      valleyZeeman: 0,
    });
    const expected = solve(model);
    expect(expected.phase).toBe('KD');
    expect(kd).toEqual({ predicted: 'KD', residual: null, holds: true });
    expect(noSpin!.holds).toBe(true);
    expect(gap!.predicted as number).toBeCloseTo(expected.gap, 9);
    expect(gap!.residual).toBeCloseTo(((gap!.predicted as number) - 0.8) / 0.15, 12);
    expect(gap!.holds).toBe(false);
  });
});
