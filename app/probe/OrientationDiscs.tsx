import type { ProbeReport } from '../../solver/index';
import { formatDegrees, formatFixed } from '../format';

const DEGREES = 180 / Math.PI;
/** Below this length a vector has no direction to draw or to quote. */
const NO_DIRECTION = 1e-9;
const R = 34;
const SIZE = 2 * R + 16;

interface DiscProps {
  readonly testId: string;
  readonly title: string;
  /** Vector (x, y, z), z along the disc's vertical axis. */
  readonly vector: readonly number[];
  readonly up: string;
  readonly down: string;
  readonly colour: string;
}

/**
 * A vector drawn in the plane that holds it and the vertical axis (the field, or tau_z): the
 * disc is that cut through the sphere of radius 1; the arrow's length is the vector's length.
 */
function Disc({ testId, title, vector, up, down, colour }: DiscProps) {
  const [x, y, z] = vector as [number, number, number];
  const across = Math.hypot(x, y);
  const length = Math.hypot(across, z);
  const directed = length > NO_DIRECTION;
  // Angles only where the vector has a direction: a zero vector has no polar angle, a vector
  // along the axis no azimuth. The data attributes are left out rather than set to NaN.
  const polar = directed ? Math.atan2(across, z) : undefined;
  const azimuth = across > NO_DIRECTION ? Math.atan2(y, x) : undefined;
  const c = R + 8;
  const tx = c + R * across;
  const ty = c - R * z;
  return (
    <figure
      className="probe-disc"
      data-testid={testId}
      data-length={length}
      data-direction={directed ? 'some' : 'none'}
      data-polar={polar}
      data-cos={directed ? z / length : undefined}
    >
      <svg
        width={SIZE}
        height={SIZE + 4}
        role="img"
        aria-label={directed ? title : `${title}: zero, no direction`}
      >
        <circle cx={c} cy={c} r={R} fill="none" stroke="currentColor" strokeOpacity={0.35} />
        <line
          x1={c}
          y1={c - R - 4}
          x2={c}
          y2={c + R + 4}
          stroke="currentColor"
          strokeOpacity={0.35}
          strokeDasharray="3 3"
        />
        <text x={c + 4} y={10} fontSize={9} fill="currentColor">
          {up}
        </text>
        <text x={c + 4} y={SIZE + 2} fontSize={9} fill="currentColor">
          {down}
        </text>
        {length > 1e-6 && (
          <>
            <line x1={c} y1={c} x2={tx} y2={ty} stroke={colour} strokeWidth={2.4} />
            <circle cx={tx} cy={ty} r={3.2} fill={colour} />
          </>
        )}
      </svg>
      <figcaption>
        <strong>{title}</strong>
        <span>|v| = {formatFixed(length, 4)}</span>
        <span data-testid={`${testId}-direction`}>
          {polar === undefined
            ? 'no direction (zero vector)'
            : `θ = ${formatFixed(polar * DEGREES, 2)}° (cos θ = ${formatFixed(z / length, 4)})`}
        </span>
        {azimuth !== undefined && <span>φ = {formatDegrees(azimuth, 1)}°</span>}
      </figcaption>
    </figure>
  );
}

/**
 * Spin on each sublattice (angle to the field: the canting angle of a CAF) and the valley
 * pseudospin of each spin species along the field (tau_z up = sublattice A, in-plane = bond
 * order). The spin is <sigma> = (o_0b +- o_zb) / 2, in units of hbar/2 (length 1 for one fully
 * polarised electron); the pseudospin (o_a0 +- o_az) / 2.
 */
export function OrientationDiscs({ report }: { report: ProbeReport }) {
  const { a, b } = report.sublattices;
  const { up, down } = report.valleyBySpin;
  return (
    <>
      <div className="probe-discs">
        <Disc
          testId="probe-spin-a"
          title="Spin on A (K)"
          vector={a.spin}
          up="field"
          down=""
          colour="#3b6a9e"
        />
        <Disc
          testId="probe-spin-b"
          title="Spin on B (K′)"
          vector={b.spin}
          up="field"
          down=""
          colour="#c9813f"
        />
        <Disc
          testId="probe-valley-up"
          title={`Valley, spin ↑ (${formatFixed(up.weight, 3)} e)`}
          vector={up.pseudospin}
          up="A (K)"
          down="B (K′)"
          colour="#4b8a6f"
        />
        <Disc
          testId="probe-valley-down"
          title={`Valley, spin ↓ (${formatFixed(down.weight, 3)} e)`}
          vector={down.pseudospin}
          up="A (K)"
          down="B (K′)"
          colour="#8a5b86"
        />
      </div>
      <p className="probe-note">
        Spin is ⟨σ⟩, in units of ħ/2: length 1 for one fully polarised electron. θ is measured from
        the vertical axis (the field for spin, τ<sub>z</sub> for valley); φ is the direction across
        it, fixed only up to the rotations the state breaks. A zero vector has no direction.
        {report.bonds.amplitude > 1e-6 &&
          ` Kekulé amplitude |o_x0 + i o_y0| = ${formatFixed(report.bonds.amplitude, 4)}, phase ${formatDegrees(report.bonds.phase, 1)}°.`}
      </p>
    </>
  );
}
