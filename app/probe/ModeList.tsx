import type { ProbeReport } from '../../solver/index';
import { formatFixed } from '../format';

/**
 * The q = 0 collective modes (public/notes.html#modes): every frequency, the Goldstone count, and
 * the broken symmetry each gapless mode belongs to.
 */
export function ModeList({ report }: { report: ProbeReport }) {
  const { frequencies, goldstone, gapless, unexplained, symmetries } = report.modes;
  return (
    <>
      <p>
        <strong data-testid="probe-goldstone" data-value={goldstone}>
          {goldstone}
        </strong>{' '}
        gapless (Goldstone) {goldstone === 1 ? 'pair' : 'pairs'} of {frequencies.length}.
      </p>
      <ol className="probe-mode-list" data-testid="probe-modes">
        {frequencies.map((w, k) => (
          <li key={k} data-value={w}>
            ω = {formatFixed(w, 6)}
            {k < goldstone && gapless[k] && (
              <span className="probe-mode-symmetry">
                {' '}
                — {gapless[k]!.symmetry}
                {gapless[k]!.kind === 'paired' && ' (two generators, one pair)'}
              </span>
            )}
            {k < goldstone && !gapless[k] && (
              <span className="probe-mode-symmetry"> — no symmetry of the model (accidental)</span>
            )}
          </li>
        ))}
      </ol>
      <p className="probe-note">
        Symmetries of this model among the 15 rotations exp(iθ τ<sub>a</sub>σ<sub>b</sub>):{' '}
        {symmetries.length === 0 ? 'none' : symmetries.join(', ')}.
        {unexplained > 0 &&
          ` ${unexplained} zero-frequency ${unexplained === 1 ? 'pair is' : 'pairs are'} not accounted for by a broken symmetry: a degenerate family of states (as at ν = ±1 with H = F) or a point on a continuous transition.`}{' '}
        The count is of zero-frequency pairs, which can be fewer than the broken generators (a
        ferromagnet without Zeeman energy has one pair for two).
      </p>
    </>
  );
}
