/** What a Hartree-Fock answer does and does not say; shown wherever results are shown. */
export function MeanFieldCautions() {
  return (
    <aside className="cautions" aria-label="Mean-field cautions">
      <p>
        These are mean-field (Hartree-Fock) results. They leave out Landau-level mixing, disorder,
        textures at finite wavevector such as skyrmions, and quantum fluctuations.
      </p>
      <p>
        The quasiparticle gap is an upper estimate: gaps measured in transport are usually smaller.
        The couplings are inputs to a model, not measured constants of a sample.
      </p>
      <p>
        The Goldstone count is the number of zero-frequency mode pairs at q = 0, which can differ
        from the number of broken symmetry generators.
      </p>
    </aside>
  );
}
