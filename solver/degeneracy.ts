import {
  CHANNELS,
  COMMUTATION_SIGN,
  G_COL,
  G_IM,
  G_RE,
  channelIndex,
  type Channel,
} from './channels';
import type { Couplings } from './couplings';
import { isSymmetry, orbitTangent } from './goldstoneModes';
import { choleskySolve, symmetricEigen } from './linalg';
import { DEFAULT_DESCENT, descend } from './localMinimise';
import { DEFAULT_MINIMISE, minimiseEnergy } from './minimise';
import { energyOfOrder } from './couplings';
import { ORDER_GROUPS, presentGroupCount } from './orderParameters';
import { seedLibrary } from './seeds';
import { ORDER_TOLERANCE, phaseLabel } from './phaseLabel';
import { canonicaliseOrbit } from './orbitGauge';
import type { ModelSymmetry } from './symmetry';
import { orderOfProjector, projectorOf } from './state';
import { DescentWorkspace, frameEnergy, tangentDimension, tangentModel } from './tangentSpace';

/**
 * States whose energies differ by at most this (relative to the coupling scale) count as
 * degenerate: the model does not tell them apart at the precision Fourfold reports.
 */
export const DEGENERACY_TOLERANCE = 1e-9;

/**
 * Curvature (relative to the coupling scale) below which a direction of the energy Hessian is
 * soft: along it a descent stops wherever it arrives, since the gradient there is below the
 * search tolerance. A ground state with soft directions other than the rotations about the
 * field and about tau_z (which only turn it, label unchanged) sits in a degenerate family.
 */
export const SOFT_CURVATURE = 1e-7;

/**
 * Strength (relative to the coupling scale) of the vanishing fields that pick one member of a
 * degenerate family: the model's own one-body terms scaled up to this size when they are
 * weaker, and E_Z -> 0+ (strength a) and Delta_V -> 0+ (strength a / 2) where the model has
 * none. Their second-order effects (about a^2 / scale = 1e-6 of the scale) are then well above
 * the descent's resolution, and first-order splittings of the true model beyond 1e-3 of the
 * scale are not overturned.
 */
const PROBE_FIELD = 1e-3;

/**
 * Weaker probes that follow the first: a state the first probe moved along a flat direction
 * by an amount that vanishes with the probe (an admixture of order PROBE_FIELD, which would
 * name an extra group) is brought back towards the limit member, a hundredfold each step.
 */
const FOLLOW_UP_PROBES = [1e-5];

/**
 * Order-parameter groups below this magnitude in a degenerate state are candidates for removal:
 * where the family lets them vanish at no cost, the simpler member is reported.
 */
const SMALL_GROUP = 1e-3;

/** Stiffness (relative to the coupling scale) of the penalty that removes such groups. */
const CLEANING_STIFFNESS = 1e-3;

/**
 * Descends `frame` under the probes of decreasing strength, then under a small penalty on the
 * order-parameter groups that are nearly zero (a family member where they vanish costs nothing
 * more, so it is the one reported; where they are part of the ground state the last descent
 * under the true couplings restores them), then under the true couplings.
 */
function followProbes(c: Couplings, frame: Float64Array, ws: DescentWorkspace) {
  for (const strength of FOLLOW_UP_PROBES) {
    descend(probeCouplings(c, strength), frame, DEFAULT_DESCENT, ws);
  }
  frameEnergy(c, frame, ws, ws.order);
  const kappa = Float64Array.from(c.kappa);
  let small = false;
  for (const group of GROUP_CHANNELS) {
    let sum = 0;
    for (const k of group) sum += ws.order[k]! * ws.order[k]!;
    if (sum === 0 || sum >= SMALL_GROUP * SMALL_GROUP) continue;
    small = true;
    for (const k of group) kappa[k] = kappa[k]! + 2 * CLEANING_STIFFNESS * c.scale;
  }
  if (small) descend({ ...c, kappa }, frame, DEFAULT_DESCENT, ws);
  return descend(c, frame, DEFAULT_DESCENT, ws);
}

const GROUP_CHANNELS = ORDER_GROUPS.map((g) => g.channels.map(channelIndex));

