import { tickFormat, ticks } from 'd3';
import { labelPieces, type LabelLevel } from '../notation/labelPieces';
import { xmlText } from './xmlText';

/**
 * The shared look of Fourfold's exported figures (the Map, the Cut): physical sizes, fonts, line
 * widths, axes and typeset labels, all as SVG 1.1 text. Pure string functions (no DOM), so the
 * CLI in Node and the app call the same code. Lengths are in points (1 pt = 1/72 in): a figure's
 * viewBox is in points and its width and height attributes are in centimetres.
 */

/** Points per centimetre (72 pt per inch, 2.54 cm per inch). */
export const PT_PER_CM = 72 / 2.54;

export interface FigureColumn {
  readonly name: 'single' | 'double';
  /** Figure width, cm. */
  readonly widthCm: number;
  /** Figure width, pt. */
  readonly widthPt: number;
}

/**
 * Journal column widths. From memory: APS journals (Physical Review) set single-column figures
 * 3 3/8 in = 8.6 cm wide and two-column figures 7 in = 17.8 cm; most physics journals are close.
 */
export const FIGURE_COLUMNS: Readonly<Record<'single' | 'double', FigureColumn>> = {
  single: { name: 'single', widthCm: 8.6, widthPt: 8.6 * PT_PER_CM },
  double: { name: 'double', widthCm: 17.8, widthPt: 17.8 * PT_PER_CM },
};

/**
 * Fonts, pt. 8 pt body and 7 pt small text read at print size (common practice: journals ask for
 * lettering of about 6 to 10 pt in the printed figure). Helvetica first: the usual sans-serif of
 * journal artwork; vector editors substitute a metric-compatible font when it is missing.
 */
export const FIGURE_FONT = {
  family: 'Helvetica, Arial, sans-serif',
  size: 8,
  small: 7,
  /** A subscript or superscript, relative to its base. */
  scriptScale: 0.7,
} as const;

/** Line widths and tick length, pt (0.5 pt or more survives print: common practice). */
export const FIGURE_LINE = {
  frame: 0.6,
  tick: 0.5,
  tickLength: 3,
  /** Curves: boundaries, data lines. */
  curve: 1,
  /** Dash pattern of continuous transitions and secondary curves (pt on, pt off). */
  dash: '3 1.8',
} as const;

/** Text colour and line colour: near-black (reads as black in print, softer on screen). */
export const FIGURE_INK = '#1a1a1a';

/** A coordinate for SVG output: at most `digits` decimals, no trailing zeros, no '-0'. */
export function svgNumber(value: number, digits = 2): string {
  const s = Number(value.toFixed(digits)).toString();
  return s === '-0' ? '0' : s;
}

/**
 * A rough width of `text` in Helvetica at `fontSize`, pt, for layout margins only. Average
 * advance widths per character class, from memory of Helvetica's metrics: capitals about
 * 0.68 em, lower case 0.5 em, digits 0.556 em, space 0.278 em, anything else 0.58 em.
 */
export function estimateTextWidth(text: string, fontSize: number = FIGURE_FONT.size): number {
  let em = 0;
  for (const c of text) {
    if (/[A-Z]/.test(c)) em += 0.68;
    else if (/[a-z]/.test(c)) em += c === 'i' || c === 'l' || c === 'j' || c === 't' ? 0.28 : 0.52;
    else if (/[0-9]/.test(c)) em += 0.556;
    else if (c === ' ' || c === '.' || c === ',') em += 0.278;
    else em += 0.58;
  }
  return em * fontSize;
}

/** A figure's title above the plot, centred on `x`, typeset one point larger than `fontSize`. */
export function figureTitleSvg(title: string, x: number, fontSize: number): string {
  return `<text x="${svgNumber(x)}" y="${svgNumber(1.3 * fontSize)}" text-anchor="middle" font-size="${fontSize + 1}">${typesetLabel(title, fontSize + 1).markup}</text>`;
}

/** Words of `text` in lines no wider than `widthPt` at `fontSize` (a word longer stays whole). */
export function wrapWords(text: string, widthPt: number, fontSize: number): string[] {
  const lines: string[] = [];
  let current = '';
  for (const word of text.split(' ')) {
    const next = current === '' ? word : `${current} ${word}`;
    if (current !== '' && estimateTextWidth(next, fontSize) > widthPt) {
      lines.push(current);
      current = word;
    } else current = next;
  }
  if (current !== '') lines.push(current);
  return lines;
}

/**
 * Notes under a figure: each wrapped to `widthPt` at `fontSize`, one <text> per line from
 * baseline `y` at `x`, a little space between notes. Returns the markup and the next baseline.
 */
export function notesSvg(
  notes: readonly string[],
  x: number,
  y: number,
  widthPt: number,
  fontSize: number,
): { markup: string[]; y: number } {
  const markup: string[] = [];
  let baseline = y;
  for (const note of notes) {
    for (const text of wrapWords(note, widthPt, fontSize)) {
      markup.push(`<text x="${svgNumber(x)}" y="${svgNumber(baseline)}">${xmlText(text)}</text>`);
      baseline += fontSize + 2;
    }
    baseline += 2;
  }
  return { markup, y: baseline };
}

