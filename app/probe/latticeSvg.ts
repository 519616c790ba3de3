import type { ProbeReport } from '../../solver/index';
import { xmlText } from '../figure/xmlText';
import { formatDegrees } from '../format';
import { latticePicture, type LatticeBond, type LatticeSite } from './latticePicture';

/** Pixels per carbon-carbon distance. */
const SCALE = 44;
const MARGIN = 14;
const LEGEND_LINE = 15;

export const LATTICE_COLOURS = {
  siteA: '#3b6a9e',
  siteB: '#c9813f',
  bondStrong: '#23282e',
  bondWeak: '#b7bcc2',
  bondPlain: '#8d939a',
  spinUp: '#3b6a9e',
  spinDown: '#c9813f',
  arrow: '#1d2126',
  cell: '#6d737a',
  spinAcrossBond: '#7d4a9a',
} as const;

/** Longest arrow of a bond's in-plane spin, pixels (less than half a bond, clear of the sites). */
const BOND_ARROW = 20;

function n(x: number): string {
  return Number(x.toFixed(2)).toString();
}

function fixed(x: number, digits = 3): string {
  const v = Math.abs(x) < 0.5 * 10 ** -digits ? 0 : x;
  return v.toFixed(digits);
}

function bondSvg(b: LatticeBond, max: number, spinResolved: boolean, px: Px): string {
  const [x1, y1] = px(b.x1, b.y1);
  const [x2, y2] = px(b.x2, b.y2);
  const width = (m: number, base: number, span: number) =>
    max > 0 ? base + (span * m) / max : base;
  if (!spinResolved) {
    const colour =
      max === 0
        ? LATTICE_COLOURS.bondPlain
        : b.modulation >= 0
          ? LATTICE_COLOURS.bondStrong
          : LATTICE_COLOURS.bondWeak;
    return `<line x1="${n(x1)}" y1="${n(y1)}" x2="${n(x2)}" y2="${n(y2)}" stroke="${colour}" stroke-width="${n(width(b.modulation, 3.2, 2.6))}" stroke-linecap="round" data-class="${b.bondClass}"/>`;
  }
  // Spin bond order: one stroke per spin along the field, offset across the bond.
  const len = Math.hypot(x2 - x1, y2 - y1);
  const ox = (-(y2 - y1) / len) * 2.2;
  const oy = ((x2 - x1) / len) * 2.2;
  return ([0, 1] as const)
    .map((s) => {
      const sign = s === 0 ? 1 : -1;
      const colour = s === 0 ? LATTICE_COLOURS.spinUp : LATTICE_COLOURS.spinDown;
      const w = Math.max(0.3, width(b.bySpin[s], 1.8, 1.5));
      return `<line x1="${n(x1 + sign * ox)}" y1="${n(y1 + sign * oy)}" x2="${n(x2 + sign * ox)}" y2="${n(y2 + sign * oy)}" stroke="${colour}" stroke-width="${n(w)}" stroke-linecap="round" data-class="${b.bondClass}" data-spin="${s === 0 ? 'up' : 'down'}"/>`;
    })
    .join('');
}

type Px = (x: number, y: number) => [number, number];

/**
 * A bond's in-plane spin modulation (SBxy) as a thin arrow with an open head, centred on the
 * bond's midpoint, length by its size (largest = BOND_ARROW); screen y points down.
 */
function bondSpinArrow(cx: number, cy: number, sx: number, sy: number, length: number): string {
  const size = Math.hypot(sx, sy);
  const ux = sx / size;
  const uy = -sy / size;
  const tx = cx + (ux * length) / 2;
  const ty = cy + (uy * length) / 2;
  const head = Math.min(4, length / 2);
  const shaft = `M${n(cx - (ux * length) / 2)},${n(cy - (uy * length) / 2)}L${n(tx)},${n(ty)}`;
  const tip =
    `M${n(tx - ux * head - uy * head * 0.7)},${n(ty - uy * head + ux * head * 0.7)}` +
    `L${n(tx)},${n(ty)}L${n(tx - ux * head + uy * head * 0.7)},${n(ty - uy * head - ux * head * 0.7)}`;
  return `<path d="${shaft}${tip}" fill="none" stroke="${LATTICE_COLOURS.spinAcrossBond}" stroke-width="1.4" stroke-linecap="round" stroke-linejoin="round"`;
}

function bondSpinSvg(b: LatticeBond, max: number, px: Px): string {
  const [sx, sy] = b.spinAcross;
  const size = Math.hypot(sx, sy);
  if (max <= 0 || size < 1e-3 * max) return '';
  const [cx, cy] = px((b.x1 + b.x2) / 2, (b.y1 + b.y2) / 2);
  return `${bondSpinArrow(cx, cy, sx, sy, (BOND_ARROW * size) / max)} data-class="${b.bondClass}" data-bond-spin="${n(sx)},${n(sy)}"/>`;
}

