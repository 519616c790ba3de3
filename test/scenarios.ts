/** Scenario files shared by the unit and browser tests (not a test file itself). */

/**
 * The model of README's first command (`public/examples/sample.json`) with a plane whose axes
 * set only the Fock parts, as a hand-written file might: x0, y0 and z0 keep their Hartree parts.
 */
export const FOCK_ONLY_SCENARIO = {
  filling: 0,
  channels: {
    x0: { hartree: -0.8, fock: -1 },
    y0: { hartree: -0.8, fock: -1 },
    z0: { fock: 1.5 },
  },
  zeeman: 0.5,
  valleyZeeman: 0.1,
  plane: {
    x: { label: 'u_perp', from: -2, to: 2, targets: { 'x0.fock': 1, 'y0.fock': 1 } },
    y: { label: 'u_z', from: -2, to: 2, targets: { 'z0.fock': 1 } },
    resolution: [128, 128] as [number, number],
  },
};
