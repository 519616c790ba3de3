import {
  CHANNELS,
  ModelError,
  isPlainObject,
  observationSetOfDocument,
  observationSetToJson,
  parseMapInput,
  type Channel,
  type MapInput,
} from '../../solver/index';
import { physicalScales } from './physical';
import { physicalFromScenario, physicalToScenario } from './physicalScenario';
import { zeroChannels, type AxisQuantity, type AxisSetup, type Setup } from './setup';

/** The scenario document: the CLI's model file with its plane (what `map` reads). */
export type ScenarioJson = Record<string, unknown>;

/** Axis label written into the plane (model-file style), per quantity. */
export const AXIS_LABELS: Readonly<Record<Exclude<AxisQuantity, 'custom'>, string>> = {
  uPerp: 'u_perp',
  uZ: 'u_z',
  zeeman: 'E_Z',
  valleyZeeman: 'Delta_V',
  ...(Object.fromEntries(CHANNELS.map((ch) => [ch, `u_${ch}`])) as Record<Channel, string>),
};

/** Targets that an axis sets per unit of its value (the model file's plane). */
export function axisTargets(axis: AxisSetup, setup: Pick<Setup, 'ratios'>): Record<string, number> {
  switch (axis.quantity) {
    case 'uPerp': {
      const r = setup.ratios.uPerp;
      return { 'x0.fock': 1, 'y0.fock': 1, 'x0.hartree': r, 'y0.hartree': r };
    }
    case 'uZ':
      return { 'z0.fock': 1, 'z0.hartree': setup.ratios.uZ };
    case 'zeeman':
      return { zeeman: 1 };
    case 'valleyZeeman':
      return { valleyZeeman: 1 };
    case 'custom':
      return { ...(axis.targets ?? {}) };
    default:
      return { [`${axis.quantity}.fock`]: 1, [`${axis.quantity}.hartree`]: axis.hartreeRatio };
  }
}

export function axisLabel(axis: AxisSetup): string {
  return axis.quantity === 'custom' ? (axis.label ?? '') : AXIS_LABELS[axis.quantity];
}

function round(v: number): number {
  return Number(v.toPrecision(12));
}

/** Whether the scenario lists a channel in `channels`: nonzero, or listed as zero. */
export function isListed(setup: Pick<Setup, 'channels' | 'listedZero'>, ch: Channel): boolean {
  const c = setup.channels[ch];
  return c.hartree !== 0 || c.fock !== 0 || (setup.listedZero ?? []).includes(ch);
}

/** An axis of the plane as a scenario document holds it (the model file's `plane`). */
type PlaneAxis = {
  readonly label: string;
  readonly from: number;
  readonly to: number;
  readonly targets: Readonly<Record<string, number>>;
};

/** The plane axis a setup's axis writes (the model file's `plane`): label, range and targets. */
export function planeAxis(axis: AxisSetup, setup: Pick<Setup, 'ratios'>): PlaneAxis {
  const targets: Record<string, number> = {};
  for (const [k, v] of Object.entries(axisTargets(axis, setup))) {
    // A custom axis keeps the file's coefficients exactly; ours are rounded off float noise.
    targets[k] = axis.quantity === 'custom' ? v : round(v);
  }
  return { label: axisLabel(axis), from: axis.from, to: axis.to, targets };
}

/**
 * The E_X the scenario writes: from the field in physical units (when the gap includes it),
 * else the setup's own.
 */
function exchangeOf(setup: Setup): number | undefined {
  if (setup.physical) {
    return setup.physical.exchangeInGap ? physicalScales(setup.physical).exchangeMeV : undefined;
  }
  return setup.exchange;
}

/**
 * The Coulomb scale the scenario writes (the model's `coulomb`): from the field and eps_r in
 * physical units, else the setup's own (none until the user gives one).
 */
export function coulombOf(setup: Setup): number | undefined {
  return setup.physical ? physicalScales(setup.physical).coulombMeV : setup.coulomb;
}

