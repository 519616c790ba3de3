import { line, scaleLinear } from 'd3';
import {
  DISPERSION_CAUTION,
  MEAN_FIELD_CAUTION,
  SOFTWARE_VERSION,
  modelToJson,
  type DispersionContext,
  type ModeDispersion,
} from '../../solver/index';
import {
  FIGURE_COLUMNS,
  FIGURE_FONT,
  FIGURE_INK,
  FIGURE_LINE,
  axisSvg,
  figureDocument,
  figureTitleSvg,
  notesSvg,
  svgNumber,
  typesetLabel,
} from '../figure/figureStyle';
import {
  ROTATION_NAMES,
  branchRuns,
  energyExtent,
  energyTitle,
  groupsPresent,
  rotationColour,
  wavevectorScale,
  wavevectorTitle,
  type DispersionUnits,
} from './dispersionSeries';

export interface DispersionFigureOptions extends DispersionUnits {
  /** Journal column width (default single). */
  readonly column?: 'single' | 'double';
  /** A title above the chart (typeset like the Map figure's). */
  readonly title?: string;
}

/** Width of the dark casing under each coloured branch, pt: light colours stay visible. */
const CASING_PT = 1.9;

/**
 * The dispersion of the collective modes as a paper-ready SVG figure, in the Figure's style
 * (figureStyle.ts): every branch omega_b(q) coloured by the rotation its mode performs (the
 * region colour of that generator's order parameter, over a dark casing so that light colours
 * read in print), Goldstone branches marked by an open circle at q = 0, the large-q limits
 * (particle-hole energies with E_X) dotted, growth rates of an instability drawn below zero as
 * -Im omega, dashed; a legend and the cautions below. Pure: the app's export and the CLI's
 * `modes --out X.svg` call it alike.
 */
