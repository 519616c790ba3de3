import { line, scaleLinear } from 'd3';
import { MEAN_FIELD_CAUTION, type CutResult, type Plane } from '../../solver/index';
import { curveRuns, cutAxisTitle, cutPanels, panelExtent, phaseSegments } from './cutSeries';
import {
  FIGURE_COLUMNS,
  FIGURE_FONT,
  FIGURE_INK,
  FIGURE_LINE,
  axisSvg,
  estimateTextWidth,
  figureDocument,
  figureTitleSvg,
  notesSvg,
  svgNumber,
  typesetLabel,
} from './figureStyle';
import { xmlText } from './xmlText';
import { labelColours } from './palette';

export interface CutFigureOptions {
  /** The plane the cut runs through (names the end points in the description). */
  readonly plane?: Plane;
  /** Journal column width (default single). */
  readonly column?: 'single' | 'double';
  /** Append the mean-field caution under the charts (default true). */
  readonly caution?: boolean;
  /** A title above the charts, typeset like the Map figure's (default none). */
  readonly title?: string;
}

/** Panel height and the gap between panels, pt. */
const PANEL_PT = 58;
const PANEL_GAP_PT = 7;
/** The strip of phase segments above the panels, pt. */
const STRIP_PT = 11;

/** A dash pattern in line widths as an SVG attribute (empty for a solid line). */
function dashAttribute(dash: string): string {
  if (dash === '') return '';
  const pt = dash.split(' ').map((v) => svgNumber(Number(v) * FIGURE_LINE.curve));
  return ` stroke-dasharray="${pt.join(' ')}"`;
}

/**
 * The Cut as a paper-ready SVG figure (pure string function, shared by the app's export and the
 * CLI), in the style of the Map figure (`figureStyle.ts`): a strip of phase segments in the
 * Map's region colours, then stacked panels sharing one horizontal axis (energy, dE/ds, the
 * nonzero order-parameter groups with a legend, canting angle, quasiparticle gap), every located
 * transition as a vertical line through all panels (first order solid, continuous dashed), and
 * the mean-field caution.
 */