/**
 * Order in which components decide between degenerate states the vanishing fields leave
 * (channel indices): the diagonal ones first (moment along the field, sublattice, Neel along the
 * field), then bond order, in-plane moment, in-plane Neel order and spin bond order. A larger
 * component wins.
 */
const CANONICAL_ORDER = [3, 12, 15, 4, 8, 1, 2, 13, 14, 7, 11, 5, 6, 9, 10];

/** A family of degenerate ground states, as the results report it. */
export interface Degeneracy {
  /** What the family is, in a few words (e.g. "spin rotations (SU(2))"). */
  readonly family: string;
  /**
   * Channels G_ab whose rotations exp(i theta G_ab) keep the energy (to the tolerance) and
   * change the state beyond the rotations about the field and about tau_z: the symmetry that
   * generates the family (empty where no single rotation does: an accidental degeneracy, or
   * distinct states at one energy).
   */
  readonly symmetries: readonly Channel[];
  /** Soft directions at the state besides the rotations about the field and about tau_z. */
  readonly dimension: number;
  /** Labels of the degenerate states met (the reported member's first). */
  readonly members: readonly string[];
  /** How the reported member was chosen. */
  readonly choice: string;
}

const SPIN_GENERATORS: readonly Channel[] = ['0x', '0y', '0z'];
const VALLEY_GENERATORS: readonly Channel[] = ['x0', 'y0', 'z0'];

/**
 * The `degenerate` report of a ground state: undefined when its only flat directions are the
 * rotations about the field and about tau_z (which leave every label unchanged) and no other
 * state shares its energy.
 */
export function describeDegeneracy(
  c: Couplings,
  frame: Float64Array,
  selection: Selection,
): Degeneracy | undefined {
  if (selection.soft === 0 && selection.members.length <= 1) return undefined;
  const trivial = new Set<Channel>();
  if (isSymmetry(c, 3)) trivial.add('0z');
  if (isSymmetry(c, 12)) trivial.add('z0');
  const flat = degenerateRotations(c, frame);
  const moving = movingRotations(c, frame);
  const symmetries = flat.filter((g) => !trivial.has(g));
  const model = (list: readonly Channel[]): boolean =>
    list.every((g) => isSymmetry(c, channelIndex(g))) && list.some((g) => symmetries.includes(g));
  const names: string[] = [];
  let rest = symmetries;
  if (flat.length === moving.length && flat.length > 2) {
    names.push('every rotation of the state keeps its energy (SU(4))');
    rest = [];
  } else {
    if (model(SPIN_GENERATORS)) names.push('spin rotations (SU(2))');
    if (model(VALLEY_GENERATORS)) names.push('valley rotations (SU(2))');
    rest = symmetries.filter(
      (g) =>
        !(model(SPIN_GENERATORS) && SPIN_GENERATORS.includes(g)) &&
        !(model(VALLEY_GENERATORS) && VALLEY_GENERATORS.includes(g)),
    );
  }
  if (rest.length > 0) names.push(`rotations exp(i theta G) with G = ${rest.join(', ')}`);
  const family =
    names.length > 0
      ? names.join(' and ')
      : selection.soft > 0
        ? 'a continuous family not generated by a single rotation (accidental)'
        : 'distinct states at one energy';
  const own = weakFields(c) ? "weak limit of the model's" : "model's";
  const parts: string[] = [];
  parts.push(c.eta[3] === 0 ? 'E_Z -> 0+' : `the ${own} E_Z`);
  parts.push(c.eta[12] === 0 ? 'Delta_V -> 0+' : `the ${own} Delta_V`);
  const fields = parts.join(' and ');
  // Pure members: exact symmetric states at the ground-state energy.
  const members = [...selection.members];
  const energy = frameEnergy(c, frame, workspace, workspace.order);
  for (const seed of seedLibrary(c.nf)) {
    if (seed.exact === undefined) continue;
    if (energyOfOrder(c, seed.exactOrder) > energy + DEGENERACY_TOLERANCE * c.scale) continue;
    const label = phaseLabel(seed.exactOrder, c);
    if (!members.includes(label)) members.push(label);
  }
  return {
    family,
    symmetries,
    dimension: selection.soft,
    members,
    choice: `the member that ${fields} select, then the one with fewest order-parameter groups`,
  };
}

