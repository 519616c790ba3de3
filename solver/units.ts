/**
 * Physical scales of the n = 0 Landau level (public/notes.html#units). SI constants are the CODATA
 * 2018 recommended values (E. Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)); e, hbar follow
 * from the exact SI definitions of 2019.
 */
export const ELEMENTARY_CHARGE = 1.602176634e-19; // C, exact
/** Planck constant h, exact in the SI since 2019. */
export const PLANCK = 6.62607015e-34; // J s
export const REDUCED_PLANCK = PLANCK / (2 * Math.PI); // J s
export const BOHR_MAGNETON = 9.2740100783e-24; // J / T
export const VACUUM_PERMITTIVITY = 8.8541878128e-12; // F / m
/** Joules per milli-electronvolt. */
export const JOULE_PER_MEV = ELEMENTARY_CHARGE * 1e-3;

/** Magnetic length l_B = sqrt(hbar / (e B_perp)), metres, for B_perp in tesla. */
export function magneticLength(bPerpTesla: number): number {
  return Math.sqrt(REDUCED_PLANCK / (ELEMENTARY_CHARGE * bPerpTesla));
}

/** Coulomb scale e^2 / (4 pi eps0 eps_r l_B) in meV. */
export function coulombScaleMeV(bPerpTesla: number, relativePermittivity: number): number {
  const joules =
    (ELEMENTARY_CHARGE * ELEMENTARY_CHARGE) /
    (4 * Math.PI * VACUUM_PERMITTIVITY * relativePermittivity * magneticLength(bPerpTesla));
  return joules / JOULE_PER_MEV;
}

/**
 * Exchange energy of a filled n = 0 level, E_X = sqrt(pi/2) e^2 / (4 pi eps0 eps_r l_B), in meV
 * (C. Kallin and B. I. Halperin, Phys. Rev. B 30, 5655 (1984)).
 */
export function exchangeEnergyMeV(bPerpTesla: number, relativePermittivity: number): number {
  return Math.sqrt(Math.PI / 2) * coulombScaleMeV(bPerpTesla, relativePermittivity);
}

/** Full Zeeman splitting E_Z = g mu_B B_tot in meV, B_tot = B_perp / cos(tilt). */
export function zeemanEnergyMeV(bPerpTesla: number, tiltRadians: number, gFactor = 2): number {
  return (gFactor * BOHR_MAGNETON * (bPerpTesla / Math.cos(tiltRadians))) / JOULE_PER_MEV;
}

/**
 * Graphene Landau level E_n = sgn(n) sqrt(2 |n|) hbar v_F / l_B in meV (A. H. Castro Neto et al.,
 * Rev. Mod. Phys. 81, 109 (2009)); v_F in m/s.
 */
export function landauLevelMeV(n: number, bPerpTesla: number, fermiVelocity = 1e6): number {
  const cyclotron = (REDUCED_PLANCK * fermiVelocity) / magneticLength(bPerpTesla);
  return (Math.sign(n) * Math.sqrt(2 * Math.abs(n)) * cyclotron) / JOULE_PER_MEV;
}

/** Landau-level mixing ratio (e^2 / 4 pi eps0 eps_r l_B) / (hbar v_F / l_B). */
export function landauLevelMixing(relativePermittivity: number, fermiVelocity = 1e6): number {
  return (
    (ELEMENTARY_CHARGE * ELEMENTARY_CHARGE) /
    (4 * Math.PI * VACUUM_PERMITTIVITY * relativePermittivity * REDUCED_PLANCK * fermiVelocity)
  );
}