export function cutFigureSvg(cut: CutResult, options: CutFigureOptions = {}): string {
  const column = FIGURE_COLUMNS[options.column ?? 'single'];
  const width = column.widthPt;
  const font = FIGURE_FONT.size;
  const small = FIGURE_FONT.small;
  const panels = cutPanels(cut);
  const runs = curveRuns(cut);
  const left = 46;
  const right = 8;
  const title = options.title?.trim() ?? '';
  const top = title === '' ? 6 : 2.2 * font;
  const plotWidth = width - left - right;
  const x = scaleLinear().domain([cut.axis.from, cut.axis.to]).range([0, plotWidth]);
  const parts: string[] = [];
  parts.push(`<g transform="translate(${left},${top})">`);

  // Phase segments: a strip in the region colours, each labelled where it is wide enough.
  const segments = phaseSegments(cut);
  parts.push('<g class="phases">');
  for (const seg of segments) {
    const x0 = Math.min(x(seg.from), x(seg.to));
    const x1 = Math.max(x(seg.from), x(seg.to));
    const colours = labelColours(seg.label);
    const h = STRIP_PT / colours.length;
    colours.forEach((c, k) =>
      parts.push(
        `<rect x="${svgNumber(x0)}" y="${svgNumber(k * h)}" width="${svgNumber(x1 - x0)}" height="${svgNumber(h)}" fill="${c}"/>`,
      ),
    );
    if (estimateTextWidth(seg.label, small) + 4 < x1 - x0) {
      parts.push(
        `<text x="${svgNumber((x0 + x1) / 2)}" y="${svgNumber(STRIP_PT / 2 + 0.35 * small)}" font-size="${small}" text-anchor="middle" stroke="#ffffff" stroke-width="1.6" paint-order="stroke">${xmlText(seg.label)}</text>`,
      );
    }
  }
  parts.push(
    `<rect width="${svgNumber(plotWidth)}" height="${STRIP_PT}" fill="none" stroke="${FIGURE_INK}" stroke-width="${FIGURE_LINE.frame}"/>`,
    '</g>',
  );

  let y0 = STRIP_PT + PANEL_GAP_PT;
  const panelTops: number[] = [];
  for (const panel of panels) {
    panelTops.push(y0);
    const [lo, hi] = panelExtent(panel);
    const y = scaleLinear()
      .domain([lo, hi])
      .range([y0 + PANEL_PT, y0]);
    parts.push(`<g class="panel panel-${panel.key}">`);
    panel.series.forEach((s) => {
      const curve = line<number>()
        .defined((i) => Number.isFinite(s.values[i]!))
        .x((i) => x(cut.s[i]!))
        .y((i) => y(s.values[i]!))
        .digits(2);
      const d = runs
        .map(([a, b]) => curve(Array.from({ length: b - a + 1 }, (_, k) => a + k)) ?? '')
        .join('');
      if (d === '') return;
      const dash = dashAttribute(s.dash);
      parts.push(
        `<path d="${d}" fill="none" stroke="${s.colour}" stroke-width="${FIGURE_LINE.curve}" stroke-linejoin="round"${dash}/>`,
      );
    });
    parts.push(
      `<rect y="${svgNumber(y0)}" width="${svgNumber(plotWidth)}" height="${PANEL_PT}" fill="none" stroke="${FIGURE_INK}" stroke-width="${FIGURE_LINE.frame}"/>`,
    );
    parts.push(axisSvg(y, 'left', { at: 0, ticks: 3, title: panel.title }));
    parts.push(axisSvg(y, 'right', { at: plotWidth, ticks: 3, labels: false }));
    const last = panel === panels[panels.length - 1];
    parts.push(
      axisSvg(x, 'bottom', {
        at: y0 + PANEL_PT,
        ticks: 5,
        labels: last,
        title: last ? cutAxisTitle(cut) : undefined,
      }),
    );
    parts.push(axisSvg(x, 'top', { at: y0, ticks: 5, labels: false }));
    parts.push('</g>');
    y0 += PANEL_PT + PANEL_GAP_PT;
  }
  const plotsBottom = y0 - PANEL_GAP_PT;

  // Transitions: one vertical line through the strip and every panel.
  parts.push(
    `<g class="transitions" fill="none" stroke="${FIGURE_INK}" stroke-width="${FIGURE_LINE.curve}">`,
  );
  for (const tr of cut.transitions) {
    const px = svgNumber(x(tr.s));
    const dash = tr.order === 'continuous' ? ` stroke-dasharray="${FIGURE_LINE.dash}"` : '';
    parts.push(
      `<path d="M${px},0V${svgNumber(plotsBottom)}"${dash}><title>${xmlText(`${tr.between[0]} to ${tr.between[1]}, ${tr.order === 'first' ? 'first order' : 'continuous'}, at ${tr.s}`)}</title></path>`,
    );
  }
  parts.push('</g>');

  // Legend of the group curves, under the panels.
  let yLegend = plotsBottom + 4 * font;
  const groups = panels.find((p) => p.key === 'groups')!;
  // As many columns as the widest entry allows, at most 2 in a single column figure, 4 in a
  // double.
  const widest = Math.max(...groups.series.map((s) => 23 + estimateTextWidth(s.label, small)));
  const legendColumns = Math.max(
    1,
    Math.min(options.column === 'double' ? 4 : 2, Math.floor(plotWidth / widest)),
  );
  const cell = plotWidth / legendColumns;
  parts.push(`<g class="legend" font-size="${small}">`);
  groups.series.forEach((s, k) => {
    const cx = (k % legendColumns) * cell;
    const cy = yLegend + Math.floor(k / legendColumns) * (small + 3);
    const dash = dashAttribute(s.dash);
    parts.push(
      `<path d="M${svgNumber(cx)},${svgNumber(cy - 0.3 * small)}h14" stroke="${s.colour}" stroke-width="${FIGURE_LINE.curve}"${dash}/>`,
      `<text x="${svgNumber(cx + 17)}" y="${svgNumber(cy)}">${xmlText(s.label)}</text>`,
    );
  });
  yLegend += Math.ceil(groups.series.length / legendColumns) * (small + 3);
  const notes: string[] = [];
  if (groups.zeroGroups && groups.zeroGroups.length > 0) {
    notes.push(`Zero along the cut: ${groups.zeroGroups.join(', ')}.`);
  }
  notes.push(
    'Vertical lines: transitions located to 1e-9 of the cut; solid first order, dashed continuous.',
  );
  if (options.caution !== false) notes.push(MEAN_FIELD_CAUTION);
  const notesMarkup = notesSvg(notes, -left + 4, yLegend, plotWidth + left - 4, small);
  parts.push(...notesMarkup.markup);
  yLegend = notesMarkup.y;
  parts.push('</g>', '</g>');
  if (title !== '') {
    parts.push(figureTitleSvg(title, left + plotWidth / 2, font));
  }
  const description =
    cut.path.kind === 'line'
      ? `Cut from (${cut.path.from.join(', ')}) to (${cut.path.to.join(', ')})${options.plane ? ` in the plane of ${options.plane.x.label || 'x'} and ${options.plane.y.label || 'y'}` : ''}`
      : `Sweep of ${typesetLabel(cutAxisTitle(cut)).text} from ${cut.axis.from} to ${cut.axis.to} at (${cut.path.at.join(', ')})`;
  return figureDocument(
    {
      widthPt: width,
      heightPt: top + yLegend,
      title: title === '' ? 'Fourfold Cut' : title,
      description: `${description}; ${cut.transitions.length} transition(s).`,
    },
    parts.join('\n'),
  );
}