const workspace = new DescentWorkspace();

const tangentScratch = new Float64Array(8);

/**
 * Number of soft directions of the energy Hessian at a converged frame, not counting the orbit
 * directions of exact rotations about the field (G_0z) and about tau_z (G_z0), which leave every
 * label and group magnitude unchanged. With `fresh`, `ws` already holds the frame's order
 * parameters and Hessian (a descent that just converged there leaves them).
 */
export function softDirections(
  c: Couplings,
  frame: Float64Array,
  ws: DescentWorkspace = workspace,
  fresh = false,
): number {
  const nf = c.nf;
  const d = tangentDimension(nf);
  if (!fresh) {
    frameEnergy(c, frame, ws, ws.order);
    tangentModel(c, frame, ws);
  }
  const k = ws.eigScratch;
  k.set(ws.hessian.subarray(0, d * d));
  const t = tangentScratch;
  for (const g of [3, 12]) {
    if (!isSymmetry(c, g)) continue;
    orbitTangent(frame, nf, g, t);
    let norm = 0;
    for (let p = 0; p < d; p++) norm += t[p]! * t[p]!;
    if (norm <= 1e-12) continue;
    // Penalise the orbit direction: it is not a soft mode of interest.
    const weight = c.scale / norm;
    for (let p = 0; p < d; p++) {
      for (let q = 0; q < d; q++) k[p * d + q] = k[p * d + q]! + weight * t[p]! * t[q]!;
    }
  }
  const mu = SOFT_CURVATURE * c.scale;
  if (choleskySolve(k, d, -mu, ws.rhs.fill(0), ws.step, ws.chol, 0)) return 0;
  const values = ws.eigValues;
  symmetricEigen(k, d, values, ws.eigVectors);
  let soft = 0;
  for (let p = 0; p < d; p++) if (values[p]! < mu) soft++;
  return soft;
}

/**
 * Couplings with the vanishing fields that choose among degenerate states, of relative strength
 * `strength` (see PROBE_FIELD).
 */
export function probeCouplings(c: Couplings, strength = PROBE_FIELD): Couplings {
  return { ...c, eta: probeFields(c, strength, new Float64Array(16)) };
}

/**
 * Whether the model's own one-body terms are all weaker than the probes (none at all included):
 * the vanishing fields then choose among states that the model splits by less than they do,
 * which a state continued from a neighbour cannot tell.
 */
export function weakFields(c: Couplings): boolean {
  let largest = 0;
  for (let k = 1; k < 16; k++) largest = Math.max(largest, Math.abs(c.eta[k]!));
  return largest < PROBE_FIELD * c.scale;
}

/** The one-body terms of `probeCouplings(c, strength)`, written into `eta`. */
function probeFields(c: Couplings, strength: number, eta: Float64Array): Float64Array {
  const a = strength * c.scale;
  let largest = 0;
  for (let k = 1; k < 16; k++) largest = Math.max(largest, Math.abs(c.eta[k]!));
  const amplify = largest > 0 && largest < a ? a / largest : 1;
  eta[0] = c.eta[0]!;
  for (let k = 1; k < 16; k++) eta[k] = amplify * c.eta[k]!;
  if (c.eta[3] === 0) eta[3] = eta[3]! - a / 2;
  if (c.eta[12] === 0) eta[12] = eta[12]! - a / 4;
  return eta;
}

/** `ANTICOMMUTING[g]` has bit k set when G_g and G_k anticommute. */
const ANTICOMMUTING = Int32Array.from({ length: 16 }, (_, g) => {
  let mask = 0;
  for (let k = 1; k < 16; k++) if (COMMUTATION_SIGN[16 * g + k]! < 0) mask |= 1 << k;
  return mask;
});

/** Scratch of `discreteRepresentative` (called for every Map pixel), reused between calls. */
const imageScratch = {
  projector: new Float64Array(32),
  order: new Float64Array(16),
  probe: new Float64Array(16),
  frame: new Float64Array(32),
  bestOrder: new Float64Array(16),
  imageOrder: new Float64Array(16),
  vector: new Float64Array(8),
  seen: new Int32Array(15),
};

