import {
  CHANNELS,
  RANGE_PROFILES,
  coulombScaleMeV,
  exchangeEnergyMeV,
  landauLevelMeV,
  landauLevelMixing,
  magneticLength,
  rangeCouplings,
  zeemanEnergyMeV,
  type Channel,
} from '../../solver/index';
import type { ChannelSetup, PhysicalSetup, RangeSetup, Setup } from './setup';

/** Fermi velocity of graphene for the Landau-level scale, m/s (public/notes.html#units). */
export const FERMI_VELOCITY = 1.0e6;

/**
 * Landau-level mixing ratio at or above which the panel cautions that mixing is not small
 * (common practice: mean-field results within one level are trusted for ratios well below 1).
 */
export const MIXING_CAUTION = 0.3;

/** Physical units a new physical setup starts from (an invented sample of our own). */
export const DEFAULT_PHYSICAL: PhysicalSetup = {
  bPerpTesla: 10,
  tiltDeg: 0,
  gFactor: 2,
  epsilonR: 4,
  exchangeInGap: false,
  tiltMaxDeg: 80,
};

/** Bounds of each physical entry, with the message beside the field when broken. */
export const PHYSICAL_RULES = {
  bPerpTesla: {
    min: 0.01,
    max: 100,
    tooSmall: 'a positive field of at least 0.01 T',
    tooLarge: 'at most 100 T',
  },
  tiltDeg: {
    min: 0,
    max: 89.9,
    tooSmall: 'at least 0°',
    tooLarge: 'below 90° (at 90° no perpendicular field is left)',
  },
  tiltMaxDeg: {
    min: 0,
    max: 89.9,
    tooSmall: 'at least 0°',
    tooLarge: 'below 90° (at 90° no perpendicular field is left)',
  },
  gFactor: { min: 0, max: 10 },
  epsilonR: { min: 1, max: 100, tooSmall: 'at least 1 (vacuum)' },
} as const;

/** Bounds of a range entry: in units of l_B (dimensionless) or nm (physical). */
export const RANGE_RULE = { min: 0, max: 1000, tooSmall: 'a range is not negative' } as const;

/** Derived scales of a physical setup, shown live in the Setup (public/notes.html#units). */
export interface PhysicalScales {
  /** E_Z = g mu_B B_perp / cos(tilt), meV. */
  readonly zeemanMeV: number;
  /** E_Z at zero tilt, meV. */
  readonly zeemanPerpMeV: number;
  readonly magneticLengthNm: number;
  /** e^2 / (4 pi eps0 eps_r l_B), meV. */
  readonly coulombMeV: number;
  /** E_X = sqrt(pi/2) e^2 / (4 pi eps0 eps_r l_B), meV. */
  readonly exchangeMeV: number;
  /** E_1 = sqrt(2) hbar v_F / l_B, meV, v_F = FERMI_VELOCITY. */
  readonly landauLevelMeV: number;
  /** (e^2 / 4 pi eps0 eps_r l_B) / (hbar v_F / l_B). */
  readonly mixing: number;
}

const DEG = Math.PI / 180;

export function physicalScales(p: PhysicalSetup): PhysicalScales {
  return {
    zeemanMeV: zeemanEnergyMeV(p.bPerpTesla, p.tiltDeg * DEG, p.gFactor),
    zeemanPerpMeV: zeemanEnergyMeV(p.bPerpTesla, 0, p.gFactor),
    magneticLengthNm: magneticLength(p.bPerpTesla) * 1e9,
    coulombMeV: coulombScaleMeV(p.bPerpTesla, p.epsilonR),
    exchangeMeV: exchangeEnergyMeV(p.bPerpTesla, p.epsilonR),
    landauLevelMeV: landauLevelMeV(1, p.bPerpTesla, FERMI_VELOCITY),
    mixing: landauLevelMixing(p.epsilonR, FERMI_VELOCITY),
  };
}

/** E_Z in meV at another tilt, same B_perp and g (for tilt sweeps: E_Z(0) / cos(tilt)). */
export function zeemanAtTilt(p: PhysicalSetup, tiltDeg: number): number {
  return zeemanEnergyMeV(p.bPerpTesla, tiltDeg * DEG, p.gFactor);
}

