import type { Couplings } from './couplings';

/**
 * Continuous symmetries of a model in the diagonal form E = c0 + eta.o + 1/2 sum kappa o^2
 * (see couplings.ts). A rotation about the field mixes (o_ax, o_ay) for every valley letter a,
 * so it is a symmetry when kappa_ax = kappa_ay and eta_ax = eta_ay = 0; valley rotation about
 * tau_z likewise mixes (o_xb, o_yb). Full spin SU(2) needs every spin letter alike and no spin
 * one-body term.
 */
export interface ModelSymmetry {
  readonly spinRotationAboutField: boolean;
  readonly spinIsotropic: boolean;
  readonly valleyRotation: boolean;
}

function close(a: number, b: number, scale: number): boolean {
  return Math.abs(a - b) <= 1e-12 * scale;
}

export function modelSymmetry(c: Couplings): ModelSymmetry {
  const { kappa, eta, scale } = c;
  let spinRotationAboutField = true;
  let spinIsotropic = true;
  let valleyRotation = true;
  for (let a = 0; a < 4; a++) {
    const x = 4 * a + 1;
    const y = 4 * a + 2;
    const z = 4 * a + 3;
    {
      if (!close(kappa[x]!, kappa[y]!, scale) || eta[x] !== 0 || eta[y] !== 0) {
        spinRotationAboutField = false;
      }
      if (
        !close(kappa[x]!, kappa[z]!, scale) ||
        !close(kappa[x]!, kappa[y]!, scale) ||
        eta[z] !== 0
      ) {
        spinIsotropic = false;
      }
    }
  }
  spinIsotropic = spinIsotropic && spinRotationAboutField;
  for (let b = 0; b < 4; b++) {
    const x = 4 + b;
    const y = 8 + b;
    if (!close(kappa[x]!, kappa[y]!, scale) || eta[x] !== 0 || eta[y] !== 0) valleyRotation = false;
  }
  return { spinRotationAboutField, spinIsotropic, valleyRotation };
}
