import { fieldKey } from './inputText';
import { ModelError, isPlainObject } from './model';
import { parseMapInput, wholeMapProblem, type MapInput } from './plane';
import type { Observation } from './observations';
import { zeemanEnergyMeV } from './units';

/**
 * The plane a fit works in (public/notes.html#observations): a model file with a plane whose
 * couplings and axis values are in meV per tesla of B_perp. Contact couplings grow in proportion
 * to B_perp, so the model of a row at field B_perp and tilt theta is the per-tesla model times
 * B_perp with E_Z = g mu_B B_perp / cos(theta): divided by B_perp (which changes no ground state
 * and no label) that is the per-tesla model with E_Z = g mu_B / cos(theta) per tesla and Delta_V /
 * B_perp. Rows at different fields then share one Map where their tilts and Delta_V / B_perp agree.
 */
export interface FitPlane {
  /** The model document in meV per tesla, plane included; `zeeman` and `valleyZeeman` 0. */
  readonly document: Readonly<Record<string, unknown>>;
  readonly input: MapInput;
  /** Spin g-factor (default 2). */
  readonly gFactor: number;
  /** Delta_V in meV for rows that give none (the file's `valleyZeeman`). */
  readonly valleyZeemanMeV: number;
  /** Relative permittivity when the gap includes E_X (from the field), else null. */
  readonly exchangePermittivity: number | null;
  /** The field (T) the file's couplings were given at (an app scenario in physical units), or null. */
  readonly scaledFromTesla: number | null;
  /** Channels derived from an interaction range (their H and F hold at the file's field only). */
  readonly rangeChannels: readonly string[];
}

/** A tilt sweep starts here at the latest: the field must keep a perpendicular part. */
export const MAX_SWEEP_TILT = 89.9;

function optionalNumber(
  block: Record<string, unknown>,
  key: string,
  min: number,
  max: number,
): number | undefined {
  const value = block[key];
  if (value === undefined) return undefined;
  if (typeof value !== 'number' || !Number.isFinite(value) || value < min || value > max) {
    throw new ModelError(`fourfold.physical.${key}: expected a number from ${min} to ${max}`);
  }
  return value;
}

/**
 * Reads a fit's plane from a model document: the command line's PLANE.json (couplings in meV per
 * tesla, optional `"fourfold": {"physical": {"gFactor": g}}`), or a scenario the app saved in
 * physical units (couplings in meV at its `fourfold.physical.bPerpTesla`, divided by it here).
 * The file's `zeeman` is not used (E_Z comes from each row). Throws ModelError naming the field:
 * an axis that sets E_Z or Delta_V, or one-body terms (energies that do not scale with B_perp).
 */
export function parseFitPlane(json: unknown): FitPlane {
  if (!isPlainObject(json)) throw new ModelError('model: expected a JSON object with a plane');
  if (json.plane === undefined) throw new ModelError('plane: missing (a fit needs a plane)');
  const input = parseMapInput(json);
  const tooLarge = wholeMapProblem(input.plane, 'a fit maps', 'give the plane a coarser grid');
  if (tooLarge !== null) throw new ModelError(tooLarge);
  const physical = isPlainObject(json.fourfold) ? json.fourfold.physical : undefined;
  if (physical !== undefined && !isPlainObject(physical)) {
    throw new ModelError('fourfold.physical: expected an object');
  }
  const block = physical ?? {};
  const gFactor = optionalNumber(block, 'gFactor', 0, 10) ?? 2;
  const bPerp = optionalNumber(block, 'bPerpTesla', 0.01, 100);
  const exchangeInGap = block.exchangeInGap;
  if (exchangeInGap !== undefined && typeof exchangeInGap !== 'boolean') {
    throw new ModelError('fourfold.physical.exchangeInGap: expected true or false');
  }
  const epsilon = optionalNumber(block, 'epsilonR', 1, 100) ?? 4;
  if (input.model.exchange !== undefined && exchangeInGap !== true) {
    throw new ModelError(
      'exchange: a fit takes E_X from each row\u2019s field; set fourfold.physical.exchangeInGap and epsilonR instead',
    );
  }
  if (Object.keys(input.model.oneBody).length > 0) {
    throw new ModelError(
      'oneBody: not used by a fit (one-body energies do not scale with B_perp); remove it',
    );
  }
  for (const which of ['x', 'y'] as const) {
    for (const target of Object.keys(input.plane[which].targets)) {
      if (target === 'zeeman' || target === 'valleyZeeman') {
        throw new ModelError(
          `plane.${which}.targets.${fieldKey(target)}: a fit's axes must be couplings (meV per tesla of B_perp); E_Z and Delta_V come from each observation`,
        );
      }
    }
  }
  const scale = bPerp ?? 1;
  const channels: Record<string, { hartree: number; fock: number }> = {};
  for (const [name, c] of Object.entries(input.model.channels)) {
    channels[name] = { hartree: c.hartree / scale, fock: c.fock / scale };
  }
  const axis = (a: MapInput['plane']['x']) => ({
    label: a.label,
    from: a.from / scale,
    to: a.to / scale,
    targets: { ...a.targets },
  });
  const document = {
    filling: input.model.filling,
    channels,
    zeeman: 0,
    valleyZeeman: 0,
    plane: {
      x: axis(input.plane.x),
      y: axis(input.plane.y),
      resolution: [...input.plane.resolution],
    },
  };
  const ranges = isPlainObject(json.fourfold) ? json.fourfold.ranges : undefined;
  return {
    document,
    input: parseMapInput(document),
    gFactor,
    valleyZeemanMeV: input.model.valleyZeeman,
    exchangePermittivity: exchangeInGap === true ? epsilon : null,
    scaledFromTesla: bPerp ?? null,
    rangeChannels: isPlainObject(ranges) ? Object.keys(ranges) : [],
  };
}