/** The scenario document of a setup (model with every listed channel, plus the plane). */
export function setupToScenario(setup: Setup): ScenarioJson {
  const channels: Record<string, { hartree: number; fock: number }> = {};
  for (const ch of CHANNELS) {
    const c = setup.channels[ch];
    if (isListed(setup, ch)) channels[ch] = { hartree: c.hartree, fock: c.fock };
  }
  const document: ScenarioJson = {
    ...(setup.name !== undefined ? { name: setup.name } : {}),
    ...(setup.description !== undefined ? { description: setup.description } : {}),
    filling: setup.filling,
    channels,
    zeeman: setup.zeeman,
    valleyZeeman: setup.valleyZeeman,
  };
  const oneBody = setup.oneBody ?? {};
  if (Object.keys(oneBody).length > 0) {
    document.oneBody = Object.fromEntries(
      CHANNELS.filter((ch) => oneBody[ch] !== undefined).map((ch) => [ch, oneBody[ch]]),
    );
  }
  const exchange = exchangeOf(setup);
  if (exchange !== undefined) document.exchange = exchange;
  const coulomb = coulombOf(setup);
  if (coulomb !== undefined) document.coulomb = coulomb;
  document.plane = {
    x: planeAxis(setup.x, setup),
    y: planeAxis(setup.y, setup),
    resolution: [...setup.resolution],
  };
  const extra = physicalToScenario(setup);
  if (setup.observations !== undefined) {
    const fourfold = isPlainObject(extra.fourfold) ? extra.fourfold : {};
    extra.fourfold = { ...fourfold, observations: observationSetToJson(setup.observations) };
  }
  return { ...document, ...extra };
}

/** The validated solver input of a setup; throws ModelError naming the bad field. */
export function setupToMapInput(setup: Setup): MapInput {
  return parseMapInput(setupToScenario(setup));
}

function sameAxis(a: PlaneAxis, b: PlaneAxis): boolean {
  const ka = Object.keys(a.targets);
  return (
    a.label === b.label &&
    a.from === b.from &&
    a.to === b.to &&
    ka.length === Object.keys(b.targets).length &&
    ka.every((k) => a.targets[k] === b.targets[k])
  );
}

/**
 * Recognises a plane axis as one of our quantities when that quantity writes back exactly the
 * same axis (label, range, targets and coefficients), with its Hartree ratio; any other axis
 * is kept as a custom axis with its own label and targets.
 */
function axisFromPlane(
  axis: PlaneAxis,
  ratios: { uPerp: number; uZ: number },
  other: AxisQuantity | null = null,
): { axis: AxisSetup; ratios: { uPerp: number; uZ: number } } {
  const t = axis.targets;
  const base = { from: axis.from, to: axis.to, hartreeRatio: 1 };
  const fockKey = Object.keys(t).find((k) => k.endsWith('.fock'));
  const channel = fockKey?.split('.')[0] as Channel | undefined;
  const candidates: { axis: AxisSetup; ratios: { uPerp: number; uZ: number } }[] = [
    { axis: { ...base, quantity: 'zeeman' }, ratios },
    { axis: { ...base, quantity: 'valleyZeeman' }, ratios },
    { axis: { ...base, quantity: 'uPerp' }, ratios: { ...ratios, uPerp: t['x0.hartree'] ?? 0 } },
    { axis: { ...base, quantity: 'uZ' }, ratios: { ...ratios, uZ: t['z0.hartree'] ?? 0 } },
  ];
  if (channel !== undefined) {
    const hartreeRatio = t[`${channel}.hartree`] ?? 0;
    candidates.push({ axis: { ...base, quantity: channel, hartreeRatio }, ratios });
  }
  for (const candidate of candidates) {
    // u_perp and u_z keep one Hartree ratio each: the other axis cannot be the same one.
    if (candidate.axis.quantity === other) continue;
    if (sameAxis(planeAxis(candidate.axis, { ratios: candidate.ratios }), axis)) return candidate;
  }
  return {
    axis: { ...base, quantity: 'custom', label: axis.label, targets: { ...t } },
    ratios,
  };
}

/**
 * Where two solver inputs differ, as `field: a, b` (null when they are the same). Fields in
 * `skip` (values the physical units derive and `physicalFromScenario` has checked) are left out.
 */
function firstDifference(a: MapInput, b: MapInput, skip: ReadonlySet<string>): string | null {
  const differ = (field: string, x: unknown, y: unknown): string | null =>
    skip.has(field) || x === y ? null : `${field}: ${String(x)} in the file, ${String(y)} here`;
  const checks: (string | null)[] = [
    differ('filling', a.model.filling, b.model.filling),
    differ('zeeman', a.model.zeeman, b.model.zeeman),
    differ('valleyZeeman', a.model.valleyZeeman, b.model.valleyZeeman),
    differ('exchange', a.model.exchange, b.model.exchange),
    differ('coulomb', a.model.coulomb, b.model.coulomb),
  ];
  for (const ch of CHANNELS) {
    const ca = a.model.channels[ch];
    const cb = b.model.channels[ch];
    checks.push(
      differ(`channels.${ch}`, ca === undefined, cb === undefined),
      differ(`channels.${ch}.hartree`, ca?.hartree, cb?.hartree),
      differ(`channels.${ch}.fock`, ca?.fock, cb?.fock),
      differ(`oneBody.${ch}`, a.model.oneBody[ch], b.model.oneBody[ch]),
    );
  }
  for (const which of ['x', 'y'] as const) {
    const pa = a.plane[which];
    const pb = b.plane[which];
    checks.push(
      differ(`plane.${which}.label`, pa.label, pb.label),
      differ(`plane.${which}.from`, pa.from, pb.from),
      differ(`plane.${which}.to`, pa.to, pb.to),
    );
    for (const k of new Set([...Object.keys(pa.targets), ...Object.keys(pb.targets)])) {
      checks.push(differ(`plane.${which}.targets.${k}`, pa.targets[k], pb.targets[k]));
    }
  }
  checks.push(
    differ('plane.resolution[0]', a.plane.resolution[0], b.plane.resolution[0]),
    differ('plane.resolution[1]', a.plane.resolution[1], b.plane.resolution[1]),
  );
  return checks.find((c) => c !== null) ?? null;
}

