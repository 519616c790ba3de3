import { CHANNELS, COMMUTATION_SIGN, MATRIX_COUNT, channelIndex } from './channels';
import { occupiedCount, type Model } from './model';

/**
 * A model reduced to arrays indexed by channel 0..15 (index 0 unused for couplings), plus the
 * diagonal form of the energy used everywhere in the solver.
 *
 * Writing P = (1/4) sum_ab o_ab G_ab with o_ab = tr(G_ab P), and using G_cd G_ab G_cd = s G_ab
 * (s = +-1), the energy of public/notes.html#energy becomes diagonal in the order parameters:
 *
 *   E = c0 + sum_ab eta_ab o_ab + 1/2 sum_{ab != 00} kappa_ab o_ab^2,
 *   kappa_ab = H_ab - (1/4) sum_{cd != 00} F_cd s(cd, ab),   c0 = -(1/8) Nf^2 sum_cd F_cd,
 *
 * (derived here from that energy), and the Hartree-Fock Hamiltonian of public/notes.html#gap is
 * H_HF = sum_ab (eta_ab + kappa_ab o_ab) G_ab + (eta_00 - (Nf/4) sum_cd F_cd) 1 - E_X P.
 */
export interface Couplings {
  /** Occupied flavours per flux quantum, Nf = nu + 2. */
  readonly nf: number;
  readonly hartree: Float64Array;
  readonly fock: Float64Array;
  /** One-body coefficients: h = sum_ab eta_ab G_ab; eta_0z = -E_Z/2, eta_z0 = -Delta_V/2. */
  readonly eta: Float64Array;
  readonly kappa: Float64Array;
  readonly c0: number;
  /** Coefficient of the identity in H_HF (without E_X). */
  readonly identityShift: number;
  /** Largest absolute coupling or one-body term; sets tolerances. Never below 1e-300. */
  readonly scale: number;
  readonly exchange: number;
}

/** Mutable arrays a plane axis may overwrite before calling `couplingsFromArrays`. */
export interface CouplingArrays {
  hartree: Float64Array;
  fock: Float64Array;
  eta: Float64Array;
}

/** Couplings arrays of a model (copies; free to modify). */
export function couplingArrays(model: Model): CouplingArrays {
  const hartree = new Float64Array(MATRIX_COUNT);
  const fock = new Float64Array(MATRIX_COUNT);
  const eta = new Float64Array(MATRIX_COUNT);
  for (const name of CHANNELS) {
    const k = channelIndex(name);
    const c = model.channels[name];
    if (c) {
      hartree[k] = c.hartree;
      fock[k] = c.fock;
    }
    eta[k] = model.oneBody[name] ?? 0;
  }
  eta[3] = eta[3]! - model.zeeman / 2;
  eta[12] = eta[12]! - model.valleyZeeman / 2;
  return { hartree, fock, eta };
}

/** Reads E_Z back from one-body coefficients that came from `couplingArrays`. */
export function zeemanOf(c: Pick<Couplings, 'eta'>): number {
  return -2 * c.eta[3]!;
}

/** Reads Delta_V back from one-body coefficients. */
export function valleyZeemanOf(c: Pick<Couplings, 'eta'>): number {
  return -2 * c.eta[12]!;
}

export function couplingsFromArrays(nf: number, arrays: CouplingArrays, exchange = 0): Couplings {
  const { hartree, fock, eta } = arrays;
  const kappa = new Float64Array(MATRIX_COUNT);
  let fockSum = 0;
  let scale = 0;
  for (let k = 1; k < MATRIX_COUNT; k++) {
    fockSum += fock[k]!;
    scale = Math.max(scale, Math.abs(hartree[k]!), Math.abs(fock[k]!), Math.abs(eta[k]!));
  }
  for (let k = 1; k < MATRIX_COUNT; k++) {
    let exchangeSum = 0;
    for (let l = 1; l < MATRIX_COUNT; l++) exchangeSum += fock[l]! * COMMUTATION_SIGN[16 * l + k]!;
    kappa[k] = hartree[k]! - exchangeSum / 4;
  }
  return {
    nf,
    hartree: Float64Array.from(hartree),
    fock: Float64Array.from(fock),
    eta: Float64Array.from(eta),
    kappa,
    c0: (-nf * nf * fockSum) / 8,
    identityShift: eta[0]! - (nf * fockSum) / 4,
    scale: Math.max(scale, 1e-300),
    exchange,
  };
}

export function couplingsOf(model: Model): Couplings {
  return couplingsFromArrays(occupiedCount(model), couplingArrays(model), model.exchange ?? 0);
}

/** Energy per flux quantum (public/notes.html#energy, without the Coulomb constant) from o_ab. */
export function energyOfOrder(c: Couplings, order: ArrayLike<number>): number {
  let e = c.c0 + c.eta[0]! * c.nf;
  for (let k = 1; k < MATRIX_COUNT; k++) {
    const o = order[k]!;
    e += o * (c.eta[k]! + 0.5 * c.kappa[k]! * o);
  }
  return e;
}
