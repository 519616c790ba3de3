import { zeroChannels, type Setup } from './setup';

/**
 * The scenario shown on first load: an invented dimensionless model of our own, not taken from
 * any paper. nu = 0 in the (uPerp, uZ) plane, with Hartree couplings 1.2 x Fock for uPerp and
 * 0.7 x Fock for uZ, at E_Z = 0.6: six regions show (F, CAF, KD, CDW, in-plane spin bond order
 * SBxy and the coexistence region CDW+SBxy), with both first-order and continuous boundaries.
 */
export const DEMO_SETUP: Setup = {
  filling: 0,
  channels: zeroChannels(),
  zeeman: 0.6,
  valleyZeeman: 0,
  ratios: { uPerp: 1.2, uZ: 0.7 },
  x: { quantity: 'uPerp', from: -2, to: 2, hartreeRatio: 1 },
  y: { quantity: 'uZ', from: -2, to: 2, hartreeRatio: 1 },
  resolution: [256, 256],
};
