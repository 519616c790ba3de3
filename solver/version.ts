/** Software version written into every exported result (kept equal to package.json). */
export const SOFTWARE_VERSION = '0.1.0';

/**
 * The mean-field caution (README, Mean-field cautions), shown with results and embedded in exported
 * data.
 */
export const MEAN_FIELD_CAUTION =
  'Mean-field (Hartree-Fock) result for uniform states. It neglects Landau-level mixing, ' +
  'disorder, finite-wavevector textures such as skyrmions, and quantum fluctuations. The ' +
  'quasiparticle gap overestimates transport gaps. Coupling values are model inputs, not ' +
  'measured constants.';