/**
 * Moves `frame` (in place) to the member of its discrete family that the vanishing fields
 * select, and returns whether it moved. Conjugating a state by one G_g (P -> G_g P G_g, a
 * unitary) flips the sign of every o_k whose G_k anticommutes with G_g and keeps the rest, so
 * the quadratic part of the energy, 1/2 sum kappa_k o_k^2, is unchanged: the image is another
 * exact critical point of the same curvature, at the same energy whenever eta.o is. Such
 * images (the two sublattice polarisations of a CDW without Delta_V, say) are isolated minima
 * that a search can stop in either of, and a continued Map pixel keeps whichever its neighbour
 * had. Among the state and its images of the same energy (to DEGENERACY_TOLERANCE), the one
 * lowest under the fields of `probeCouplings` wins (to first order, eta_probe.o), then the
 * larger components in CANONICAL_ORDER after `canonicaliseOrbit`. The G's form a group up to
 * phases, so every image of an image is an image: the choice is the same from any member.
 */
export function discreteRepresentative(
  c: Couplings,
  frame: Float64Array,
  symmetry: ModelSymmetry,
): boolean {
  const s = imageScratch;
  const nf = c.nf;
  const o = orderOfProjector(projectorOf(frame, nf, s.projector), s.order);
  const tolerance = DEGENERACY_TOLERANCE * c.scale;
  let probe: Float64Array | undefined;
  let pick = 0;
  let pickProbe = 0;
  /** Whether the canonical order of the pick is in `s.bestOrder`. */
  let pickKnown = false;
  const seen = s.seen;
  let seenCount = 0;
  // Images that a rotation by pi the model keeps also gives lie on the state's own orbit: the
  // same state (G_0z: about the field; G_z0: about tau_z; G_zz: both).
  let present = 0;
  for (let k = 1; k < 16; k++) if (Math.abs(o[k]!) > ORDER_TOLERANCE) present |= 1 << k;
  const spin = symmetry.spinRotationAboutField ? ANTICOMMUTING[3]! & present : -1;
  const valley = symmetry.valleyRotation ? ANTICOMMUTING[12]! & present : -1;
  const both = spin >= 0 && valley >= 0 ? ANTICOMMUTING[15]! & present : -1;
  for (let g = 1; g < 16; g++) {
    // The components the image flips (none: the same state; those of a kept rotation by pi:
    // the same orbit), and the energy change: -2 sum over anticommuting k of eta_k o_k.
    const flips = ANTICOMMUTING[g]! & present;
    if (flips === 0 || flips === spin || flips === valley || flips === both) continue;
    let change = 0;
    for (let k = 1; k < 16; k++) {
      if (COMMUTATION_SIGN[16 * g + k]! < 0) change -= 2 * c.eta[k]! * o[k]!;
    }
    if (Math.abs(change) > tolerance) continue;
    // Several G's that flip the same components give the same image.
    if (seen.subarray(0, seenCount).includes(flips)) continue;
    seen[seenCount++] = flips;
    probe ??= probeFields(c, PROBE_FIELD, s.probe);
    let probeChange = 0;
    for (let k = 1; k < 16; k++) {
      if (COMMUTATION_SIGN[16 * g + k]! < 0) probeChange -= 2 * probe[k]! * o[k]!;
    }
    if (probeChange < pickProbe - tolerance) {
      pick = g;
      pickProbe = probeChange;
      pickKnown = false;
    } else if (probeChange <= pickProbe + tolerance) {
      if (!pickKnown) canonicalImageOrder(frame, nf, pick, symmetry, s.bestOrder);
      pickKnown = true;
      const image = canonicalImageOrder(frame, nf, g, symmetry, s.imageOrder);
      if (comesFirst(image, s.bestOrder)) {
        pick = g;
        s.bestOrder.set(image);
      }
    }
  }
  if (pick === 0) return false;
  conjugateFrame(frame, pick, frame);
  return true;
}

