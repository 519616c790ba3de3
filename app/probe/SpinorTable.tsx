import type { ProbeReport } from '../../solver/index';
import { formatDegrees, formatFixed } from '../format';

const FLAVOURS = ['K↑', 'K↓', 'K′↑', 'K′↓'];

/**
 * The occupied spinors in the flavour basis of public/notes.html#basis (canonical gauge:
 * Hartree-Fock eigenvectors, largest component real and positive), each amplitude as modulus and
 * phase, the spin-valley entanglement entropy, and the projector P.
 */
export function SpinorTable({ report }: { report: ProbeReport }) {
  const p = report.state.projector;
  return (
    <>
      <table className="probe-table probe-spinor-table">
        <thead>
          <tr>
            <th scope="col">Level</th>
            {FLAVOURS.map((f) => (
              <th key={f} scope="col">
                {f}
              </th>
            ))}
            <th scope="col" title="Spin-valley entanglement entropy, bits (0 for a product state)">
              S (bits)
            </th>
          </tr>
        </thead>
        <tbody>
          {report.spinors.map((s, k) => (
            <tr key={k} data-testid={`probe-spinor-${k}`} data-entropy={s.entropy}>
              <td>{formatFixed(s.level, 4)}</td>
              {s.modulus.map((m, r) => {
                const angle = formatDegrees(s.phase[r]!, 1);
                return (
                  <td key={r} data-modulus={m} data-phase={s.phase[r]}>
                    {m < 5e-7 ? (
                      '0'
                    ) : (
                      <>
                        {formatFixed(m, 4)}
                        {angle !== '0' && <span className="probe-phase-angle"> ∠{angle}°</span>}
                      </>
                    )}
                  </td>
                );
              })}
              <td>{formatFixed(s.entropy, 4)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="probe-note">
        Each amplitude is its modulus and phase ∠, in degrees from −180 (excluded) to 180. Within a
        degenerate level the spinors are one basis of many; the entropy refers to this one
        (Hartree-Fock eigenvectors in reduced row-echelon form).
      </p>
      <details className="probe-projector">
        <summary>Projector P onto the occupied spinors</summary>
        <table className="probe-table" data-testid="probe-projector">
          <thead>
            <tr>
              <th />
              {FLAVOURS.map((f) => (
                <th key={f} scope="col">
                  {f}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {p.re.map((row, i) => (
              <tr key={i}>
                <th scope="row">{FLAVOURS[i]}</th>
                {row.map((re, j) => {
                  const im = p.im[i]![j]!;
                  return (
                    <td key={j}>
                      {formatFixed(re, 3)}
                      {Math.abs(im) >= 5e-4 &&
                        `${im < 0 ? ' − ' : ' + '}${formatFixed(Math.abs(im), 3)}i`}
                    </td>
                  );
                })}
              </tr>
            ))}
          </tbody>
        </table>
      </details>
    </>
  );
}
