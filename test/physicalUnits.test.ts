import * as mathjs from 'mathjs';
import { describe, expect, test } from 'vitest';
import {
  BOHR_MAGNETON,
  ELEMENTARY_CHARGE,
  REDUCED_PLANCK,
  VACUUM_PERMITTIVITY,
  coulombScaleMeV,
  exchangeEnergyMeV,
  landauLevelMeV,
  landauLevelMixing,
  magneticLength,
  zeemanEnergyMeV,
} from '../solver/index';

type Quantity = mathjs.Unit;

/**
 * A mathjs quantity in `unit`, as a plain number. Energies go to meV through the library's own
 * CODATA 2018 elementary charge: its built-in unit 'eV' is 1.602176565e-19 J (the CODATA 2010
 * value), 4.3e-8 below the exact SI value, so `toNumber('meV')` would carry that offset.
 */
function inUnit(q: unknown, unit: string): number {
  if (unit === 'meV') {
    return (q as Quantity).toNumber('J') / (1e-3 * mathjs.elementaryCharge.toNumber('C'));
  }
  return (q as Quantity).toNumber(unit);
}

/** mathjs 15.2.0 (a general-purpose units library from the npm registry) builds each scale. */
const lib = {
  magneticLength: (b: number) =>
    mathjs.sqrt(
      mathjs.divide(
        mathjs.reducedPlanckConstant,
        mathjs.multiply(mathjs.elementaryCharge, mathjs.unit(b, 'T')),
      ) as Quantity,
    ),
  zeeman: (g: number, bTot: number) =>
    mathjs.multiply(mathjs.multiply(g, mathjs.bohrMagneton), mathjs.unit(bTot, 'T')),
  coulomb: (b: number, eps: number) =>
    mathjs.divide(
      mathjs.multiply(mathjs.elementaryCharge, mathjs.elementaryCharge),
      mathjs.multiply(
        mathjs.multiply(4 * Math.PI * eps, mathjs.electricConstant),
        lib.magneticLength(b),
      ),
    ),
  cyclotron: (b: number, vF: number) =>
    mathjs.divide(
      mathjs.multiply(mathjs.reducedPlanckConstant, mathjs.unit(vF, 'm/s')),
      lib.magneticLength(b),
    ),
};

describe('physical units against mathjs 15.2.0 (CODATA 2018 in both; public/notes.html#checks)', () => {
  test("the library's 'eV' unit is the CODATA 2010 value, 4.3e-8 below CODATA 2018 (why energies convert through e)", () => {
    expect(mathjs.unit(1, 'eV').toNumber('J')).toBe(1.602176565e-19);
    expect(ELEMENTARY_CHARGE / mathjs.unit(1, 'eV').toNumber('J') - 1).toBeCloseTo(4.31e-8, 10);
  });

  test('mu_B, hbar, e and eps0 agree to 12 digits', () => {
    expect(BOHR_MAGNETON / inUnit(mathjs.bohrMagneton, 'J/T')).toBeCloseTo(1, 12);
    expect(REDUCED_PLANCK / inUnit(mathjs.reducedPlanckConstant, 'J s')).toBeCloseTo(1, 12);
    expect(ELEMENTARY_CHARGE / inUnit(mathjs.elementaryCharge, 'C')).toBeCloseTo(1, 12);
    expect(VACUUM_PERMITTIVITY / inUnit(mathjs.electricConstant, 'F/m')).toBeCloseTo(1, 12);
  });

  test('l_B = 25.6556 nm at 1 T (public/notes.html#checks) and as 1/sqrt(B) from the library', () => {
    expect(inUnit(lib.magneticLength(1), 'nm')).toBeCloseTo(25.6556, 4);
    for (const b of [0.5, 1, 9, 31.4]) {
      expect(magneticLength(b) / inUnit(lib.magneticLength(b), 'm')).toBeCloseTo(1, 12);
    }
  });

  test('E_Z = g mu_B B_perp / cos(tilt) in meV, with the library converting J to meV', () => {
    for (const [b, tiltDeg, g] of [
      [1, 0, 2],
      [10, 60, 2],
      [7.5, 33, 1.9],
    ] as const) {
      const tilt = (tiltDeg * Math.PI) / 180;
      const theirs = inUnit(lib.zeeman(g, b / Math.cos(tilt)), 'meV');
      expect(zeemanEnergyMeV(b, tilt, g) / theirs).toBeCloseTo(1, 12);
    }
    // 2 mu_B x 1 T = 0.11577 meV (CODATA 2018 mu_B = 5.7883818060e-5 eV/T, from memory).
    expect(zeemanEnergyMeV(1, 0, 2)).toBeCloseTo(2 * 5.788381806e-2, 9);
  });

  test('Coulomb scale, E_X = sqrt(pi/2) x Coulomb scale, E_1 and the mixing ratio', () => {
    for (const [b, eps] of [
      [1, 1],
      [10, 4],
      [25, 6.6],
    ] as const) {
      const coulomb = inUnit(lib.coulomb(b, eps), 'meV');
      expect(coulombScaleMeV(b, eps) / coulomb).toBeCloseTo(1, 12);
      // Kallin and Halperin, PRB 30, 5655 (1984): E_X = sqrt(pi/2) e^2 / (eps l_B).
      expect(exchangeEnergyMeV(b, eps) / (Math.sqrt(Math.PI / 2) * coulomb)).toBeCloseTo(1, 12);
      const cyclotron = inUnit(lib.cyclotron(b, 1e6), 'meV');
      expect(landauLevelMeV(1, b, 1e6) / (Math.SQRT2 * cyclotron)).toBeCloseTo(1, 12);
      expect(landauLevelMixing(eps, 1e6) / (coulomb / cyclotron)).toBeCloseTo(1, 12);
    }
  });

  test('handbook values: E_1 = 36.3 meV at 1 T (Castro Neto et al., RMP 81, 109 (2009)); e^2/(eps0 l_B) = 56.1 meV at 1 T (from the constants)', () => {
    expect(landauLevelMeV(1, 1, 1e6)).toBeCloseTo(36.3, 1);
    expect(coulombScaleMeV(1, 1)).toBeCloseTo(56.13, 2);
    // The mixing ratio is the effective fine-structure constant e^2/(4 pi eps0 eps_r hbar v_F),
    // 2.19 for suspended graphene at v_F = 1e6 m/s (alpha c / v_F, alpha = 1/137.036, common practice).
    expect(landauLevelMixing(1, 1e6)).toBeCloseTo(299792458 / 137.035999 / 1e6, 6);
  });
});