/**
 * Moves `frame` (in place) to the member of its degenerate family that the single-point search
 * reports among its mirror images and along its orbit: the canonical point of its orbit, then
 * `discreteRepresentative` (which then meets only images off the orbit) and the canonical point
 * of the image's orbit.
 */
export function representative(c: Couplings, frame: Float64Array, symmetry: ModelSymmetry): void {
  canonicaliseOrbit(frame, c.nf, symmetry);
  if (discreteRepresentative(c, frame, symmetry)) canonicaliseOrbit(frame, c.nf, symmetry);
}

/** Order parameters of the image of `frame` by G_g (0: itself) at its orbit's canonical point. */
function canonicalImageOrder(
  frame: Float64Array,
  nf: number,
  g: number,
  symmetry: ModelSymmetry,
  out: Float64Array,
): Float64Array {
  const s = imageScratch;
  conjugateFrame(frame, g, s.frame);
  canonicaliseOrbit(s.frame, nf, symmetry);
  return orderOfProjector(projectorOf(s.frame, nf, s.projector), out);
}

/** Whether order a comes before b: the first component in CANONICAL_ORDER that differs is larger. */
function comesFirst(a: Float64Array, b: Float64Array): boolean {
  for (const k of CANONICAL_ORDER) {
    const d = a[k]! - b[k]!;
    if (Math.abs(d) > 1e-6) return d > 0;
  }
  return false;
}

/** Every vector u of `frame` replaced by G_g u (g = 0: copied), into `out` (may be `frame`). */
function conjugateFrame(frame: Float64Array, g: number, out: Float64Array): void {
  const u = imageScratch.vector;
  for (let v = 0; v < 4; v++) {
    const base = 8 * v;
    for (let p = 0; p < 8; p++) u[p] = frame[base + p]!;
    for (let r = 0; r < 4; r++) {
      const col = G_COL[4 * g + r]!;
      const gr = G_RE[4 * g + r]!;
      const gi = G_IM[4 * g + r]!;
      out[base + 2 * r] = gr * u[2 * col]! - gi * u[2 * col + 1]!;
      out[base + 2 * r + 1] = gr * u[2 * col + 1]! + gi * u[2 * col]!;
    }
  }
}

/** A degenerate ground state's representative and, when asked, what the family holds. */
export interface Selection {
  readonly frame: Float64Array;
  /** Whether the frame differs from the one given. */
  readonly changed: boolean;
  /** Soft directions of the given frame (see softDirections). */
  readonly soft: number;
  /** Labels of the degenerate states met, the representative's first. */
  readonly members: string[];
}

interface Candidate {
  readonly frame: Float64Array;
  readonly order: Float64Array;
  readonly groups: number;
}

/** Whether state a is preferred to b: fewer order-parameter groups, then CANONICAL_ORDER. */
function preferred(a: Candidate, b: Candidate): boolean {
  if (a.groups !== b.groups) return a.groups < b.groups;
  return comesFirst(a.order, b.order);
}

/**
 * Picks one member of the family of states degenerate with `frame` (energy `energy`): among the
 * states that vanishing fields select (E_Z -> 0+, Delta_V -> 0+, or the model's own weak fields
 * scaled up, see PROBE_FIELD), the simplest (fewest order-parameter groups), then the one with
 * the largest components in CANONICAL_ORDER. The answer then depends neither on the units nor on
 * where a search happened to stop, and a weak field gets the member its limit selects. `others`
 * are further frames known to lie within the tolerance (distinct minima of the search). Returns
 * the given frame when there is nothing to choose.
 */