function optionalText(json: Record<string, unknown>, field: 'name' | 'description') {
  const value = json[field];
  if (value === undefined) return {};
  if (typeof value !== 'string') throw new ModelError(`${field}: expected a string`);
  return { [field]: value };
}

/**
 * A setup from a scenario document (a model file with a plane). Validates it fully first and
 * throws ModelError with a one-line message naming the field; returns nothing partial. The
 * setup writes back the same model and plane (`setupToScenario`); a document it could not hold
 * as it is would be refused, naming the field, rather than changed.
 */
export function scenarioToSetup(json: unknown): Setup {
  if (!isPlainObject(json)) throw new ModelError('scenario: expected a JSON object');
  if (json.plane === undefined) throw new ModelError('plane: missing (a scenario needs a plane)');
  const input = parseMapInput(json);
  const { model, plane } = input;
  const channels = zeroChannels();
  const listedZero: Channel[] = [];
  for (const ch of CHANNELS) {
    const c = model.channels[ch];
    if (!c) continue;
    channels[ch] = { hartree: c.hartree, fock: c.fock };
    if (c.hartree === 0 && c.fock === 0) listedZero.push(ch);
  }
  const ratio = (c: { hartree: number; fock: number }) => (c.fock !== 0 ? c.hartree / c.fock : 1);
  let ratios = { uPerp: ratio(channels.x0), uZ: ratio(channels.z0) };
  const x = axisFromPlane(plane.x, ratios);
  ratios = x.ratios;
  const y = axisFromPlane(plane.y, ratios, x.axis.quantity);
  ratios = y.ratios;
  const physical = isPlainObject(json.fourfold) && json.fourfold.physical !== undefined;
  const setup: Setup = {
    ...optionalText(json, 'name'),
    ...optionalText(json, 'description'),
    filling: model.filling,
    channels,
    zeeman: model.zeeman,
    valleyZeeman: model.valleyZeeman,
    ratios,
    x: x.axis,
    y: y.axis,
    resolution: [plane.resolution[0], plane.resolution[1]],
    ...(listedZero.length > 0 ? { listedZero } : {}),
    ...(Object.keys(model.oneBody).length > 0 ? { oneBody: { ...model.oneBody } } : {}),
    ...(model.exchange !== undefined && !physical ? { exchange: model.exchange } : {}),
    ...(model.coulomb !== undefined && !physical ? { coulomb: model.coulomb } : {}),
  };
  const observations = observationSetOfDocument(json, 'scenario');
  const out = {
    ...physicalFromScenario(json, setup, model.exchange),
    ...(observations !== null ? { observations } : {}),
  };
  // What the physical units derive (checked against the file there) is not compared again.
  const skip = new Set<string>();
  if (out.physical) {
    skip.add('zeeman').add('exchange').add('coulomb');
    // In physical units the Coulomb scale follows from the field; a file may leave it out.
    const expected = physicalScales(out.physical).coulombMeV;
    const given = model.coulomb;
    if (given !== undefined && Math.abs(given - expected) > 1e-9 * Math.max(1, expected)) {
      throw new ModelError(
        `coulomb: ${given} disagrees with e^2/(4 pi eps0 eps_r l_B) = ${expected} meV from fourfold.physical; edit one of them, or remove it from "fourfold"`,
      );
    }
  }
  for (const ch of Object.keys(out.ranges ?? {})) {
    skip.add(`channels.${ch}.hartree`).add(`channels.${ch}.fock`);
  }
  const difference = firstDifference(input, setupToMapInput(out), skip);
  if (difference !== null) {
    throw new ModelError(`${difference}; the app cannot hold this scenario as it is`);
  }
  return out;
}