function siteSvg(s: LatticeSite, nf: number, px: Px): string {
  const [x, y] = px(s.x, s.y);
  const full = Math.min(2, nf);
  const r = 3.5 + (8.5 * Math.max(0, s.charge)) / full;
  const fill = s.sublattice === 'A' ? LATTICE_COLOURS.siteA : LATTICE_COLOURS.siteB;
  const parts = [
    `<circle cx="${n(x)}" cy="${n(y)}" r="${n(r)}" fill="${fill}" stroke="#ffffff" stroke-width="1.2" data-sublattice="${s.sublattice}"/>`,
  ];
  const [sx, sy, sz] = s.spin as [number, number, number];
  const inPlane = Math.hypot(sx, sy);
  if (inPlane > 1e-3) {
    // In-plane spin (perpendicular to the field) as an arrow; screen y points down.
    const L = 26 * inPlane;
    const ux = sx / inPlane;
    const uy = -sy / inPlane;
    const tx = x + ux * L;
    const ty = y + uy * L;
    const head = 5;
    const hx1 = tx - ux * head - uy * head * 0.6;
    const hy1 = ty - uy * head + ux * head * 0.6;
    const hx2 = tx - ux * head + uy * head * 0.6;
    const hy2 = ty - uy * head - ux * head * 0.6;
    parts.push(
      `<line x1="${n(x)}" y1="${n(y)}" x2="${n(tx)}" y2="${n(ty)}" stroke="${LATTICE_COLOURS.arrow}" stroke-width="1.6"/>`,
      `<path d="M${n(tx)},${n(ty)}L${n(hx1)},${n(hy1)}L${n(hx2)},${n(hy2)}Z" fill="${LATTICE_COLOURS.arrow}"/>`,
    );
  }
  if (Math.abs(sz) > 1e-3) {
    // Component along the field (out of the page): a dot for along, a cross for against.
    const rr = 2 + 3.5 * Math.min(1, Math.abs(sz));
    parts.push(
      `<circle cx="${n(x)}" cy="${n(y)}" r="${n(rr)}" fill="#ffffff" stroke="${LATTICE_COLOURS.arrow}" stroke-width="1"/>`,
    );
    if (sz > 0) {
      parts.push(
        `<circle cx="${n(x)}" cy="${n(y)}" r="${n(rr * 0.35)}" fill="${LATTICE_COLOURS.arrow}"/>`,
      );
    } else {
      const d = rr * 0.6;
      parts.push(
        `<path d="M${n(x - d)},${n(y - d)}L${n(x + d)},${n(y + d)}M${n(x - d)},${n(y + d)}L${n(x + d)},${n(y - d)}" stroke="${LATTICE_COLOURS.arrow}" stroke-width="1"/>`,
      );
    }
  }
  return parts.join('');
}

type KeyMark = 'A' | 'B' | 'cell' | 'bondSpin';

/** Width taken by a key line's mark before its text. */
const KEY_MARK_WIDTH = 16;

/** One line of the key at baseline `y`, with its mark (a site's colour, the cell's dash). */
function keyLine(line: string | { text: string; mark: KeyMark }, y: number): string {
  if (typeof line === 'string') return `<text x="${MARGIN}" y="${n(y)}">${xmlText(line)}</text>`;
  const middle = y - 4;
  const mark =
    line.mark === 'cell'
      ? `<path d="M${MARGIN},${n(middle)}h12" stroke="${LATTICE_COLOURS.cell}" stroke-width="1" stroke-dasharray="4 3" data-key="cell"/>`
      : line.mark === 'bondSpin'
        ? `${bondSpinArrow(MARGIN + 6, middle, 1, 0, 12)} data-key="bondSpin"/>`
        : `<circle cx="${MARGIN + 5}" cy="${n(middle)}" r="4.5" fill="${line.mark === 'A' ? LATTICE_COLOURS.siteA : LATTICE_COLOURS.siteB}" data-key="${line.mark}"/>`;
  return `${mark}<text x="${MARGIN + KEY_MARK_WIDTH}" y="${n(y)}">${xmlText(line.text)}</text>`;
}

/**
 * The Probe's lattice picture as a standalone SVG 1.1 document: sites sized by their charge,
 * bonds drawn by their Kekule modulation (two strokes, one per spin along the field, where spin
 * bond order along the field is present; a thin open arrow on each bond for its spin across the
 * field, where in-plane spin bond order is present), spin arrows in the plane perpendicular to the field and dot / cross
 * marks for the component along it, one enlarged cell outlined, and a few lines of numbers.
 * Pure: the app shows it inline and exports the same text.
 */
