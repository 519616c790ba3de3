/**
 * The example model of the interface notes: nu = 0, uPerp = -1, uZ = 2 (H = F), E_Z = 0.4.
 * Its ground state is the canted antiferromagnet with E = -2.02 (closed form of model.md
 * section 5, after Phys. Rev. B 85, 155439 (2012)). Kept as text so it reads as written there.
 */
export const EXAMPLE_MODEL_TEXT = `{
  "filling": 0,
  "channels": {
    "x0": { "hartree": -1.0, "fock": -1.0 },
    "y0": { "hartree": -1.0, "fock": -1.0 },
    "z0": { "hartree":  2.0, "fock":  2.0 }
  },
  "zeeman": 0.4,
  "valleyZeeman": 0.0
}
`;
