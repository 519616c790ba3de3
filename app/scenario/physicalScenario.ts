import {
  CHANNELS,
  ModelError,
  channelIndex,
  fieldKey,
  isPlainObject,
  type Channel,
} from '../../solver/index';
import {
  DEFAULT_PHYSICAL,
  derivedSetup,
  physicalProblem,
  physicalScales,
  rangeProblem,
} from './physical';
import type { PhysicalSetup, RangeSetup, Setup } from './setup';

/**
 * The scenario document's extra fields for physical units and interaction ranges. The model
 * itself stays the CLI's model file in meV (what `npm run map` solves); the sample's units
 * and ranges ride along in the accepted `fourfold` field (E_X, when the gap includes it, is the
 * model's `exchange`, written by `setupToScenario`).
 *
 *   "exchange": 12.3,                       (only when the gap includes E_X)
 *   "fourfold": {
 *     "physical": { "bPerpTesla": 10, "tiltDeg": 30, "gFactor": 2, "epsilonR": 4,
 *                   "exchangeInGap": true, "tiltMaxDeg": 80 },
 *     "ranges": { "x0": { "profile": "screened", "strength": -0.1, "range": 5 } }
 *   }
 */
export function physicalToScenario(setup: Setup): Record<string, unknown> {
  const extra: Record<string, unknown> = {};
  const fourfold: Record<string, unknown> = {};
  if (setup.physical) fourfold.physical = { ...setup.physical };
  if (setup.ranges && Object.keys(setup.ranges).length > 0) {
    const ranges: Record<string, RangeSetup> = {};
    for (const ch of CHANNELS) {
      const r = setup.ranges[ch];
      if (r) ranges[ch] = { ...r };
    }
    fourfold.ranges = ranges;
  }
  if (Object.keys(fourfold).length > 0) extra.fourfold = fourfold;
  return extra;
}

function parsePhysical(raw: unknown): PhysicalSetup {
  const field = 'fourfold.physical';
  if (!isPlainObject(raw)) throw new ModelError(`${field}: expected an object`);
  for (const key of Object.keys(raw)) {
    if (!(key in DEFAULT_PHYSICAL)) {
      throw new ModelError(
        `${field}.${fieldKey(key)}: unknown field; physical units have ${Object.keys(DEFAULT_PHYSICAL).join(', ')}`,
      );
    }
  }
  const physical = { ...DEFAULT_PHYSICAL, ...raw } as PhysicalSetup;
  const problem = physicalProblem(physical, field);
  if (problem !== null) throw new ModelError(problem);
  return physical;
}

function parseRanges(raw: unknown): Partial<Record<Channel, RangeSetup>> {
  const field = 'fourfold.ranges';
  if (!isPlainObject(raw)) throw new ModelError(`${field}: expected an object of channels`);
  const out: Partial<Record<Channel, RangeSetup>> = {};
  for (const [ch, value] of Object.entries(raw)) {
    if (channelIndex(ch) < 0) throw new ModelError(`${field}.${fieldKey(ch)}: unknown channel`);
    if (!isPlainObject(value)) {
      throw new ModelError(`${field}.${ch}: expected { "profile", "strength", "range" }`);
    }
    for (const key of Object.keys(value)) {
      if (key !== 'profile' && key !== 'strength' && key !== 'range')
        throw new ModelError(`${field}.${ch}.${fieldKey(key)}: unknown field`);
    }
    const range = { profile: value.profile, strength: value.strength, range: value.range };
    const problem = rangeProblem(range as RangeSetup, `${field}.${ch}`);
    if (problem !== null) throw new ModelError(problem);
    out[ch as Channel] = range as RangeSetup;
  }
  return out;
}

function agrees(a: number, b: number): boolean {
  return Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a), Math.abs(b));
}

const EDIT_ONE = 'edit one of them, or remove it from "fourfold"';

/**
 * The setup with the physical units and ranges of a scenario document. Values the document's
 * model holds that these determine (E_Z, E_X, range channels) must agree with them; a file
 * edited by hand so that they do not is refused with a line naming the field, since either
 * could be the one meant.
 */
export function physicalFromScenario(
  json: Record<string, unknown>,
  setup: Setup,
  exchange: number | undefined,
): Setup {
  const extra = json.fourfold;
  if (!isPlainObject(extra)) return setup;
  const physical = extra.physical === undefined ? undefined : parsePhysical(extra.physical);
  const ranges = extra.ranges === undefined ? undefined : parseRanges(extra.ranges);
  if (!physical && !ranges) return setup;
  const out = derivedSetup({
    ...setup,
    ...(physical ? { physical } : {}),
    ...(ranges ? { ranges } : {}),
  });
  if (physical) {
    if (!agrees(out.zeeman, setup.zeeman)) {
      throw new ModelError(
        `zeeman: ${setup.zeeman} disagrees with g mu_B B_perp / cos(tilt) = ${out.zeeman} meV from fourfold.physical; ${EDIT_ONE}`,
      );
    }
    const expected = physicalScales(physical).exchangeMeV;
    if (physical.exchangeInGap && (exchange === undefined || !agrees(exchange, expected))) {
      throw new ModelError(
        `exchange: expected E_X = ${expected} meV from fourfold.physical (exchangeInGap), got ${exchange ?? 'none'}; ${EDIT_ONE}`,
      );
    }
    if (!physical.exchangeInGap && exchange !== undefined) {
      throw new ModelError(
        `exchange: ${exchange} while fourfold.physical.exchangeInGap is false; ${EDIT_ONE}`,
      );
    }
  }
  for (const ch of CHANNELS) {
    if (!ranges?.[ch]) continue;
    const mine = out.channels[ch];
    const theirs = setup.channels[ch];
    if (!agrees(mine.hartree, theirs.hartree) || !agrees(mine.fock, theirs.fock)) {
      throw new ModelError(
        `channels.${ch}: hartree ${theirs.hartree}, fock ${theirs.fock} disagree with fourfold.ranges.${ch} (hartree ${mine.hartree}, fock ${mine.fock}); ${EDIT_ONE}`,
      );
    }
  }
  return out;
}
