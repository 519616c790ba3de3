import type { Boundary, MapInput } from '../../solver/index';
import {
  MEAN_FIELD_CAUTION,
  SOFTWARE_VERSION,
  TOKEN_MEANINGS,
  legendOf,
  modelToJson,
} from '../../solver/index';
import {
  FIGURE_COLUMNS,
  FIGURE_FONT,
  FIGURE_INK,
  FIGURE_LINE,
  axisSvg,
  estimateTextWidth,
  figureDocument,
  figureTitleSvg,
  svgNumber,
  widestTickLabel,
  wrapWords,
  type AxisScale,
} from './figureStyle';
import { xmlText } from './xmlText';
import { EMPTY_COLOUR, labelColours } from './palette';
import { regionOutlines, type PlanePoint } from './regionOutlines';

/** What the Map figure draws: a PhaseMap of the solver fits, and so does the app's grid. */
export interface FigureMap {
  readonly input: MapInput;
  /** Row-major labels, labels[j nx + i] at pixel centre (x[i], y[j]); '' = not computed. */
  readonly labels: readonly string[];
  readonly boundaries: readonly Boundary[];
}

/** A pinned point of the plane (axis coordinates), drawn as a numbered marker. */
export interface FigurePin {
  readonly id: number;
  readonly x: number;
  readonly y: number;
}

export interface MapFigureOptions {
  /** Journal column preset (default 'single'). */
  readonly column?: 'single' | 'double';
  /** A title above the plot (default none). */
  readonly title?: string;
  /** Probe points to mark (default none). */
  readonly pins?: readonly FigurePin[];
  /**
   * A sample's path as the field tilts (physical units), drawn as a thin line with its end
   * angles; dotted when it is only a guide (default none).
   */
  readonly tiltPath?: FigureTiltPath;
  /** Unit of both axes' values, shown after their titles (meV in physical units; default none). */
  readonly unit?: string;
  /**
   * Where every observation of a fit holds (its grid in axis coordinates): those pixels are
   * hatched, and the legend says how many rows hold there (default none).
   */
  readonly consistent?: FigureConsistency;
}

/** A fit's consistency grid in axis coordinates: pixel centres and rows holding per pixel. */
export interface FigureConsistency {
  readonly x: ArrayLike<number>;
  readonly y: ArrayLike<number>;
  /** Rows that hold at (x[i], y[j]), at held[j * x.length + i]. */
  readonly held: ArrayLike<number>;
  readonly total: number;
}

/** Spacing of the hatching of the consistent pixels, pt. */
const HATCH = 2.4;

/** A tilt path in axis coordinates, from zero tilt to the largest, with those two angles. */
export interface FigureTiltPath {
  readonly points: readonly (readonly [number, number])[];
  readonly fromDeg: number;
  readonly toDeg: number;
  readonly exact: boolean;
}

/** Stripe width across the stripes of a coexistence region, pt. */
const STRIPE = 1.6;
/** Short names of the label tokens for the figure's legend (the solver's meanings are longer). */
const SHORT_MEANINGS: Readonly<Record<string, string>> = {
  F: 'ferromagnet',
  Fxy: 'in-plane spin moment',
  AF: 'antiferromagnet',
  CAF: 'canted antiferromagnet',
  CDW: 'charge density wave',
  KD: 'Kekul\u00e9 distortion',
  SB: 'spin bond order',
  SBxy: 'in-plane spin bond order',
  sym: 'no broken symmetry',
};

function meaningOf(label: string): string {
  if (label === '') return 'not computed';
  return label
    .split('+')
    .map((t) => SHORT_MEANINGS[t] ?? TOKEN_MEANINGS[t]?.split(':')[0] ?? t)
    .join(' + ');
}

/** A linear map from data (from..to) to figure coordinates (r0..r1), as axisSvg takes it. */
export function linearScale(from: number, to: number, r0: number, r1: number): AxisScale {
  const f = ((v: number) => r0 + ((v - from) / (to - from)) * (r1 - r0)) as AxisScale;
  f.domain = () => [from, to];
  f.range = () => [r0, r1];
  return f;
}