/** About `count` round tick values within [from, to] (either order), ascending. */
export function linearTicks(from: number, to: number, count = 5): number[] {
  const lo = Math.min(from, to);
  const hi = Math.max(from, to);
  return ticks(lo, hi, count);
}

/** Formats tick values with the precision the tick step needs; minus as U+2212. */
export function tickLabelFormat(from: number, to: number, count = 5): (value: number) => string {
  const f = tickFormat(Math.min(from, to), Math.max(from, to), count);
  return (value) => f(value);
}

/** Width of the widest tick number of an axis from `from` to `to` with about `count` ticks. */
export function widestTickLabel(from: number, to: number, count: number, fontSize: number): number {
  const format = tickLabelFormat(from, to, count);
  return Math.max(
    ...linearTicks(from, to, count).map((v) => estimateTextWidth(format(v), fontSize)),
  );
}

/** A linear map from data to figure coordinates (d3's scaleLinear fits). */
export interface AxisScale {
  (value: number): number;
  domain(): number[];
  range(): number[];
}

export interface AxisOptions {
  /** Position of the axis line across its direction, pt: y for bottom/top, x for left/right. */
  readonly at: number;
  /** Approximate tick count (default 5); ignored when `tickValues` is given. */
  readonly ticks?: number;
  readonly tickValues?: readonly number[];
  /** Tick numbers beside the axis (default true; false for a mirror axis). */
  readonly labels?: boolean;
  readonly format?: (value: number) => string;
  /** Ticks point into the plot (default true, the usual physics style) or out of it. */
  readonly inward?: boolean;
  /** An axis title, typeset by `typesetLabel` ('u_perp', 'E_Z', 'Delta_V (meV)'). */
  readonly title?: string;
  /** Distance from the axis line to the title's baseline (bottom) or centre line (left), pt. */
  readonly titleOffset?: number;
  readonly fontSize?: number;
}

/**
 * One axis as an SVG group: ticks (one path), tick numbers and an optional typeset title. The
 * plot frame itself is not drawn here. Ticks whose value lies outside the scale's domain are
 * dropped.
 */
export function axisSvg(
  scale: AxisScale,
  side: 'bottom' | 'top' | 'left' | 'right',
  options: AxisOptions,
): string {
  const fontSize = options.fontSize ?? FIGURE_FONT.size;
  const [d0, d1] = scale.domain() as [number, number];
  const count = options.ticks ?? 5;
  const lo = Math.min(d0, d1);
  const hi = Math.max(d0, d1);
  const slack = 1e-9 * (hi - lo);
  const values = (options.tickValues ?? linearTicks(d0, d1, count)).filter(
    (v) => v >= lo - slack && v <= hi + slack,
  );
  const format = options.format ?? tickLabelFormat(d0, d1, count);
  const horizontal = side === 'bottom' || side === 'top';
  // Direction from the axis line into the plot.
  const into = side === 'bottom' || side === 'right' ? -1 : 1;
  const length = FIGURE_LINE.tickLength * (options.inward === false ? -1 : 1) * into;
  const at = options.at;
  const parts: string[] = [];
  const d = values
    .map((v) => {
      const p = svgNumber(scale(v));
      return horizontal
        ? `M${p},${svgNumber(at)}v${svgNumber(length)}`
        : `M${svgNumber(at)},${p}h${svgNumber(length)}`;
    })
    .join('');
  parts.push(`<g class="axis axis-${side}" fill="${FIGURE_INK}" font-size="${fontSize}">`);
  if (d !== '') {
    parts.push(
      `<path d="${d}" fill="none" stroke="${FIGURE_INK}" stroke-width="${FIGURE_LINE.tick}"/>`,
    );
  }
  const outwardTick = options.inward === false ? FIGURE_LINE.tickLength : 0;
  const gap = 0.35 * fontSize + outwardTick;
  let widest = 0;
  if (options.labels !== false) {
    for (const v of values) {
      const text = xmlText(format(v));
      widest = Math.max(widest, estimateTextWidth(format(v), fontSize));
      const p = svgNumber(scale(v));
      if (side === 'bottom')
        parts.push(
          `<text x="${p}" y="${svgNumber(at + gap + 0.75 * fontSize)}" text-anchor="middle">${text}</text>`,
        );
      else if (side === 'top')
        parts.push(`<text x="${p}" y="${svgNumber(at - gap)}" text-anchor="middle">${text}</text>`);
      else if (side === 'left')
        parts.push(
          `<text x="${svgNumber(at - gap)}" y="${svgNumber(scale(v) + 0.35 * fontSize)}" text-anchor="end">${text}</text>`,
        );
      else
        parts.push(
          `<text x="${svgNumber(at + gap)}" y="${svgNumber(scale(v) + 0.35 * fontSize)}">${text}</text>`,
        );
    }
  }
  if (options.title !== undefined && options.title !== '') {
    const title = typesetLabel(options.title, fontSize);
    const [r0, r1] = scale.range() as [number, number];
    const mid = svgNumber((r0 + r1) / 2);
    if (horizontal) {
      const offset = options.titleOffset ?? gap + 0.75 * fontSize + 0.5 * fontSize + fontSize;
      const y = svgNumber(side === 'bottom' ? at + offset : at - offset + 0.75 * fontSize);
      parts.push(`<text x="${mid}" y="${y}" text-anchor="middle">${title.markup}</text>`);
    } else {
      const offset = options.titleOffset ?? gap + widest + 0.5 * fontSize + 0.35 * fontSize;
      const x = svgNumber(side === 'left' ? at - offset : at + offset);
      const rotate = side === 'left' ? -90 : 90;
      parts.push(
        `<text transform="translate(${x},${mid}) rotate(${rotate})" text-anchor="middle">${title.markup}</text>`,
      );
    }
  }
  parts.push('</g>');
  return parts.join('');
}

