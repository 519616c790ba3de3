import {
  CHANNELS,
  type Channel,
  type Filling,
  type ObservationSet,
  type RangeProfile,
} from '../../solver/index';

/** Quantities an axis of the Map can sweep (the targets they set are in `scenario.ts`). */
export type AxisQuantity = 'uPerp' | 'uZ' | 'zeeman' | 'valleyZeeman' | Channel | 'custom';

export interface AxisSetup {
  readonly quantity: AxisQuantity;
  readonly from: number;
  readonly to: number;
  /**
   * Hartree coupling per unit of Fock coupling for a single-channel axis (ignored otherwise:
   * uPerp and uZ axes use `Setup.ratios`).
   */
  readonly hartreeRatio: number;
  /** Only for 'custom' axes (loaded from a file): the model file's label and targets. */
  readonly label?: string;
  readonly targets?: Readonly<Record<string, number>>;
}

export interface ChannelSetup {
  readonly hartree: number;
  readonly fock: number;
}

/**
 * The sample in physical units (public/notes.html#units). With it the model the solver sees is in
 * meV: `Setup.channels` hold u = u~ * B_perp (the panel shows and takes u~ in meV/T),
 * `Setup.zeeman` = g mu_B B_perp / cos(tilt), `Setup.valleyZeeman` is Delta_V in meV.
 */
export interface PhysicalSetup {
  /** Perpendicular field B_perp, tesla (> 0). */
  readonly bPerpTesla: number;
  /** Angle of the field from the sample normal, degrees, 0 <= tilt < 90. */
  readonly tiltDeg: number;
  readonly gFactor: number;
  /** Relative permittivity eps_r of the surroundings (Coulomb scale). */
  readonly epsilonR: number;
  /** Add the Coulomb exchange E_X to the quasiparticle gap (the model file's `exchange`). */
  readonly exchangeInGap: boolean;
  /** Largest tilt of the trajectory drawn on the Map, degrees. */
  readonly tiltMaxDeg: number;
}

/**
 * A channel derived from an interaction range (public/notes.html#interaction-range). `strength` is
 * the Hartree coupling H = v(0) / (2 pi l_B^2) in the coupling unit (dimensionless, or meV/T in
 * physical units, where H grows as B_perp like a contact coupling); `range` is a in units of l_B
 * (dimensionless) or in nm (physical).
 */
export interface RangeSetup {
  readonly profile: RangeProfile;
  readonly strength: number;
  readonly range: number;
}

/**
 * Everything the user sets up, in dimensionless units or meV (physical): the model (all 15 channels), filling,
 * fields, and the plane. Plain data, always valid as a whole: the panel validates each entry
 * before it gets here, and `setupToScenario` turns it into the model file (README, Command line).
 */
export interface Setup {
  readonly filling: Filling;
  readonly channels: Readonly<Record<Channel, ChannelSetup>>;
  /** E_Z, full spin splitting. */
  readonly zeeman: number;
  /** Delta_V, full sublattice splitting. */
  readonly valleyZeeman: number;
  /** Hartree per Fock coupling of the common couplings uPerp (x0, y0) and uZ (z0). */
  readonly ratios: { readonly uPerp: number; readonly uZ: number };
  readonly x: AxisSetup;
  readonly y: AxisSetup;
  /** [nx, ny]. */
  readonly resolution: readonly [number, number];
  /** Physical units (absent: dimensionless). */
  readonly physical?: PhysicalSetup;
  /** Channels whose H and F come from an interaction range (their `channels` entry is derived). */
  readonly ranges?: Readonly<Partial<Record<Channel, RangeSetup>>>;
  /**
   * Channels listed in the model's `channels` although both parts are zero. A channel is listed
   * when it is nonzero or named here; that matters only where an axis sets one part of it:
   * listed, the other part stays at its value; not listed, it follows the axis (the rule of
   * `planeTargets` in the solver).
   */
  readonly listedZero?: readonly Channel[];
  /** Extra one-body terms sum c_ab G_ab (the model file's `oneBody`), as loaded. */
  readonly oneBody?: Readonly<Partial<Record<Channel, number>>>;
  /**
   * E_X added to the quasiparticle gap (the model file's `exchange`) in dimensionless units; in
   * physical units `physical.exchangeInGap` decides and E_X follows from the field.
   */
  readonly exchange?: number;
  /**
   * The Coulomb scale e^2 / (eps l_B) (the model file's `coulomb`) for the collective modes at
   * finite wavevector, in dimensionless units; in physical units it follows from B_perp and
   * eps_r instead.
   */
  readonly coulomb?: number;
  /**
   * A sample's observations and the fit's options (`fourfold.observations` of the scenario,
   * what `npm run fit` reads from a scenario), kept as loaded so that saving, the link and the
   * autosave carry them.
   */
  readonly observations?: ObservationSet;
  /** The model file's `name` and `description`, kept as loaded. */
  readonly name?: string;
  readonly description?: string;
}

export function zeroChannels(): Record<Channel, ChannelSetup> {
  const out = {} as Record<Channel, ChannelSetup>;
  for (const ch of CHANNELS) out[ch] = { hartree: 0, fock: 0 };
  return out;
}
