import { CHANNELS, type Channel, type Filling } from '../../solver/index';

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
  /** Only for 'custom' axes (loaded from a file): the interfaces.md label and targets. */
  readonly label?: string;
  readonly targets?: Readonly<Record<string, number>>;
}

export interface ChannelSetup {
  readonly hartree: number;
  readonly fock: number;
}

/**
 * Everything the user sets up, in dimensionless units: the model (all 15 channels), filling,
 * fields, and the plane. Plain data, always valid as a whole: the panel validates each entry
 * before it gets here, and `setupToScenario` turns it into the interfaces.md document.
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
}

export function zeroChannels(): Record<Channel, ChannelSetup> {
  const out = {} as Record<Channel, ChannelSetup>;
  for (const ch of CHANNELS) out[ch] = { hartree: 0, fock: 0 };
  return out;
}
