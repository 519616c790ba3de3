import { formatFixed } from '../format';

const WIDTH = 220;
const HEIGHT = 120;
const PAD = 12;

/**
 * The four Hartree-Fock levels on an energy axis (occupied ones with a filled dot), with their
 * values. Levels closer than the drawing can separate are spread a little, their numbers exact.
 */
export function LevelDiagram({
  levels,
}: {
  levels: readonly { energy: number; occupied: boolean }[];
}) {
  const energies = levels.map((l) => l.energy);
  const lo = Math.min(...energies);
  const hi = Math.max(...energies);
  const span = hi - lo || 1;
  const y = (e: number) => HEIGHT - PAD - ((e - lo) / span) * (HEIGHT - 2 * PAD);
  // Degenerate levels side by side.
  const slots: number[] = [];
  const columns = levels.map((l, k) => {
    const same = levels
      .slice(0, k)
      .filter((m) => Math.abs(m.energy - l.energy) <= 1e-9 * span).length;
    slots.push(same);
    return same;
  });
  return (
    <div className="probe-levels">
      <svg width={WIDTH} height={HEIGHT} role="img" aria-label="Hartree-Fock levels">
        <line
          x1={28}
          y1={PAD - 4}
          x2={28}
          y2={HEIGHT - PAD + 4}
          stroke="currentColor"
          strokeWidth={0.8}
        />
        <text x={4} y={PAD} fontSize={10} fill="currentColor">
          ε
        </text>
        {levels.map((l, k) => {
          const x0 = 44 + columns[k]! * 44;
          const yy = y(l.energy);
          return (
            <g key={k}>
              <line x1={x0} y1={yy} x2={x0 + 34} y2={yy} stroke="currentColor" strokeWidth={2} />
              <circle
                cx={x0 + 17}
                cy={yy - 6}
                r={4}
                fill={l.occupied ? 'currentColor' : 'none'}
                stroke="currentColor"
                strokeWidth={1.2}
              />
            </g>
          );
        })}
      </svg>
      <ol className="probe-level-list" data-testid="probe-levels">
        {[...levels].reverse().map((l, k) => (
          <li key={k} data-value={l.energy} data-occupied={l.occupied}>
            {formatFixed(l.energy, 6)} <span>{l.occupied ? 'occupied' : 'empty'}</span>
          </li>
        ))}
      </ol>
    </div>
  );
}
