import {
  CHANNELS,
  ORDER_GROUPS,
  TOKEN_MEANINGS,
  type Channel,
  type OrderGroupKey,
} from '../../solver/index';
import { labelText } from './labelPieces';

/**
 * Short explanations of what the app names: phase-label tokens, order-parameter groups, the 15
 * channels and the symbols of the Setup, all from the model notes (public/notes.html: basis,
 * common couplings, order parameters, labels, units), shown on hover or keyboard focus wherever
 * one of them appears. `test/modelNotes.test.ts` checks them against the notes.
 */

/** What a state with no broken symmetry is called, and why (public/notes.html#labels). */
const SYM_MEANING = 'no broken symmetry: no group to name';

/** What one label token stands for (TOKEN_MEANINGS, plus 'sym'). */
export function tokenExplanation(token: string): string {
  if (token === 'sym') return SYM_MEANING;
  return TOKEN_MEANINGS[token] ?? `${token}: a symbol this version does not know`;
}

/** A phase label token by token ('CDW+SBxy' names both, in coexistence). */
export function phaseExplanation(label: string): string {
  const tokens = label.split('+');
  const meanings = tokens.map((t) => `${t}, ${tokenExplanation(t)}`);
  return tokens.length > 1 ? `Coexistence of ${meanings.join('; and ')}` : meanings[0]!;
}

/** What each group is: the last column of the table in public/notes.html#order-parameters. */
const GROUP_MEANINGS: Readonly<Record<OrderGroupKey, string>> = {
  spinAlongField: 'ferromagnetic moment',
  spinInPlane: 'moment across the field (breaks U(1)_s)',
  neelAlongField: 'opposite spins on A and B, along the field',
  neelInPlane: 'opposite spins across the field: canting (breaks U(1)_s)',
  cdw: 'charge imbalance between the sublattices',
  bondOrder: 'intervalley coherence; complex amplitude o_x0 + i o_y0 (breaks U(1)_v)',
  spinBondAlongField: 'bond order of opposite sign for the two spins (breaks U(1)_v)',
  spinBondInPlane: 'valley coherence tied to spin across the field (breaks both)',
};

/** The notes' own words for a group's meaning (for the check against the notes). */
export function groupMeaning(key: OrderGroupKey): string {
  return GROUP_MEANINGS[key];
}

/** An order-parameter group: its name, label symbol, components and what it is. */
export function groupExplanation(key: OrderGroupKey): string {
  const g = ORDER_GROUPS.find((group) => group.key === key)!;
  return `${g.title} (label symbol ${g.token}; components ${g.channels.join(', ')}): ${GROUP_MEANINGS[key]}.`;
}

/** The common couplings that set a channel (public/notes.html#common-couplings). */
const COMMON_OF: Partial<Record<Channel, string>> = {
  x0: 'with y0 it carries the common coupling u⊥',
  y0: 'with x0 it carries the common coupling u⊥',
  z0: 'it carries the common coupling u_z',
};

/** The matrix of a channel as plain text: 'τ_x ⊗ σ_z', 'τ_x ⊗ 1', '1 ⊗ σ_z'. */
export function channelMatrixText(channel: Channel): string {
  const [valley, spin] = channel;
  const tau = valley === '0' ? '1' : `τ_${valley}`;
  const sigma = spin === '0' ? '1' : `σ_${spin}`;
  return `${tau} ⊗ ${sigma}`;
}

/**
 * A channel: its matrix (valley factor first, public/notes.html#basis), the order-parameter group
 * its expectation value belongs to, and the common coupling it carries where it carries one.
 */
export function channelExplanation(channel: Channel): string {
  const g = ORDER_GROUPS.find((group) => group.channels.includes(channel));
  const group = g ? `; a component of ${g.title} (${g.token}): ${GROUP_MEANINGS[g.key]}` : '';
  const common = COMMON_OF[channel] ? `; ${COMMON_OF[channel]}` : '';
  return `Channel ${channel} = ${channelMatrixText(channel)} (τ acts on the valley, σ on the spin)${group}${common}.`;
}

/** The Setup's symbols, by their plain-text label (public/notes.html#fields, #units, #setting). */
const SYMBOL_MEANINGS: Readonly<Record<string, string>> = {
  u_perp:
    'the coupling of the valley channels x0 and y0 (Fock part; Hartree = ratio × Fock), the in-plane valley anisotropy',
  u_z: 'the coupling of the valley channel z0 (Fock part; Hartree = ratio × Fock)',
  E_Z: 'Zeeman energy, the full spin splitting; it grows with the total field, so with tilt',
  Delta_V: 'sublattice splitting from the substrate; positive lowers sublattice A (valley K)',
  theta: 'tilt of the field from the sample normal; E_Z = g μ_B B⊥ / cos θ',
  theta_c: 'canting angle: the angle of the spin on sublattice A to the field',
  nu: 'filling factor from charge neutrality; the n = 0 level holds ν + 2 electrons per flux quantum',
  E_X: 'Coulomb exchange energy; it adds to the quasiparticle gap when the scenario says so',
};

/**
 * A symbol of the Setup or an axis, by its plain-text label ('u_perp', 'E_Z', 'u_x0'): what it
 * is, or null for a label it does not know (a custom axis from a file).
 */
export function symbolExplanation(label: string): string | null {
  const meaning = SYMBOL_MEANINGS[label];
  if (meaning !== undefined) return `${labelText(label)}: ${meaning}.`;
  const channel = /^u_([0xyz]{2})$/.exec(label)?.[1] as Channel | undefined;
  if (channel !== undefined && (CHANNELS as readonly string[]).includes(channel)) {
    return `${labelText(label)}: the coupling of channel ${channel} = ${channelMatrixText(channel)} (Fock part; Hartree = ratio × Fock).`;
  }
  return null;
}
