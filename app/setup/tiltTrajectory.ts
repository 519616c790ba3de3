import { CHANNELS, type Channel } from '../../solver/index';
import { zeemanAtTilt } from '../scenario/physical';
import type { AxisSetup, Setup } from '../scenario/setup';
import { targetValuesAt } from './samplePlacement';
import { axisTargetNames } from './sweep';

/** A sample's path on the Map as the field tilts at fixed B_perp, in the plane's coordinates. */
export interface TiltTrajectory {
  /** Points from zero tilt to `tiltMaxDeg`, evenly spaced in angle. */
  readonly points: readonly (readonly [number, number])[];
  readonly tilts: readonly number[];
  /** The point of the current tilt (the sample as set up). */
  readonly current: readonly [number, number];
  /**
   * 'zeeman': an axis is E_Z and the path is the sample's own (the map holds everything else
   * fixed, as the tilt does). 'scaled': both axes are couplings or Delta_V, the map has one
   * fixed E_Z, and the path is the sample rescaled to that E_Z.
   */
  readonly kind: 'zeeman' | 'scaled';
  /** False when the scaled path is only approximate (see `tiltTrajectory`). */
  readonly exact: boolean;
}

/** The sample's value of what an axis sweeps, in the solver's unit, or null (custom axis). */
function sampleCoordinate(axis: AxisSetup, setup: Setup): number | null {
  switch (axis.quantity) {
    case 'uPerp':
      return setup.channels.x0.fock;
    case 'uZ':
      return setup.channels.z0.fock;
    case 'zeeman':
      return setup.zeeman;
    case 'valleyZeeman':
      return setup.valleyZeeman;
    case 'custom':
      return null;
    default:
      return setup.channels[axis.quantity].fock;
  }
}

/** The sample's value of a plane target (`zeeman`, `valleyZeeman`, `CH.fock`, `CH.hartree`). */
function sampleTarget(setup: Setup, target: string): number {
  if (target === 'zeeman') return setup.zeeman;
  if (target === 'valleyZeeman') return setup.valleyZeeman;
  const [ch, part] = target.split('.') as [Channel, 'fock' | 'hartree'];
  return setup.channels[ch][part];
}

/**
 * Whether the sample lies in the plane: every target the axes set, at the sample's axis
 * coordinates, has the sample's own value (a Hartree part off the axis ratio, for example,
 * puts the sample beside the plane).
 */
function sampleInPlane(setup: Setup, xs: number, ys: number): boolean {
  for (const [target, value] of targetValuesAt(setup, xs, ys)) {
    const own = sampleTarget(setup, target);
    if (Math.abs(own - value) > 1e-9 * Math.max(1, Math.abs(own))) return false;
  }
  return true;
}

/**
 * The path of a physical sample on the Map of `setup`'s plane as the tilt goes from 0 to
 * `tiltMaxDeg` at fixed B_perp (public/notes.html#units): the couplings stay, E_Z(theta) =
 * E_Z(0) / cos(theta) grows. Null without physical units, on a custom axis, or when both axes
 * are E_Z.
 *
 * - One axis is E_Z: the map shows every E_Z at the other quantities' fixed values, so the path
 *   is the sample itself, a straight segment along the E_Z axis from E_Z(0) to E_Z(max).
 * - Both axes are couplings (or Delta_V): the map is drawn at the one E_Z of the current tilt.
 *   The energy of public/notes.html#energy is homogeneous of degree one in all couplings, E_Z and
 *   Delta_V together, so the ground state depends on their ratios only: the sample at tilt
 *   theta has the state of the map point u * E_Z(current) / E_Z(theta) = u cos(theta) /
 *   cos(current). In coordinates scaled by E_Z (u / E_Z) this is the ray u cos(theta) / E_Z(0)
 *   towards the origin; on the map's absolute axes it is the same ray times E_Z(current), and
 *   it passes through the sample's own point at the current tilt. That holds exactly only when
 *   everything the axes do not set scales along, i.e. Delta_V, the couplings off the axes and
 *   any extra one-body terms are zero; otherwise `exact` is false and the path is a guide (the
 *   map keeps them fixed while the rescaled sample's shrink by cos(theta) / cos(current)).
 *
 * Either path is exact only if the sample lies in the plane at all (`sampleInPlane`).
 */
export function tiltTrajectory(setup: Setup, samples = 48): TiltTrajectory | null {
  const physical = setup.physical;
  if (!physical) return null;
  const xs = sampleCoordinate(setup.x, setup);
  const ys = sampleCoordinate(setup.y, setup);
  if (xs === null || ys === null) return null;
  const xZeeman = setup.x.quantity === 'zeeman';
  const yZeeman = setup.y.quantity === 'zeeman';
  if (xZeeman && yZeeman) return null;
  const tilts: number[] = [];
  for (let k = 0; k < samples; k++) tilts.push((physical.tiltMaxDeg * k) / (samples - 1));
  const zeemanNow = zeemanAtTilt(physical, physical.tiltDeg);
  if (xZeeman || yZeeman) {
    const at = (tilt: number): [number, number] => {
      const e = zeemanAtTilt(physical, tilt);
      return xZeeman ? [e, ys] : [xs, e];
    };
    return {
      points: tilts.map(at),
      tilts,
      current: at(physical.tiltDeg),
      kind: 'zeeman',
      exact: sampleInPlane(setup, xs, ys),
    };
  }
  const at = (tilt: number): [number, number] => {
    const lambda = zeemanNow / zeemanAtTilt(physical, tilt);
    return [lambda * xs, lambda * ys];
  };
  const onAxes = new Set([...axisTargetNames(setup.x), ...axisTargetNames(setup.y)]);
  const offAxes = CHANNELS.some((ch) => {
    const c = setup.channels[ch];
    const off = !onAxes.has(`${ch}.fock`) || !onAxes.has(`${ch}.hartree`);
    return off && (c.hartree !== 0 || c.fock !== 0);
  });
  const substrate =
    (!onAxes.has('valleyZeeman') && setup.valleyZeeman !== 0) ||
    Object.values(setup.oneBody ?? {}).some((c) => c !== 0);
  return {
    points: tilts.map(at),
    tilts,
    current: at(physical.tiltDeg),
    kind: 'scaled',
    exact: !offAxes && !substrate && sampleInPlane(setup, xs, ys),
  };
}