/** E_Z per tesla of B_perp at a tilt (meV/T): g mu_B / cos(tilt). */
export function zeemanPerTesla(plane: Pick<FitPlane, 'gFactor'>, tiltDeg: number): number {
  return zeemanEnergyMeV(1, (tiltDeg * Math.PI) / 180, plane.gFactor);
}

/** Delta_V per tesla of B_perp of a row (meV/T): its own Delta_V, or the plane's. */
export function valleyPerTesla(plane: Pick<FitPlane, 'valleyZeemanMeV'>, row: Observation): number {
  return (row.valleyZeemanMeV ?? plane.valleyZeemanMeV) / row.bPerpTesla;
}

/** Where a row's state is read: E_Z and Delta_V per tesla (one Map per distinct pair). */
export interface FieldCondition {
  readonly zeeman: number;
  readonly valleyZeeman: number;
}

/** Where a transition row's sweep runs: Delta_V per tesla and the tilt it starts from. */
export interface TiltSweepCondition {
  readonly valleyZeeman: number;
  readonly startDeg: number;
}

export function fieldConditionOf(plane: FitPlane, row: Observation): FieldCondition {
  return {
    zeeman: zeemanPerTesla(plane, row.tiltDeg ?? 0),
    valleyZeeman: valleyPerTesla(plane, row),
  };
}

export function sweepConditionOf(plane: FitPlane, row: Observation): TiltSweepCondition {
  return { valleyZeeman: valleyPerTesla(plane, row), startDeg: row.tiltDeg ?? 0 };
}

/** A key naming a condition exactly (equal numbers, equal keys). */
export function conditionKey(condition: FieldCondition | TiltSweepCondition): string {
  return 'zeeman' in condition
    ? `z${condition.zeeman}|d${condition.valleyZeeman}`
    : `d${condition.valleyZeeman}|s${condition.startDeg}`;
}

/** The per-tesla model document at a field condition (what a worker maps). */
export function conditionDocument(
  plane: Pick<FitPlane, 'document'>,
  condition: { readonly zeeman?: number; readonly valleyZeeman: number },
): Record<string, unknown> {
  return { ...plane.document, zeeman: condition.zeeman ?? 0, valleyZeeman: condition.valleyZeeman };
}

/** The common couplings whose Hartree-to-Fock ratio a fit may free, and their channels. */
export const RATIO_CHANNELS = { uPerp: ['x0', 'y0'], uZ: ['z0'] } as const;
export type FreeRatio = keyof typeof RATIO_CHANNELS;

/**
 * The per-tesla document with the Hartree part of a common coupling's channels set to `ratio`
 * times their Fock part: in `channels`, and in each axis's targets where the axis sets the Fock
 * part (as the Setup writes the uPerp and uZ axes).
 */
export function withHartreeRatio(
  document: Readonly<Record<string, unknown>>,
  which: FreeRatio,
  ratio: number,
): Record<string, unknown> {
  const channels = { ...(document.channels as Record<string, { hartree: number; fock: number }>) };
  const plane = document.plane as {
    x: { targets: Record<string, number> };
    y: { targets: Record<string, number> };
  };
  const axis = <A extends { targets: Record<string, number> }>(a: A): A => {
    const targets = { ...a.targets };
    for (const ch of RATIO_CHANNELS[which]) {
      const fock = targets[`${ch}.fock`];
      if (fock !== undefined) targets[`${ch}.hartree`] = ratio * fock;
    }
    return { ...a, targets };
  };
  for (const ch of RATIO_CHANNELS[which]) {
    const c = channels[ch];
    if (c !== undefined) channels[ch] = { hartree: ratio * c.fock, fock: c.fock };
  }
  return { ...document, channels, plane: { ...plane, x: axis(plane.x), y: axis(plane.y) } };
}

/**
 * The Hartree-to-Fock ratio of a common coupling as the document sets it: from an axis that
 * sets its Fock part, else from its channel; 1 (contact) when neither sets it.
 */
export function hartreeRatioOf(
  document: Readonly<Record<string, unknown>>,
  which: FreeRatio,
): number {
  const ch = RATIO_CHANNELS[which][0];
  const plane = document.plane as {
    x: { targets: Record<string, number> };
    y: { targets: Record<string, number> };
  };
  for (const a of [plane.x, plane.y]) {
    const fock = a.targets[`${ch}.fock`];
    if (fock !== undefined && fock !== 0) return (a.targets[`${ch}.hartree`] ?? fock) / fock;
  }
  const c = (document.channels as Record<string, { hartree: number; fock: number } | undefined>)[
    ch
  ];
  return c !== undefined && c.fock !== 0 ? c.hartree / c.fock : 1;
}