/** Units of the couplings as typed: B_perp (meV per meV/T) in physical units, else 1. */
export function couplingScale(setup: Pick<Setup, 'physical'>): number {
  return setup.physical?.bPerpTesla ?? 1;
}

/**
 * H and F of a range channel in the solver's unit (meV in physical units): H = strength *
 * scale, F = H * (F/H)(a / l_B), F/H by the quadrature of public/notes.html#interaction-range.
 */
export function rangeChannel(range: RangeSetup, physical: PhysicalSetup | undefined): ChannelSetup {
  const hartree = range.strength * couplingScale({ physical });
  const aOverL = physical ? range.range / (magneticLength(physical.bPerpTesla) * 1e9) : range.range;
  // v(0) = 2 pi H in units of l_B makes rangeCouplings' Hartree part equal to H.
  const { fock } = rangeCouplings(range.profile, 2 * Math.PI * hartree, aOverL);
  return { hartree, fock };
}

/** F / H of a range at field `bPerpTesla` (physical: range in nm) or for a in l_B. */
export function rangeFockRatio(range: RangeSetup, bPerpTesla: number | null): number {
  const aOverL =
    bPerpTesla === null ? range.range : range.range / (magneticLength(bPerpTesla) * 1e9);
  return rangeCouplings(range.profile, 2 * Math.PI, aOverL).fock;
}

/**
 * Relative difference below which a setup's E_Z counts as the one its field gives: a few units
 * of rounding of E_Z = g mu_B B_perp / cos(tilt), B_perp = E_Z / (g mu_B) in double precision.
 */
const ZEEMAN_ROUNDING = 8 * Number.EPSILON;

/** The common couplings a range on their first channel sets (both channels of uPerp). */
const COMMON_FIRST: Readonly<Record<'uPerp' | 'uZ', Channel>> = { uPerp: 'x0', uZ: 'z0' };

/**
 * The setup with every derived value brought in step: E_Z from B_perp, tilt and g (physical),
 * range channels from their ranges, and a common coupling's Hartree/Fock ratio from its range.
 */
export function derivedSetup(setup: Setup): Setup {
  let out = setup;
  if (setup.physical) {
    // An E_Z that equals the field's to rounding (the one kept on switching units, or read
    // back from a file) stays as it is, so that it does not move in the last digits.
    const zeeman = physicalScales(setup.physical).zeemanMeV;
    const same = Math.abs(zeeman - setup.zeeman) <= ZEEMAN_ROUNDING * Math.abs(zeeman);
    if (!same) out = { ...out, zeeman };
  }
  const ranges = setup.ranges;
  if (ranges && Object.keys(ranges).length > 0) {
    const channels = { ...out.channels };
    for (const ch of CHANNELS) {
      const range = ranges[ch];
      if (range) channels[ch] = rangeChannel(range, setup.physical);
    }
    const ratios = { ...out.ratios };
    for (const which of ['uPerp', 'uZ'] as const) {
      const c = channels[COMMON_FIRST[which]];
      if (ranges[COMMON_FIRST[which]] && c.fock !== 0) ratios[which] = c.hartree / c.fock;
    }
    out = { ...out, channels, ratios };
  }
  return out;
}

/**
 * A new physical block: typed couplings keep their meV/T values, so they are rescaled by the
 * change of B_perp; derived values follow.
 */
export function withPhysical(setup: Setup, physical: PhysicalSetup): Setup {
  const before = couplingScale(setup);
  const factor = physical.bPerpTesla / before;
  const channels = { ...setup.channels };
  if (factor !== 1) {
    for (const ch of CHANNELS) {
      const c = channels[ch];
      channels[ch] = { hartree: c.hartree * factor, fock: c.fock * factor };
    }
  }
  return derivedSetup({ ...setup, channels, physical });
}

/**
 * Switches to physical units keeping the Map: the dimensionless energies are read as meV, and
 * B_perp is chosen so that E_Z at zero tilt is exactly the current E_Z (the field shows it
 * rounded; the stored value is not); ranges keep their H and F (a in l_B becomes nm at that
 * field). A dimensionless E_X in the gap stays in the gap, now from the field.
 */
