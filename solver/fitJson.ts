import { TWO_SIGMA_LEVEL } from './chiSquareLevels';
import type { FitOutcome } from './fitRun';
import type { FitParameter } from './likelihoodFit';
import { rowInLikelihood, type FitProblem } from './rowPredictions';
import { MEAN_FIELD_CAUTION, SOFTWARE_VERSION } from './version';

/** What every fit says beside its numbers (public/notes.html#fit). */
export function fitCaution(problem: FitProblem): string {
  const parts = [
    MEAN_FIELD_CAUTION,
    'Couplings are fitted in meV per tesla of B_perp on the assumption that they grow in proportion to B_perp (contact couplings); E_Z = g mu_B B_perp / cos(tilt).',
  ];
  if (problem.rows.some((row) => row.kind === 'gap')) {
    parts.push(
      problem.options.fitGaps
        ? 'Gap rows are in the fit although the Hartree-Fock gap is an upper estimate of an activation gap.'
        : 'Gap rows are compared but not fitted: the Hartree-Fock gap is an upper estimate of an activation gap.',
    );
  }
  if (problem.plane.rangeChannels.length > 0) {
    parts.push(
      `Channels from an interaction range (${problem.plane.rangeChannels.join(', ')}) are taken at the file's B_perp; their Hartree-to-Fock ratio changes with the field.`,
    );
  }
  return parts.join(' ');
}

/** What a fit says when no pixel of its grid reproduces every phase row. */
function infeasibleCaution(grid: FitOutcome['grid']): string {
  let most = 0;
  for (const h of grid.phaseHeld) most = Math.max(most, h);
  return `No point of the grid reproduces every phase row (at most ${most} of ${grid.phaseTotal} hold): the estimate and the intervals are where the most hold, and the observations may not fit this plane or this model.`;
}

function parameterJson(p: FitParameter) {
  return {
    label: p.label,
    estimate: p.estimate,
    sigma: p.sigma,
    interval: [p.interval[0], p.interval[1]],
    method: p.method,
  };
}

/**
 * The fit as the command line writes it (README, Command line): parameters x and y (and the
 * freed Hartree ratio), chi^2 and its degrees of freedom, the 2-sigma region, the consistency
 * grid (`consistent[j][i]` where every row in the grid holds, `rows[j][i]` how many hold), each
 * observation with what the model predicts at the estimate, and the caution.
 */
export function fitToJson(problem: FitProblem, outcome: FitOutcome): Record<string, unknown> {
  const { grid, fit } = outcome;
  const { nx, ny } = grid;
  const consistent: boolean[][] = [];
  const rows: number[][] = [];
  for (let j = 0; j < ny; j++) {
    const c: boolean[] = [];
    const r: number[] = [];
    for (let i = 0; i < nx; i++) {
      const held = grid.held[j * nx + i]!;
      c.push(held === grid.total);
      r.push(held);
    }
    consistent.push(c);
    rows.push(r);
  }
  const [x, y, ratio] = fit.parameters;
  return {
    version: SOFTWARE_VERSION,
    units: 'couplings in meV per tesla of B_perp; tilts in degrees; gaps in meV',
    parameters: {
      x: parameterJson(x!),
      y: parameterJson(y!),
      ...(ratio !== undefined ? { hartreeRatio: parameterJson(ratio) } : {}),
    },
    chi2: fit.chi2,
    dof: fit.dof,
    region: {
      level: TWO_SIGMA_LEVEL,
      deltaChi2: fit.deltaChi2,
      covariance: fit.covariance,
    },
    at: {
      x: fit.point[0],
      y: fit.point[1],
      ...(ratio !== undefined ? { hartreeRatio: fit.point[2] } : {}),
    },
    grid: {
      x: Array.from(grid.x),
      y: Array.from(grid.y),
      total: grid.total,
      consistent,
      rows,
    },
    observations: problem.rows.map((row, k) => {
      const p = fit.predictions[k]!;
      return {
        row: k + 1,
        kind: row.kind,
        observed: row.value,
        predicted: p.predicted,
        residual: p.residual,
        holds: p.holds,
        inFit: rowInLikelihood(row, problem.options),
      };
    }),
    feasible: fit.feasible,
    work: {
      maps: outcome.maps,
      sweeps: outcome.sweeps,
      evaluations: fit.evaluations,
      ...(outcome.truncated ? { truncated: true } : {}),
    },
    caution: [fitCaution(problem), ...(fit.feasible ? [] : [infeasibleCaution(grid)])].join(' '),
  };
}