/** A typeset label: SVG text content (tspans), its plain characters and an estimated width. */
export interface TypesetLabel {
  /** Content for an SVG <text> element: escaped text and <tspan>s. */
  readonly markup: string;
  /** The characters as read ('u⊥', 'EZ', 'Δ (meV)'), e.g. for a title attribute. */
  readonly text: string;
  /** Estimated width at the font size given, pt. */
  readonly width: number;
}

/**
 * Typesets a plain-text label as SVG text, with the notation of `labelPieces` (the app's panels
 * read labels the same way): 'u_perp' gives u with subscript ⊥, 'E_Z' E with subscript Z,
 * 'B_tot (T)' B with subscript tot then ' (T)'. Sub- and superscripts shift with `dy` and come
 * back for text that follows; the markup is meant as the whole content of one <text>.
 */
export function typesetLabel(label: string, fontSize: number = FIGURE_FONT.size): TypesetLabel {
  const pieces = labelPieces(label);
  const shift = (level: LabelLevel) => (level === -1 ? 0.25 : level === 1 ? -0.38 : 0) * fontSize;
  let markup = '';
  let current: LabelLevel = 0;
  let width = 0;
  for (const piece of pieces) {
    const attrs: string[] = [];
    if (piece.level !== current) {
      attrs.push(`dy="${svgNumber(shift(piece.level) - shift(current))}"`);
      current = piece.level;
    }
    if (piece.level !== 0)
      attrs.push(`font-size="${svgNumber(FIGURE_FONT.scriptScale * fontSize)}"`);
    if (piece.italic) attrs.push('font-style="italic"');
    // Some renderers (librsvg) drop a space at the start of a tspan ('E_Z = 0.6' lost the space
    // after the subscript): a piece with a space at its edge keeps it with xml:space.
    if (/^ | $/.test(piece.text) && (attrs.length > 0 || markup !== '')) {
      attrs.push('xml:space="preserve"');
    }
    const text = xmlText(piece.text);
    markup += attrs.length === 0 ? text : `<tspan ${attrs.join(' ')}>${text}</tspan>`;
    width += estimateTextWidth(
      piece.text,
      piece.level === 0 ? fontSize : FIGURE_FONT.scriptScale * fontSize,
    );
  }
  return { markup, text: pieces.map((p) => p.text).join(''), width };
}

export interface FigureDocumentOptions {
  /** Figure size, pt (the viewBox); written as width and height in cm. */
  readonly widthPt: number;
  readonly heightPt: number;
  /** Document title (<title>) and description (<desc>), for editors and screen readers. */
  readonly title?: string;
  readonly description?: string;
}

/**
 * A complete SVG 1.1 document around `body` (UTF-8, so no XML declaration is needed): physical
 * width and height (cm), viewBox in pt, the figure font and ink set once on the root, white
 * background.
 */
export function figureDocument(options: FigureDocumentOptions, body: string): string {
  const w = options.widthPt;
  const h = options.heightPt;
  const head = [
    `<svg xmlns="http://www.w3.org/2000/svg" version="1.1" width="${svgNumber(w / PT_PER_CM, 3)}cm" height="${svgNumber(h / PT_PER_CM, 3)}cm" viewBox="0 0 ${svgNumber(w)} ${svgNumber(h)}" font-family="${FIGURE_FONT.family}" font-size="${FIGURE_FONT.size}" fill="${FIGURE_INK}">`,
  ];
  // Element content: quotes stay readable (JSON in <desc>).
  if (options.title) head.push(`<title>${xmlText(options.title)}</title>`);
  if (options.description) head.push(`<desc>${xmlText(options.description)}</desc>`);
  head.push(`<rect width="${svgNumber(w)}" height="${svgNumber(h)}" fill="#ffffff"/>`);
  return `${head.join('\n')}\n${body}\n</svg>\n`;
}