export function latticeSvg(report: ProbeReport, title?: string): string {
  const pic = latticePicture(report);
  const width = 2 * pic.halfWidth * SCALE + 2 * MARGIN;
  const plotHeight = 2 * pic.halfHeight * SCALE + 2 * MARGIN;
  const px: Px = (x, y) => [
    MARGIN + (x + pic.halfWidth) * SCALE,
    MARGIN + (pic.halfHeight - y) * SCALE,
  ];
  const spinBond = report.state.order;
  const spinResolved =
    Math.hypot(spinBond['xz'] ?? 0, spinBond['yz'] ?? 0) > 1e-6 && pic.maxModulation > 1e-9;
  const spinAcross = pic.maxSpinAcross > 1e-9;
  const { a, b } = report.sublattices;
  const vec = (v: readonly number[]) => `(${v.map((x) => fixed(x)).join(', ')})`;
  const strengths = report.bonds.strengths.map((s) => fixed(s)).join(', ');
  // Lines of the key, some with a mark drawn before them: a site of sublattice A or B in its
  // colour, or a piece of the dashed cell outline.
  const legend: (string | { text: string; mark: KeyMark })[] = [
    `${title ? `${title}: ` : ''}${report.state.phase}`,
    { text: `A (K): charge ${fixed(a.charge)}, spin ⟨σ⟩ ${vec(a.spin)}`, mark: 'A' },
    { text: `B (K'): charge ${fixed(b.charge)}, spin ⟨σ⟩ ${vec(b.spin)}`, mark: 'B' },
    {
      text: 'Dashed: one cell of the Kekule order (three graphene cells, six sites)',
      mark: 'cell',
    },
    ...(pic.maxModulation > 1e-9
      ? [
          `Bond classes 0, 1, 2: ${strengths}` +
            (Number.isNaN(report.bonds.phase)
              ? ''
              : ` (Kekule phase ${formatDegrees(report.bonds.phase, 1)} deg)`),
          spinResolved
            ? 'Bonds: one stroke per spin (up blue, down orange), wide = strong'
            : 'Bonds: dark and wide = strong, light and thin = weak',
        ]
      : [
          spinAcross
            ? 'No charge bond order: all bonds equal in width'
            : 'No bond order: all bonds equal',
        ]),
    ...(spinAcross
      ? [
          {
            text: 'Bond arrows: spin across the field (in-plane spin bond order)',
            mark: 'bondSpin' as const,
          },
        ]
      : []),
    spinAcross ? 'Site arrows: spin across the field' : 'Arrows: spin across the field',
    'Dot / cross: spin along / against the field (out of the page)',
  ];
  const height = plotHeight + legend.length * LEGEND_LINE + 8;
  const [cx0, cy0] = px(pic.cell[0]![0], pic.cell[0]![1]);
  const cellPath =
    `M${n(cx0)},${n(cy0)}` +
    pic.cell
      .slice(1)
      .map(([x, y]) => {
        const [X, Y] = px(x, y);
        return `L${n(X)},${n(Y)}`;
      })
      .join('') +
    'Z';
  const body = [
    `<rect width="${n(width)}" height="${n(height)}" fill="#ffffff"/>`,
    `<g class="bonds">${pic.bonds.map((bd) => bondSvg(bd, pic.maxModulation, spinResolved, px)).join('')}</g>`,
    `<path d="${cellPath}" fill="none" stroke="${LATTICE_COLOURS.cell}" stroke-width="1" stroke-dasharray="4 3"/>`,
    `<g class="sites">${pic.sites.map((s) => siteSvg(s, pic.nf, px)).join('')}</g>`,
    ...(spinAcross
      ? [
          `<g class="bond-spins">${pic.bonds.map((bd) => bondSpinSvg(bd, pic.maxSpinAcross, px)).join('')}</g>`,
        ]
      : []),
    `<g font-family="Helvetica, Arial, sans-serif" font-size="11" fill="#24272b">${legend
      .map((line, k) => keyLine(line, plotHeight + 4 + (k + 0.8) * LEGEND_LINE))
      .join('')}</g>`,
  ];
  return (
    `<?xml version="1.0" encoding="UTF-8"?>\n` +
    `<svg xmlns="http://www.w3.org/2000/svg" version="1.1" width="${n(width)}" height="${n(height)}" viewBox="0 0 ${n(width)} ${n(height)}">` +
    `<title>Fourfold Probe lattice picture: ${xmlText(report.state.phase)}</title>` +
    body.join('') +
    `</svg>\n`
  );
}