/**
 * The fill of each label, made on first use: its colour, or for a coexistence label a pattern
 * of stripes in its parents' colours (`patterns`, for the figure's <defs>, numbered in order of
 * first use).
 */
export class LabelFills {
  readonly patterns: string[] = [];
  private readonly fills = new Map<string, string>();

  fillOf(label: string): string {
    let fill = this.fills.get(label);
    if (fill !== undefined) return fill;
    const colours = label === '' ? [EMPTY_COLOUR] : labelColours(label);
    if (colours.length === 1) fill = colours[0]!;
    else {
      const id = `stripes-${this.patterns.length + 1}`;
      const period = STRIPE * colours.length;
      this.patterns.push(
        `<pattern id="${id}" patternUnits="userSpaceOnUse" width="${svgNumber(period)}" height="${svgNumber(period)}" patternTransform="rotate(45)">` +
          colours
            .map(
              (c, n) =>
                `<rect x="${svgNumber(STRIPE * n)}" y="0" width="${svgNumber(STRIPE)}" height="${svgNumber(period)}" fill="${c}"/>`,
            )
            .join('') +
          '</pattern>',
      );
      fill = `url(#${id})`;
    }
    this.fills.set(label, fill);
    return fill;
  }
}

/**
 * A Map's regions (filled paths that follow the located boundaries, ids `<idPrefix>region-N`)
 * and its boundaries (continued to the frame and to triple points as the regions are; first
 * order solid, continuous dashed), in the plot box of the scales `sx`, `sy`.
 */
export function mapRegionsSvg(
  map: FigureMap,
  sx: AxisScale,
  sy: AxisScale,
  fills: LabelFills,
  idPrefix = '',
): { regions: string[]; boundaries: string[] } {
  const partition = regionOutlines({
    plane: map.input.plane,
    labels: map.labels,
    boundaries: map.boundaries,
  });
  const pt = (p: PlanePoint): string => `${svgNumber(sx(p[0]))},${svgNumber(sy(p[1]))}`;
  const regions: string[] = [];
  partition.regions.forEach((region, n) => {
    const d = region.loops
      .map((loop) => `M${pt(loop[0]!)}L${loop.slice(1).map(pt).join(' ')}Z`)
      .join('');
    regions.push(
      `<path id="${idPrefix}region-${n + 1}" d="${d}" fill="${fills.fillOf(region.label)}"><title>${xmlText(region.label || 'not computed')}</title></path>`,
    );
  });
  const boundaries: string[] = [];
  for (const b of map.boundaries) {
    const points = partition.extend(b.points);
    if (points.length < 2) continue;
    const d = `M${pt(points[0]!)}L${points.slice(1).map(pt).join(' ')}`;
    const dash = b.order === 'continuous' ? ` stroke-dasharray="${FIGURE_LINE.dash}"` : '';
    boundaries.push(
      `<path d="${d}"${dash}><title>${xmlText(`${b.between.join(' | ')}, ${b.order === 'first' ? 'first order' : 'continuous'}`)}</title></path>`,
    );
  }
  return { regions, boundaries };
}

/**
 * The legend from (x, top), `width` wide: a swatch, the label and its short meaning per entry,
 * then the two boundary styles (one under the other when `stacked`, else side by side). Returns
 * its parts and the y below it.
 */
