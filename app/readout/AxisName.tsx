/** Typeset name of a plane axis from its model-file label (u_perp, u_z, E_Z, Delta_V, u_xy). */
export function AxisName({ label }: { label: string }) {
  if (label === 'u_perp')
    return (
      <>
        u<sub>⊥</sub>
      </>
    );
  if (label === 'Delta_V')
    return (
      <>
        Δ<sub>V</sub>
      </>
    );
  const m = /^([A-Za-z])_([A-Za-z0-9]+)$/.exec(label);
  if (m)
    return (
      <>
        {m[1]}
        <sub>{m[2]}</sub>
      </>
    );
  return <>{label || 'axis'}</>;
}