export function selectRepresentative(
  c: Couplings,
  frame: Float64Array,
  energy: number,
  others: readonly Float64Array[],
): Selection {
  const soft = softDirections(c, frame);
  if (soft === 0 && others.length === 0) return { frame, changed: false, soft, members: [] };
  const tolerance = DEGENERACY_TOLERANCE * c.scale;
  const probe = probeCouplings(c);
  const search = minimiseEnergy(probe, DEFAULT_MINIMISE, {
    warmStarts: [frame, ...others],
    polishSteps: 1,
    gradientTolerance: 1e-12,
  });
  const starts: Float64Array[] = [];
  for (const m of search.minima) {
    if (m.converged && m.energy <= search.energy + tolerance) starts.push(m.frame);
  }
  // Exact symmetric states at the probe's minimum energy: the pure members of a family, which
  // a nudged descent only approaches. Each is relaxed by the probe's fields first (without
  // leaving it along a flat direction), which may cant it slightly.
  const ws = workspace;
  const stay = { ...DEFAULT_DESCENT, escapeSaddles: false };
  const margin = PROBE_FIELD * c.scale;
  for (const seed of seedLibrary(c.nf)) {
    if (seed.exact === undefined) continue;
    if (energyOfOrder(probe, seed.exactOrder) > search.energy + margin) continue;
    const relaxed = Float64Array.from(seed.exact);
    const result = descend(probe, relaxed, stay, ws);
    if (result.converged && result.energy <= search.energy + tolerance) starts.push(relaxed);
  }
  const members: string[] = [];
  let best: Candidate | undefined;
  for (const start of starts) {
    const candidate = Float64Array.from(start);
    const relaxed = followProbes(c, candidate, ws);
    if (!relaxed.converged || relaxed.energy > energy + tolerance) continue;
    const found = {
      frame: candidate,
      order: Float64Array.from(ws.order),
      groups: presentGroupCount(ws.order, ORDER_TOLERANCE),
    };
    const label = phaseLabel(found.order, c);
    if (!members.includes(label)) members.push(label);
    if (best === undefined || preferred(found, best)) best = found;
  }
  if (best === undefined) return { frame, changed: false, soft, members };
  const first = phaseLabel(best.order, c);
  return {
    frame: best.frame,
    changed: true,
    soft,
    members: [first, ...members.filter((m) => m !== first)],
  };
}

/** Scratch of `sameState` (a hot call of the Map's boundary cells), reused between calls. */
const sameStateScratch = {
  projector: new Float64Array(32),
  frameA: new Float64Array(32),
  frameB: new Float64Array(32),
  orderA: new Float64Array(16),
  orderB: new Float64Array(16),
};

/**
 * Whether two frames describe the same state up to the tolerance of their order parameters
 * (with `symmetry`, up to the model's exact rotations about the field and about tau_z).
 */
export function sameState(
  a: Float64Array,
  b: Float64Array,
  nf: number,
  tolerance = 1e-6,
  symmetry?: ModelSymmetry,
): boolean {
  const { frameA: fa, frameB: fb } = sameStateScratch;
  // Up to the exact rotations about the field and about tau_z (one orbit is one state here).
  fa.set(a);
  fb.set(b);
  if (symmetry !== undefined) {
    canonicaliseOrbit(fa, nf, symmetry);
    canonicaliseOrbit(fb, nf, symmetry);
  }
  return ordersAgree(fa, fb, nf, tolerance);
}

/** Whether the order parameters of two frames agree to `tolerance` (max norm). */
function ordersAgree(fa: Float64Array, fb: Float64Array, nf: number, tolerance: number): boolean {
  const { projector: p, orderA, orderB } = sameStateScratch;
  const oa = orderOfProjector(projectorOf(fa, nf, p), orderA);
  const ob = orderOfProjector(projectorOf(fb, nf, p), orderB);
  for (let k = 1; k < 16; k++) if (Math.abs(oa[k]! - ob[k]!) > tolerance) return false;
  return true;
}

/**
 * Whether two frames stand for one state once each is taken to the member the single-point
 * search reports among its mirror images and along its orbit (`representative`), up to
 * `tolerance` in the order parameters.
 */
export function sameRepresentative(
  c: Couplings,
  a: Float64Array,
  b: Float64Array,
  tolerance: number,
  symmetry: ModelSymmetry,
): boolean {
  const { frameA: fa, frameB: fb } = sameStateScratch;
  fa.set(a);
  fb.set(b);
  representative(c, fa, symmetry);
  representative(c, fb, symmetry);
  return ordersAgree(fa, fb, c.nf, tolerance);
}