export function toPhysicalUnits(setup: Setup): Setup {
  if (setup.physical) return setup;
  const perTesla = zeemanEnergyMeV(1, 0, DEFAULT_PHYSICAL.gFactor);
  const b = setup.zeeman > 0 ? setup.zeeman / perTesla : DEFAULT_PHYSICAL.bPerpTesla;
  const { min, max } = PHYSICAL_RULES.bPerpTesla;
  const physical = {
    ...DEFAULT_PHYSICAL,
    bPerpTesla: Math.min(max, Math.max(min, b)),
    exchangeInGap: setup.exchange !== undefined,
  };
  const lNm = magneticLength(physical.bPerpTesla) * 1e9;
  const ranges = mapRanges(setup.ranges, (r) => ({
    ...r,
    strength: r.strength / physical.bPerpTesla,
    range: r.range * lNm,
  }));
  const rest: Setup = { ...setup };
  delete (rest as { exchange?: number }).exchange;
  return derivedSetup({ ...rest, physical, ...(ranges ? { ranges } : {}) });
}

/**
 * Back to dimensionless units: the meV values become the dimensionless numbers, unchanged (E_X
 * in the gap too).
 */
export function toDimensionlessUnits(setup: Setup): Setup {
  const physical = setup.physical;
  if (!physical) return setup;
  const lNm = magneticLength(physical.bPerpTesla) * 1e9;
  const ranges = mapRanges(setup.ranges, (r) => ({
    ...r,
    strength: r.strength * physical.bPerpTesla,
    range: r.range / lNm,
  }));
  const rest: Setup = { ...setup };
  delete (rest as { physical?: PhysicalSetup }).physical;
  delete (rest as { ranges?: Setup['ranges'] }).ranges;
  const exchange = physical.exchangeInGap ? physicalScales(physical).exchangeMeV : undefined;
  return derivedSetup({
    ...rest,
    ...(ranges ? { ranges } : {}),
    ...(exchange !== undefined ? { exchange } : {}),
  });
}

function mapRanges(
  ranges: Setup['ranges'],
  f: (r: RangeSetup) => RangeSetup,
): Setup['ranges'] | undefined {
  if (!ranges) return undefined;
  const out: Partial<Record<Channel, RangeSetup>> = {};
  for (const ch of CHANNELS) {
    const r = ranges[ch];
    if (r) out[ch] = f(r);
  }
  return out;
}

/** Why a physical block or range is not acceptable (one line naming the field), or null. */
export function physicalProblem(p: PhysicalSetup, field = 'physical'): string | null {
  for (const key of Object.keys(PHYSICAL_RULES) as (keyof typeof PHYSICAL_RULES)[]) {
    const rule: { min: number; max: number; tooSmall?: string; tooLarge?: string } =
      PHYSICAL_RULES[key];
    const v = p[key];
    if (typeof v !== 'number' || !Number.isFinite(v))
      return `${field}.${key}: expected a finite number`;
    if (v < rule.min) return `${field}.${key}: ${rule.tooSmall ?? `at least ${rule.min}`}`;
    if (v > rule.max) return `${field}.${key}: ${rule.tooLarge ?? `at most ${rule.max}`}`;
  }
  if (typeof p.exchangeInGap !== 'boolean') return `${field}.exchangeInGap: expected true or false`;
  return null;
}

export function rangeProblem(r: RangeSetup, field: string): string | null {
  if (!RANGE_PROFILES.includes(r.profile))
    return `${field}.profile: expected one of ${RANGE_PROFILES.join(', ')}`;
  for (const key of ['strength', 'range'] as const) {
    if (typeof r[key] !== 'number' || !Number.isFinite(r[key]))
      return `${field}.${key}: expected a finite number`;
  }
  if (r.range < RANGE_RULE.min) return `${field}.range: ${RANGE_RULE.tooSmall}`;
  if (r.range > RANGE_RULE.max) return `${field}.range: at most ${RANGE_RULE.max}`;
  return null;
}
