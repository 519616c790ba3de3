import type { SolveJson } from '../../workers/solveClient';
import { formatFixed } from '../format';
import { OrderTable } from './OrderTable';

interface ProbeResultProps {
  result: SolveJson;
}

/** The solved ground state of one point: label, energy, gap, collective modes, order. */
export function ProbeResult({ result }: ProbeResultProps) {
  const modes = result.modes.map((omega) => formatFixed(omega, 4)).join(', ');
  return (
    <div className="probe-result" data-testid="result">
      <p className="phase-label">
        <span className="phase-caption">Phase</span>
        <span data-testid="phase">{result.phase}</span>
      </p>
      <dl className="figures">
        <div>
          <dt>Energy per flux quantum</dt>
          <dd data-testid="energy">{formatFixed(result.energy, 6)}</dd>
        </div>
        <div>
          <dt>Quasiparticle gap</dt>
          <dd data-testid="gap">{formatFixed(result.gap, 6)}</dd>
        </div>
        <div>
          <dt>Goldstone modes</dt>
          <dd data-testid="goldstone">{result.goldstone}</dd>
        </div>
        <div>
          <dt>Mode frequencies ω at q = 0</dt>
          <dd data-testid="modes">{modes === '' ? 'none' : modes}</dd>
        </div>
      </dl>
      <OrderTable order={result.order} />
    </div>
  );
}
