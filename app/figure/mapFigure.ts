import type { PhaseMap } from '../../solver/index';
import { legendOf, MEAN_FIELD_CAUTION } from '../../solver/index';
import { labelColours } from './palette';

/** Escapes text for SVG. */
function esc(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

function fmt(v: number): string {
  return Number(v.toFixed(3)).toString();
}

function ticks(from: number, to: number, count: number): number[] {
  const lo = Math.min(from, to);
  const hi = Math.max(from, to);
  const raw = (hi - lo) / count;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? raw;
  const out: number[] = [];
  for (let v = Math.ceil(lo / step) * step; v <= hi + 1e-12 * step; v += step)
    out.push(Number(v.toPrecision(12)));
  return out;
}

/**
 * A plain SVG figure of a Map (pure string function, shared by the CLI and the app): regions as
 * rectangles merged along rows, composite labels striped with their tokens' colours, refined
 * boundaries (first order solid, continuous dashed), axes, legend and the mean-field caution.
 */
export function mapFigureSvg(map: PhaseMap, title = ''): string {
  const [nx, ny] = map.input.plane.resolution;
  const { x: ax, y: ay } = map.input.plane;
  const plot = 420;
  const left = 70;
  const top = title ? 40 : 20;
  const legendWidth = 220;
  const width = left + plot + 20 + legendWidth;
  const height = top + plot + 100;
  const sx = (v: number) => left + ((v - ax.from) / (ax.to - ax.from)) * plot;
  const sy = (v: number) => top + plot - ((v - ay.from) / (ay.to - ay.from)) * plot;
  const cw = plot / nx;
  const ch = plot / ny;
  const parts: string[] = [];
  parts.push(
    `<svg xmlns="http://www.w3.org/2000/svg" version="1.1" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" font-family="Helvetica, Arial, sans-serif" font-size="12">`,
  );
  const patterns = new Map<string, string>();
  const fillOf = (label: string): string => {
    const colours = labelColours(label);
    if (colours.length === 1) return colours[0]!;
    let id = patterns.get(label);
    if (id === undefined) {
      id = `stripes${patterns.size}`;
      patterns.set(label, id);
    }
    return `url(#${id})`;
  };
  const cells: string[] = [];
  for (let j = 0; j < ny; j++) {
    let i = 0;
    while (i < nx) {
      const label = map.labels[j * nx + i]!;
      let k = i + 1;
      while (k < nx && map.labels[j * nx + k] === label) k++;
      const x0 = left + i * cw;
      const y0 = top + plot - (j + 1) * ch;
      cells.push(
        `<rect x="${fmt(x0)}" y="${fmt(y0)}" width="${fmt((k - i) * cw + 0.01)}" height="${fmt(ch + 0.01)}" fill="${fillOf(label)}"/>`,
      );
      i = k;
    }
  }
  parts.push('<defs>');
  for (const [label, id] of patterns) {
    const colours = labelColours(label);
    const w = 6 * colours.length;
    parts.push(
      `<pattern id="${id}" patternUnits="userSpaceOnUse" width="${w}" height="${w}" patternTransform="rotate(45)">`,
      ...colours.map((c, n) => `<rect x="${6 * n}" y="0" width="6" height="${w}" fill="${c}"/>`),
      '</pattern>',
    );
  }
  parts.push(
    `<clipPath id="plot"><rect x="${left}" y="${top}" width="${plot}" height="${plot}"/></clipPath>`,
  );
  parts.push('</defs>');
  parts.push(
    `<g id="regions" clip-path="url(#plot)" shape-rendering="crispEdges">`,
    ...cells,
    '</g>',
  );
  parts.push(
    `<g id="boundaries" fill="none" stroke="#111" stroke-width="1.5" clip-path="url(#plot)">`,
  );
  for (const b of map.boundaries) {
    if (b.points.length < 2) continue;
    const d = b.points
      .map(([x, y], n) => `${n === 0 ? 'M' : 'L'}${fmt(sx(x))},${fmt(sy(y))}`)
      .join('');
    parts.push(`<path d="${d}"${b.order === 'continuous' ? ' stroke-dasharray="5,3"' : ''}/>`);
  }
  parts.push('</g>');
  parts.push(
    `<rect x="${left}" y="${top}" width="${plot}" height="${plot}" fill="none" stroke="#000"/>`,
  );
  for (const t of ticks(ax.from, ax.to, 6)) {
    const x = sx(t);
    parts.push(
      `<line x1="${fmt(x)}" y1="${top + plot}" x2="${fmt(x)}" y2="${top + plot + 5}" stroke="#000"/>`,
    );
    parts.push(`<text x="${fmt(x)}" y="${top + plot + 18}" text-anchor="middle">${fmt(t)}</text>`);
  }
  for (const t of ticks(ay.from, ay.to, 6)) {
    const y = sy(t);
    parts.push(`<line x1="${left - 5}" y1="${fmt(y)}" x2="${left}" y2="${fmt(y)}" stroke="#000"/>`);
    parts.push(`<text x="${left - 8}" y="${fmt(y + 4)}" text-anchor="end">${fmt(t)}</text>`);
  }
  parts.push(
    `<text x="${left + plot / 2}" y="${top + plot + 38}" text-anchor="middle" font-size="14">${esc(ax.label || 'x')}</text>`,
  );
  parts.push(
    `<text transform="translate(${left - 48},${top + plot / 2}) rotate(-90)" text-anchor="middle" font-size="14">${esc(ay.label || 'y')}</text>`,
  );
  if (title) parts.push(`<text x="${left}" y="24" font-size="15">${esc(title)}</text>`);
  let ly = top + 10;
  for (const entry of legendOf(map.labels)) {
    parts.push(
      `<rect x="${left + plot + 20}" y="${ly}" width="16" height="16" fill="${fillOf(entry.label)}" stroke="#333"/>`,
    );
    parts.push(`<text x="${left + plot + 42}" y="${ly + 12}">${esc(entry.label)}</text>`);
    ly += 24;
  }
  parts.push(
    `<text x="${left + plot + 20}" y="${ly + 14}" font-size="10">solid: first order; dashed: continuous</text>`,
  );
  // The caution, wrapped to the figure width (about 6 px per character at 10 px).
  const lines: string[] = [];
  let line = '';
  for (const word of MEAN_FIELD_CAUTION.split(' ')) {
    if ((line + ' ' + word).length * 5 > width - 20 && line !== '') {
      lines.push(line);
      line = word;
    } else line = line === '' ? word : `${line} ${word}`;
  }
  lines.push(line);
  lines.forEach((text, n) => {
    const y = height - 12 - 12 * (lines.length - 1 - n);
    parts.push(`<text x="10" y="${y}" font-size="9">${esc(text)}</text>`);
  });
  parts.push('</svg>');
  return parts.join('\n') + '\n';
}