export function dispersionFigureSvg(
  d: ModeDispersion,
  context: DispersionContext,
  options: DispersionFigureOptions = {},
): string {
  const column = FIGURE_COLUMNS[options.column ?? 'single'];
  const width = column.widthPt;
  const font = FIGURE_FONT.size;
  const small = FIGURE_FONT.small;
  const left = 42;
  const right = 8;
  const title = options.title?.trim() ?? '';
  const top = title === '' ? 8 : 2.4 * font;
  const plotWidth = width - left - right;
  const plotHeight = Math.round(0.62 * plotWidth);
  const qScale = wavevectorScale(options);
  const qs = d.q.map((q) => q * qScale);
  const x = scaleLinear()
    .domain([qs[0] ?? 0, qs[qs.length - 1] ?? 1])
    .range([0, plotWidth]);
  const y = scaleLinear().domain(energyExtent(d)).range([plotHeight, 0]);
  const parts: string[] = [`<g transform="translate(${left},${top})">`];
  parts.push(
    `<clipPath id="dispersion-plot"><rect width="${svgNumber(plotWidth)}" height="${svgNumber(plotHeight)}"/></clipPath>`,
    '<g clip-path="url(#dispersion-plot)">',
  );
  // Large-q limits, dotted.
  for (const w of new Set(d.particleHole.map((v) => Number(v.toPrecision(12))))) {
    parts.push(
      `<path d="M0,${svgNumber(y(w))}H${svgNumber(plotWidth)}" stroke="${FIGURE_INK}" stroke-width="${FIGURE_LINE.tick}" stroke-dasharray="0.6 1.8" stroke-linecap="round"/>`,
    );
  }
  if (y.domain()[0]! < 0) {
    parts.push(
      `<path d="M0,${svgNumber(y(0))}H${svgNumber(plotWidth)}" stroke="${FIGURE_INK}" stroke-width="${FIGURE_LINE.tick}"/>`,
    );
  }
  const curve = (values: readonly number[], from: number, to: number, sign = 1) =>
    line<number>()
      .x((k) => x(qs[k]!))
      .y((k) => y(sign * values[k]!))
      .digits(2)(Array.from({ length: to - from + 1 }, (_, k) => from + k)) ?? '';
  // Casings first, then the colours on top.
  const casing = d.branches.map((b) => curve(b, 0, b.length - 1)).join('');
  parts.push(
    `<path d="${casing}" fill="none" stroke="${FIGURE_INK}" stroke-width="${CASING_PT}" stroke-linejoin="round" stroke-linecap="round"/>`,
  );
  for (const run of branchRuns(d)) {
    parts.push(
      `<path d="${curve(d.branches[run.branch]!, run.from, run.to)}" fill="none" stroke="${rotationColour(run.group)}" stroke-width="${FIGURE_LINE.curve}" stroke-linejoin="round" stroke-linecap="round"/>`,
    );
  }
  const growing = d.growth.filter((g) => g.some((w) => w > 0));
  for (const g of growing) {
    parts.push(
      `<path d="${curve(g, 0, g.length - 1, -1)}" fill="none" stroke="${FIGURE_INK}" stroke-width="${FIGURE_LINE.curve}" stroke-dasharray="${FIGURE_LINE.dash}"/>`,
    );
  }
  parts.push('</g>');
  // Goldstone branches: an open circle where they start.
  d.goldstone.forEach((g, b) => {
    if (!g || d.q[0] !== 0) return;
    parts.push(
      `<circle cx="${svgNumber(x(qs[0]!))}" cy="${svgNumber(y(d.branches[b]![0]!))}" r="2.6" fill="#ffffff" stroke="${FIGURE_INK}" stroke-width="${FIGURE_LINE.curve}"/>`,
    );
  });
  parts.push(
    `<rect width="${svgNumber(plotWidth)}" height="${svgNumber(plotHeight)}" fill="none" stroke="${FIGURE_INK}" stroke-width="${FIGURE_LINE.frame}"/>`,
    axisSvg(y, 'left', { at: 0, ticks: 5, title: energyTitle(options) }),
    axisSvg(y, 'right', { at: plotWidth, ticks: 5, labels: false }),
    axisSvg(x, 'bottom', { at: plotHeight, ticks: 6, title: wavevectorTitle(options) }),
    axisSvg(x, 'top', { at: 0, ticks: 6, labels: false }),
  );

  // Legend: the rotations present, the marks, then the notes.
  let yLegend = plotHeight + 4 * font;
  parts.push(`<g class="legend" font-size="${small}">`);
  for (const group of groupsPresent(d)) {
    const cy = yLegend - 0.3 * small;
    parts.push(
      `<path d="M0,${svgNumber(cy)}h14" stroke="${FIGURE_INK}" stroke-width="${CASING_PT}"/>`,
      `<path d="M0,${svgNumber(cy)}h14" stroke="${rotationColour(group)}" stroke-width="${FIGURE_LINE.curve}"/>`,
      `<text x="17" y="${svgNumber(yLegend)}">${typesetLabel(ROTATION_NAMES[group], small).markup}</text>`,
    );
    yLegend += small + 3;
  }
  const marks: string[] = [];
  if (d.goldstone.some((g) => g)) marks.push('Open circle: a Goldstone branch (starts at 0).');
  marks.push('Dotted: the large-q limits, particle-hole energies with E_X.');
  if (growing.length > 0) {
    marks.push(
      `Dashed below 0: growth rate -Im omega of an instability (at q = ${d.unstableAt.slice(0, 4).join(', ')}${d.unstableAt.length > 4 ? ', ...' : ''}): the uniform state is not stable there.`,
    );
  }
  marks.push(`${MEAN_FIELD_CAUTION} ${DISPERSION_CAUTION}`);
  yLegend += 2;
  const notesMarkup = notesSvg(marks, -left + 4, yLegend, plotWidth + left - 4, small);
  parts.push(...notesMarkup.markup);
  yLegend = notesMarkup.y;
  parts.push('</g>', '</g>');
  if (title !== '') {
    parts.push(figureTitleSvg(title, left + plotWidth / 2, font));
  }
  const description =
    `Collective modes of the ${context.phase} state along q, Coulomb scale ${d.coulomb}` +
    `${d.gateDistance === null ? '' : `, gate at ${d.gateDistance} l_B`}; ` +
    `model ${JSON.stringify(modelToJson(context.model))}; Fourfold ${SOFTWARE_VERSION}.`;
  return figureDocument(
    {
      widthPt: width,
      heightPt: top + yLegend,
      title: title === '' ? 'Fourfold collective modes' : title,
      description,
    },
    parts.join('\n'),
  );
}