/** Generators whose rotations move the state of `frame`. */
function movingRotations(c: Couplings, frame: Float64Array): Channel[] {
  const out: Channel[] = [];
  for (let g = 1; g < 16; g++) {
    const t = orbitTangent(frame, c.nf, g);
    let norm = 0;
    for (let p = 0; p < t.length; p++) norm += t[p]! * t[p]!;
    if (norm > 1e-12) out.push(CHANNELS[g - 1]!);
  }
  return out;
}

/** Generators whose rotation by a quarter turn keeps the energy of `frame` and moves it. */
export function degenerateRotations(c: Couplings, frame: Float64Array): Channel[] {
  const ws = workspace;
  const nf = c.nf;
  const tolerance = DEGENERACY_TOLERANCE * c.scale;
  const energy = frameEnergy(c, frame, ws, ws.order);
  const out: Channel[] = [];
  for (let g = 1; g < 16; g++) {
    const t = orbitTangent(frame, nf, g);
    let norm = 0;
    for (let p = 0; p < t.length; p++) norm += t[p]! * t[p]!;
    if (norm <= 1e-12) continue;
    let flat = true;
    for (const angle of [Math.PI / 8, Math.PI / 4, Math.PI / 2]) {
      const turned = rotateFrame(frame, g, angle);
      if (Math.abs(frameEnergy(c, turned, ws, ws.trialOrder) - energy) > tolerance) flat = false;
    }
    if (flat) out.push(CHANNELS[g - 1]!);
  }
  return out;
}

/** exp(i angle G_g) applied to every vector of a frame (G_g squares to one). */
function rotateFrame(frame: Float64Array, g: number, angle: number): Float64Array {
  const out = new Float64Array(32);
  const cos = Math.cos(angle);
  const sin = Math.sin(angle);
  for (let v = 0; v < 4; v++) {
    for (let r = 0; r < 4; r++) {
      const col = G_COL[4 * g + r]!;
      const gr = G_RE[4 * g + r]!;
      const gi = G_IM[4 * g + r]!;
      const ur = frame[8 * v + 2 * col]!;
      const ui = frame[8 * v + 2 * col + 1]!;
      // (G u)_r, then cos u + i sin G u
      const wr = gr * ur - gi * ui;
      const wi = gr * ui + gi * ur;
      out[8 * v + 2 * r] = cos * frame[8 * v + 2 * r]! - sin * wi;
      out[8 * v + 2 * r + 1] = cos * frame[8 * v + 2 * r + 1]! + sin * wr;
    }
  }
  return out;
}

/**
 * The Map's light version of `selectRepresentative` for a pixel whose state `frames[0]` is
 * degenerate (soft, or tied with the other frames): each frame descends under the vanishing
 * fields of `probeCouplings` (which move it along its family to the member they select), the
 * lowest under them is kept (ties: fewer groups, then CANONICAL_ORDER), and a last descent under
 * the true couplings removes what the fields induced. A pixel continued from a neighbour that
 * already holds the selected member costs one or two Newton steps more. Result in `frames[0]`'s
 * place is returned; `energy` is the pixel's energy (frames that end above it are ignored).
 */
export function settleDegenerate(
  c: Couplings,
  frames: readonly Float64Array[],
  energy: number,
  ws: DescentWorkspace,
): Float64Array {
  const probe = probeCouplings(c);
  const tolerance = DEGENERACY_TOLERANCE * c.scale;
  let best: (Candidate & { probeEnergy: number }) | undefined;
  for (const start of frames) {
    const frame = Float64Array.from(start);
    const moved = descend(probe, frame, DEFAULT_DESCENT, ws);
    const relaxed = followProbes(c, frame, ws);
    if (!relaxed.converged || relaxed.energy > energy + tolerance) continue;
    const found = {
      frame,
      order: Float64Array.from(ws.order),
      groups: presentGroupCount(ws.order, ORDER_TOLERANCE),
      probeEnergy: moved.energy,
    };
    if (
      best === undefined ||
      found.probeEnergy < best.probeEnergy - tolerance ||
      (found.probeEnergy <= best.probeEnergy + tolerance && preferred(found, best))
    ) {
      best = found;
    }
  }
  return best?.frame ?? Float64Array.from(frames[0]!);
}