export function mapLegendSvg(
  labels: readonly string[],
  x: number,
  top: number,
  width: number,
  fills: LabelFills,
  stacked: boolean,
): { parts: string[]; bottom: number } {
  const fs = FIGURE_FONT.size;
  const small = FIGURE_FONT.small;
  const labelColumn =
    Math.max(...labels.map((l) => estimateTextWidth(l || '-', fs)), 2 * fs) + 0.8 * fs;
  const swatch = 0.95 * fs;
  const lineHeight = 1.3 * fs;
  const parts: string[] = [];
  let y = top;
  for (const label of labels) {
    const meaning = wrapWords(meaningOf(label), width - swatch - 0.6 * fs - labelColumn, small);
    parts.push(
      `<rect x="${svgNumber(x)}" y="${svgNumber(y)}" width="${svgNumber(swatch)}" height="${svgNumber(swatch)}" fill="${fills.fillOf(label)}" stroke="${FIGURE_INK}" stroke-width="${FIGURE_LINE.tick}"/>`,
      `<text x="${svgNumber(x + swatch + 0.6 * fs)}" y="${svgNumber(y + 0.82 * fs)}">${xmlText(label || '-')}</text>`,
    );
    meaning.forEach((line, n) =>
      parts.push(
        `<text x="${svgNumber(x + swatch + 0.6 * fs + labelColumn)}" y="${svgNumber(y + 0.82 * fs + n * 1.15 * small)}" font-size="${small}">${xmlText(line)}</text>`,
      ),
    );
    y += Math.max(lineHeight, 1.15 * small * meaning.length + 0.3 * fs);
  }
  y += 0.3 * fs;
  const sample = 2.4 * fs;
  const styles: [string, string][] = [
    ['', 'first-order transition'],
    [` stroke-dasharray="${FIGURE_LINE.dash}"`, 'continuous transition'],
  ];
  let sampleX = x;
  styles.forEach(([dash, text], n) => {
    if (stacked && n > 0) {
      y += lineHeight;
      sampleX = x;
    }
    const mid = svgNumber(y + 0.5 * swatch);
    parts.push(
      `<path d="M${svgNumber(sampleX)},${mid}h${svgNumber(sample)}" stroke="${FIGURE_INK}" stroke-width="${FIGURE_LINE.curve}" fill="none"${dash}/>`,
      `<text x="${svgNumber(sampleX + sample + 0.5 * fs)}" y="${svgNumber(y + 0.82 * fs)}" font-size="${small}">${text}</text>`,
    );
    sampleX += sample + 0.5 * fs + estimateTextWidth(text, small) + 1.5 * fs;
  });
  y += lineHeight;
  return { parts, bottom: y };
}

/**
 * The Map as a paper-ready SVG 1.1 figure (pure: no DOM; shared by the app's export and the CLI's
 * `map --out X.svg`). Regions are filled vector paths that follow the refined boundaries
 * (`regionOutlines`), coexistence regions are striped with their parents' colours, boundaries
 * are curves (first order solid, continuous dashed), axes have ticks and typeset titles as text,
 * the legend names each label, pins are numbered markers. Sized for a journal column (width in
 * cm, viewBox in pt); the model, plane, version and mean-field caution go into <desc>.
 */
