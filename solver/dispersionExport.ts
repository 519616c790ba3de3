import { csvComment, csvText } from './csvText';
import { modelToJson, type Model } from './model';
import type { ModeDispersion } from './modeDispersion';
import { MEAN_FIELD_CAUTION, SOFTWARE_VERSION } from './version';

/**
 * What the finite-wavevector modes leave out, beyond the mean-field caution (README, Mean-field
 * cautions; public/notes.html#dispersion).
 */
export const DISPERSION_CAUTION =
  'Time-dependent Hartree-Fock about the uniform state, within the n = 0 level: it leaves out ' +
  'Landau-level mixing, disorder, the finite thickness of the layer, screening other than by the ' +
  'gate chosen, and the decay of the modes. The q dependence of the anisotropic channels is read ' +
  'from their Hartree and Fock couplings (public/notes.html#dispersion).';

/** Where the modes were computed and in which unit, for the exported files. */
export interface DispersionContext {
  readonly model: Model;
  /** The state's phase label. */
  readonly phase: string;
  /** Energy unit: 'meV' in physical units; otherwise the model's own (default). */
  readonly energyUnit?: string;
  /** l_B in nm, in physical units (to convert q to 1/nm). */
  readonly magneticLengthNm?: number;
}

function units(context: DispersionContext) {
  const energy = context.energyUnit ?? 'model unit';
  return {
    q: '1/l_B',
    energy,
    velocity: `${energy} x l_B`,
    stiffness: `${energy} x l_B^2`,
  };
}

/**
 * The `modes` output document (README, Command line; the Probe's JSON export): `q` in 1/l_B,
 * `branches` (one array per branch, ascending at each q), `growth` (|Im omega|, 0 when stable),
 * `rotates`, `gaps`, `goldstone`, `velocities` and `stiffness` (null where they do not apply),
 * the large-q limits, E_X, the unit, the model, the version and the caution.
 */
export function dispersionToJson(
  d: ModeDispersion,
  context: DispersionContext,
): Record<string, unknown> {
  return {
    format: 'fourfold-modes',
    phase: context.phase,
    q: d.q,
    branches: d.branches,
    growth: d.growth,
    rotates: d.rotates,
    gaps: d.gaps,
    goldstone: d.goldstone,
    velocities: d.velocities,
    stiffness: d.stiffness,
    particleHole: d.particleHole,
    exchange: d.exchange,
    coulomb: d.coulomb,
    gateDistance: d.gateDistance,
    stable: d.stable,
    unstableAt: d.unstableAt,
    unit: units(context),
    ...(context.magneticLengthNm !== undefined
      ? { magneticLengthNm: context.magneticLengthNm }
      : {}),
    model: modelToJson(context.model),
    version: SOFTWARE_VERSION,
    caution: `${MEAN_FIELD_CAUTION} ${DISPERSION_CAUTION}`,
  };
}

/** A number or an empty cell (null: does not apply). */
function cell(v: number | null): string {
  return v === null ? '' : String(v);
}

/**
 * One row per wavevector: q (1/l_B), omega of every branch, |Im omega| of every branch and the
 * group each branch's mode rotates; above the header, `#` lines with the cautions, the model,
 * the unit and each branch's gap, Goldstone flag, velocity and stiffness.
 */
export function dispersionToCsv(d: ModeDispersion, context: DispersionContext): string {
  const u = units(context);
  const n = d.branches.length;
  const lines = [
    csvComment(`${MEAN_FIELD_CAUTION} ${DISPERSION_CAUTION}`),
    csvComment(`fourfold ${SOFTWARE_VERSION}; model ${JSON.stringify(modelToJson(context.model))}`),
    csvComment(
      `state ${context.phase}; q in ${u.q}, energies in ${u.energy}; E_X ${d.exchange}; ` +
        `coulomb ${d.coulomb}; gate ${d.gateDistance ?? 'none'}` +
        (context.magneticLengthNm !== undefined ? `; l_B ${context.magneticLengthNm} nm` : '') +
        (d.stable ? '' : `; unstable at q = ${d.unstableAt.join(' ')}`),
    ),
  ];
  for (let b = 0; b < n; b++) {
    lines.push(
      csvComment(
        `branch ${b + 1}: gap ${d.gaps[b]}; ${d.goldstone[b] ? 'Goldstone' : 'gapped'}; ` +
          `velocity ${d.velocities[b] ?? 'n/a'} (${u.velocity}); stiffness ${d.stiffness[b] ?? 'n/a'} (${u.stiffness}); ` +
          `large-q limit ${d.particleHole[b]}`,
      ),
    );
  }
  const header = ['q'];
  for (let b = 1; b <= n; b++) header.push(`omega_${b}`);
  for (let b = 1; b <= n; b++) header.push(`growth_${b}`);
  for (let b = 1; b <= n; b++) header.push(`rotates_${b}`);
  lines.push(header.join(','));
  d.q.forEach((q, k) => {
    const row = [String(q)];
    for (let b = 0; b < n; b++) row.push(cell(d.branches[b]![k]!));
    for (let b = 0; b < n; b++) row.push(cell(d.growth[b]![k]!));
    for (let b = 0; b < n; b++) row.push(csvText(d.rotates[b]![k] ?? ''));
    lines.push(row.join(','));
  });
  return `${lines.join('\n')}\n`;
}
