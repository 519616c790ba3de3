import { CHANNELS } from '../../solver/index';
import { labelText } from '../notation/labelPieces';
import { axisLabel } from '../scenario/scenario';
import type { AxisSetup, PhysicalSetup, Setup } from '../scenario/setup';

/** A number in a step's name: at most 6 significant digits. */
export function stepNumber(value: number): string {
  return String(Number(value.toPrecision(6)));
}

/** An axis's name in the notation of the app ('u⊥', 'E_Z'). */
function axisName(axis: AxisSetup): string {
  return labelText(axisLabel(axis) || 'axis');
}

/** The plane's extent as a step names it: 'u⊥ -1 … 1, u_z -2 … 0'. */
export function extentName(setup: Pick<Setup, 'x' | 'y'>): string {
  const one = (a: AxisSetup) => `${axisName(a)} ${stepNumber(a.from)} … ${stepNumber(a.to)}`;
  return `${one(setup.x)}, ${one(setup.y)}`;
}

const PHYSICAL_NAMES: Readonly<Record<keyof PhysicalSetup, [string, string]>> = {
  bPerpTesla: ['B_perp', ' T'],
  tiltDeg: ['theta', '°'],
  gFactor: ['g', ''],
  epsilonR: ['epsilon_r', ''],
  exchangeInGap: ['E_X in the gap', ''],
  tiltMaxDeg: ['theta_max', '°'],
};

interface Found {
  readonly kind: string;
  readonly label: string;
}

function changeOf(name: string, before: number, after: number, unit = ''): string {
  return `${labelText(name)} ${stepNumber(before)} → ${stepNumber(after)}${unit}`;
}

function axisChanges(a: Setup, b: Setup, out: Found[]): void {
  const extentOnly = (p: AxisSetup, q: AxisSetup) =>
    p.quantity === q.quantity &&
    p.hartreeRatio === q.hartreeRatio &&
    p.label === q.label &&
    p.targets === q.targets;
  const sameRange = (p: AxisSetup, q: AxisSetup) => p.from === q.from && p.to === q.to;
  if (extentOnly(a.x, b.x) && extentOnly(a.y, b.y)) {
    if (!sameRange(a.x, b.x) || !sameRange(a.y, b.y)) {
      out.push({ kind: 'extent', label: `Plane ${extentName(b)}` });
    }
    return;
  }
  for (const name of ['x', 'y'] as const) {
    const p = a[name];
    const q = b[name];
    if (p === q) continue;
    if (p.quantity !== q.quantity || p.label !== q.label) {
      out.push({ kind: `axis-${name}`, label: `${name} axis sweeps ${axisName(q)}` });
    } else if (p.hartreeRatio !== q.hartreeRatio) {
      out.push({
        kind: `axis-${name}`,
        label: `${name} axis H/F ${stepNumber(p.hartreeRatio)} → ${stepNumber(q.hartreeRatio)}`,
      });
    } else {
      out.push({ kind: 'extent', label: `Plane ${extentName(b)}` });
    }
  }
}

function physicalChanges(a: Setup, b: Setup, out: Found[]): void {
  if (a.physical === b.physical) return;
  if (a.physical === undefined || b.physical === undefined) {
    out.push({
      kind: 'units',
      label: b.physical ? 'Units: physical (T, meV)' : 'Units: dimensionless',
    });
    return;
  }
  for (const key of Object.keys(PHYSICAL_NAMES) as (keyof PhysicalSetup)[]) {
    const p = a.physical[key];
    const q = b.physical[key];
    if (p === q) continue;
    const [name, unit] = PHYSICAL_NAMES[key];
    out.push({
      kind: `physical-${key}`,
      label:
        typeof p === 'number' && typeof q === 'number'
          ? changeOf(name, p, q, unit)
          : `${labelText(name)}: ${q ? 'on' : 'off'}`,
    });
  }
}

function channelChanges(a: Setup, b: Setup, out: Found[]): void {
  if (a.channels === b.channels) return;
  const changed = CHANNELS.filter(
    (ch) =>
      a.channels[ch].hartree !== b.channels[ch].hartree ||
      a.channels[ch].fock !== b.channels[ch].fock,
  );
  if (changed.length === 0) return;
  const common =
    changed.join() === 'x0,y0' ? 'u_perp' : changed.join() === 'z0' ? 'u_z' : undefined;
  const first = changed[0]!;
  const before = a.channels[first];
  const after = b.channels[first];
  const part = before.fock !== after.fock ? 'fock' : 'hartree';
  const name = common ?? `u_${first}`;
  const label =
    changed.length <= 2 || common !== undefined
      ? `${changeOf(name, before[part], after[part])} (${part === 'fock' ? 'Fock' : 'Hartree'})`
      : `Channels ${changed.slice(0, 3).join(', ')}${changed.length > 3 ? ', …' : ''}`;
  out.push({ kind: `channels-${changed.join('')}-${part}`, label });
}

/**
 * What changed from setup `a` to setup `b`, as a step of the history names it ('E_Z 0.6 → 0.8',
 * 'Plane u⊥ -1 … 1, u_z -2 … 0', 'x axis sweeps Δ_V') and a kind that says which field it was
 * (changes of one kind in a row can merge). Several fields at once are one step of kind
 * 'several', named by the first two.
 */
export function describeChange(a: Setup, b: Setup): Found {
  const out: Found[] = [];
  if (a.filling !== b.filling) {
    const sign = (v: number) => (v > 0 ? `+${v}` : String(v));
    out.push({
      kind: 'filling',
      label: `${labelText('nu')} ${sign(a.filling)} → ${sign(b.filling)}`,
    });
  }
  physicalChanges(a, b, out);
  if (a.zeeman !== b.zeeman && !(a.physical && b.physical)) {
    out.push({ kind: 'zeeman', label: changeOf('E_Z', a.zeeman, b.zeeman) });
  }
  if (a.valleyZeeman !== b.valleyZeeman) {
    out.push({ kind: 'valleyZeeman', label: changeOf('Delta_V', a.valleyZeeman, b.valleyZeeman) });
  }
  if (a.ratios.uPerp !== b.ratios.uPerp) {
    out.push({
      kind: 'ratio-uPerp',
      label: `H/F of ${labelText('u_perp')} ${stepNumber(a.ratios.uPerp)} → ${stepNumber(b.ratios.uPerp)}`,
    });
  }
  if (a.ratios.uZ !== b.ratios.uZ) {
    out.push({
      kind: 'ratio-uZ',
      label: `H/F of ${labelText('u_z')} ${stepNumber(a.ratios.uZ)} → ${stepNumber(b.ratios.uZ)}`,
    });
  }
  // A ratio or a range rewrites its channels: the channels are named only on their own.
  if (out.length === 0 && a.ranges === b.ranges) channelChanges(a, b, out);
  if (a.ranges !== b.ranges) out.push({ kind: 'ranges', label: 'Interaction range' });
  axisChanges(a, b, out);
  if (a.resolution[0] !== b.resolution[0] || a.resolution[1] !== b.resolution[1]) {
    out.push({
      kind: 'resolution',
      label: `Resolution ${b.resolution[0]} × ${b.resolution[1]}`,
    });
  }
  if (out.length === 0) return { kind: 'other', label: 'Setup changed' };
  if (out.length === 1) return out[0]!;
  return {
    kind: 'several',
    label: `${out[0]!.label}; ${out[1]!.label}${out.length > 2 ? '; …' : ''}`,
  };
}