export function mapFigureSvg(map: FigureMap, options: MapFigureOptions = {}): string {
  const column = FIGURE_COLUMNS[options.column ?? 'single'];
  const fs = FIGURE_FONT.size;
  const small = FIGURE_FONT.small;
  const { x: ax, y: ay } = map.input.plane;
  const title = options.title?.trim() ?? '';
  const width = column.widthPt;

  // Margins from the tick numbers' widths and the titles (axisSvg's default offsets).
  const widestY = widestTickLabel(ay.from, ay.to, 5, fs);
  const gap = 0.35 * fs;
  const left = Math.ceil(gap + widestY + 0.85 * fs + 0.9 * fs + 2);
  const right = 0.6 * fs;
  const top = title === '' ? 0.8 * fs : 2.2 * fs;
  const bottom = Math.ceil(gap + 1.25 * fs + fs + 0.6 * fs);
  const legendBeside = column.name === 'double';
  const side = legendBeside ? Math.round(0.6 * width) : Math.floor(width - left - right);
  const plotX = left;
  const plotY = top;
  const sx = linearScale(ax.from, ax.to, plotX, plotX + side);
  const sy = linearScale(ay.from, ay.to, plotY + side, plotY);

  // Regions and boundaries.
  const fills = new LabelFills();
  const { regions: regionParts, boundaries: boundaryParts } = mapRegionsSvg(map, sx, sy, fills);

  // Pins: a ring and its number, set off by a white outline.
  const pinParts: string[] = [];
  for (const pin of options.pins ?? []) {
    const inside =
      (pin.x - ax.from) * (pin.x - ax.to) <= 0 && (pin.y - ay.from) * (pin.y - ay.to) <= 0;
    if (!inside || !Number.isFinite(pin.x) || !Number.isFinite(pin.y)) continue;
    const cx = svgNumber(sx(pin.x));
    const cy = svgNumber(sy(pin.y));
    const tx = svgNumber(sx(pin.x) + 2.6);
    const ty = svgNumber(sy(pin.y) - 2.6);
    pinParts.push(
      `<g class="pin"><circle cx="${cx}" cy="${cy}" r="1.8" fill="${FIGURE_INK}" stroke="#ffffff" stroke-width="0.6"/>` +
        `<text x="${tx}" y="${ty}" font-size="${small}" stroke="#ffffff" stroke-width="1.6" stroke-linejoin="round" fill="#ffffff">${pin.id}</text>` +
        `<text x="${tx}" y="${ty}" font-size="${small}">${pin.id}</text></g>`,
    );
  }

  // Tilt path: a thin line with open ends labelled by their angles.
  const pathParts: string[] = [];
  const path = options.tiltPath;
  if (path && path.points.length >= 2 && path.points.every(([x, y]) => Number.isFinite(x + y))) {
    const d = `M${path.points.map((p) => `${svgNumber(sx(p[0]))},${svgNumber(sy(p[1]))}`).join('L')}`;
    const dash = path.exact ? '' : ' stroke-dasharray="0.8 1.6"';
    pathParts.push(
      `<path d="${d}" fill="none" stroke="${FIGURE_INK}" stroke-width="${FIGURE_LINE.tick}"${dash}/>`,
    );
    for (const [point, deg] of [
      [path.points[0]!, path.fromDeg],
      [path.points[path.points.length - 1]!, path.toDeg],
    ] as const) {
      const cx = svgNumber(sx(point[0]));
      const cy = svgNumber(sy(point[1]));
      pathParts.push(
        `<circle cx="${cx}" cy="${cy}" r="1.2" fill="#ffffff" stroke="${FIGURE_INK}" stroke-width="${FIGURE_LINE.tick}"/>`,
        `<text x="${svgNumber(sx(point[0]) + 2)}" y="${svgNumber(sy(point[1]) - 1.6)}" font-size="${small}">${svgNumber(deg)}\u00b0</text>`,
      );
    }
  }

  // Consistent pixels: hatched, one rectangle per grid pixel.
  const hatchParts: string[] = [];
  const consistent = options.consistent;
  if (consistent && consistent.x.length > 0 && consistent.y.length > 0) {
    const nx = consistent.x.length;
    const halfOf = (values: ArrayLike<number>, scale: (v: number) => number) =>
      values.length > 1 ? Math.abs(scale(values[1]!) - scale(values[0]!)) / 2 : side / 2;
    const hx = halfOf(consistent.x, sx);
    const hy = halfOf(consistent.y, sy);
    for (let p = 0; p < consistent.held.length; p++) {
      if (consistent.held[p] !== consistent.total) continue;
      const cx = sx(consistent.x[p % nx]!);
      const cy = sy(consistent.y[Math.floor(p / nx)]!);
      hatchParts.push(
        `<rect x="${svgNumber(cx - hx)}" y="${svgNumber(cy - hy)}" width="${svgNumber(2 * hx)}" height="${svgNumber(2 * hy)}"/>`,
      );
    }
    fills.patterns.push(
      `<pattern id="consistent-hatch" patternUnits="userSpaceOnUse" width="${HATCH}" height="${HATCH}" patternTransform="rotate(-45)">` +
        `<path d="M0,0V${HATCH}" stroke="${FIGURE_INK}" stroke-width="${FIGURE_LINE.tick}"/></pattern>`,
    );
  }

  // Axes: numbers and titles left and bottom, mirror ticks top and right.
  const unit = options.unit ? ` (${options.unit})` : '';
  const axes = [
    axisSvg(sx, 'bottom', { at: plotY + side, title: `${ax.label || 'x'}${unit}` }),
    axisSvg(sy, 'left', { at: plotX, title: `${ay.label || 'y'}${unit}` }),
    axisSvg(sx, 'top', { at: plotY, labels: false }),
    axisSvg(sy, 'right', { at: plotX + side, labels: false }),
  ];

  // Legend: swatch, label, short meaning; then the two boundary styles.
  const legendX = legendBeside ? plotX + side + 2.2 * fs : plotX - 0.5 * fs;
  const legendTop = legendBeside ? plotY : plotY + side + bottom;
  const legend = mapLegendSvg(
    legendOf(map.labels).map((e) => e.label),
    legendX,
    legendTop,
    width - legendX - right,
    fills,
    legendBeside,
  );
  const legendParts = legend.parts;
  let y = legend.bottom;
  if (consistent) {
    const swatch = 0.95 * fs;
    legendParts.push(
      `<rect x="${svgNumber(legendX)}" y="${svgNumber(y)}" width="${svgNumber(swatch)}" height="${svgNumber(swatch)}" fill="url(#consistent-hatch)" stroke="${FIGURE_INK}" stroke-width="${FIGURE_LINE.tick}"/>`,
      `<text x="${svgNumber(legendX + swatch + 0.6 * fs)}" y="${svgNumber(y + 0.82 * fs)}" font-size="${small}">every observation holds (${consistent.total} ${consistent.total === 1 ? 'row' : 'rows'})</text>`,
    );
    y += 1.3 * fs;
  }
  const height = Math.ceil(Math.max(legendBeside ? plotY + side + bottom : 0, y + 0.6 * fs));

  const body: string[] = [];
  body.push(
    '<defs>',
    `<clipPath id="plot-area"><rect x="${svgNumber(plotX)}" y="${svgNumber(plotY)}" width="${svgNumber(side)}" height="${svgNumber(side)}"/></clipPath>`,
    ...fills.patterns,
    '</defs>',
  );
  if (title !== '') {
    body.push(figureTitleSvg(title, plotX + side / 2, fs));
  }
  body.push('<g id="regions">', ...regionParts, '</g>');
  body.push(
    `<g id="boundaries" clip-path="url(#plot-area)" fill="none" stroke="${FIGURE_INK}" stroke-width="${FIGURE_LINE.curve}" stroke-linejoin="round">`,
    ...boundaryParts,
    '</g>',
  );
  if (hatchParts.length > 0) {
    body.push(
      '<g id="consistent" clip-path="url(#plot-area)" fill="url(#consistent-hatch)">',
      ...hatchParts,
      '</g>',
    );
  }
  if (pathParts.length > 0) {
    body.push('<g id="tilt-path" clip-path="url(#plot-area)">', ...pathParts, '</g>');
  }
  if (pinParts.length > 0) body.push('<g id="pins">', ...pinParts, '</g>');
  body.push(
    `<rect id="frame" x="${svgNumber(plotX)}" y="${svgNumber(plotY)}" width="${svgNumber(side)}" height="${svgNumber(side)}" fill="none" stroke="${FIGURE_INK}" stroke-width="${FIGURE_LINE.frame}"/>`,
    ...axes,
  );
  body.push('<g id="legend">', ...legendParts, '</g>');

  const [nx, ny] = map.input.plane.resolution;
  const description =
    `Fourfold ${SOFTWARE_VERSION} Map, ${nx} x ${ny} points. ` +
    `Model: ${JSON.stringify(modelToJson(map.input.model))}. ` +
    `Plane: ${JSON.stringify(map.input.plane)}. ${MEAN_FIELD_CAUTION}`;
  return figureDocument(
    {
      widthPt: width,
      heightPt: height,
      title: title === '' ? 'Fourfold Map' : title,
      description,
    },
    body.join('\n'),
  );
}
