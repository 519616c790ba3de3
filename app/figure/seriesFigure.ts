import {
  MEAN_FIELD_CAUTION,
  SOFTWARE_VERSION,
  labelCounts,
  legendOfCounts,
  modelToJson,
  type MapInput,
} from '../../solver/index';
import {
  FIGURE_COLUMNS,
  FIGURE_FONT,
  FIGURE_INK,
  FIGURE_LINE,
  axisSvg,
  figureDocument,
  figureTitleSvg,
  svgNumber,
  widestTickLabel,
  typesetLabel,
} from './figureStyle';
import { LabelFills, linearScale, mapLegendSvg, mapRegionsSvg, type FigureMap } from './mapFigure';

/** One panel of a series: a Map and the value of the varied quantity it was computed at. */
export interface SeriesPanel {
  readonly map: FigureMap;
  readonly value: number;
}

export interface SeriesFigureOptions {
  /** Journal column preset (default 'single'). */
  readonly column?: 'single' | 'double';
  /** A title above the panels (default none). */
  readonly title?: string;
  /** The varied quantity as panel titles name it (`E_Z`, `Delta_V`, ... typeset). */
  readonly quantity: string;
  /** How the series was asked for (`--vary`), for the description. */
  readonly vary?: string;
  /** Unit of the axes and of the varied quantity (meV in physical units; default none). */
  readonly unit?: string;
}

/** Panels per row: two in one journal column, up to four across two. */
function panelColumns(count: number, column: 'single' | 'double'): number {
  return Math.min(count, column === 'single' ? 2 : count <= 3 ? 3 : 4);
}

/** A panel's value as its title prints it: up to 6 significant digits, minus as U+2212. */
function valueText(value: number): string {
  return String(Number(value.toPrecision(6))).replace('-', '\u2212');
}

/**
 * A series of Maps (same plane, one quantity varied) as small multiples in the Map figure's
 * style: one panel per value in reading order, each titled with its value, sharing the axes
 * (tick numbers on the outer panels only, each axis title once) and one legend of every label
 * that occurs in any panel. Sized for one or two journal columns. The panels must share the
 * plane; the model of the first goes into <desc> with the values, version and caution.
 */
export function seriesFigureSvg(
  panels: readonly SeriesPanel[],
  options: SeriesFigureOptions,
): string {
  if (panels.length === 0) throw new Error('seriesFigureSvg: no panels');
  const column = FIGURE_COLUMNS[options.column ?? 'single'];
  const fs = FIGURE_FONT.size;
  const small = FIGURE_FONT.small;
  const input: MapInput = panels[0]!.map.input;
  const { x: ax, y: ay } = input.plane;
  const title = options.title?.trim() ?? '';
  const width = column.widthPt;
  const cols = panelColumns(panels.length, column.name);
  const rowsOfPanels = Math.ceil(panels.length / cols);

  // Margins as the Map figure's, plus a title line above each panel.
  const widestY = widestTickLabel(ay.from, ay.to, 4, small);
  const gap = 0.35 * fs;
  const left = Math.ceil(gap + widestY + 0.85 * fs + 0.9 * fs + 2);
  const right = 0.6 * fs;
  const top = title === '' ? 0.4 * fs : 2 * fs;
  const panelTitle = 1.3 * fs;
  // Room between panels for the tick numbers at the ends of neighbouring x axes.
  const widestX = widestTickLabel(ax.from, ax.to, 4, small);
  const hGap = Math.max(0.9 * fs, widestX + 0.5 * fs);
  const vGap = Math.ceil(gap + 1.25 * small) + panelTitle;
  const bottom = Math.ceil(gap + 1.25 * small + fs + 0.6 * fs);
  const side = Math.floor((width - left - right - (cols - 1) * hGap) / cols);
  const gridHeight = rowsOfPanels * (panelTitle + side) + (rowsOfPanels - 1) * (vGap - panelTitle);

  const fills = new LabelFills();
  const body: string[] = [];
  const panelParts: string[] = [];
  const clips: string[] = [];
  const unit = options.unit ? ` ${options.unit}` : '';
  panels.forEach((panel, k) => {
    const r = Math.floor(k / cols);
    const c = k % cols;
    const plotX = left + c * (side + hGap);
    const plotY = top + panelTitle + r * (side + vGap);
    const sx = linearScale(ax.from, ax.to, plotX, plotX + side);
    const sy = linearScale(ay.from, ay.to, plotY + side, plotY);
    const { regions, boundaries } = mapRegionsSvg(panel.map, sx, sy, fills, `panel-${k + 1}-`);
    const clip = `plot-area-${k + 1}`;
    clips.push(
      `<clipPath id="${clip}"><rect x="${svgNumber(plotX)}" y="${svgNumber(plotY)}" width="${svgNumber(side)}" height="${svgNumber(side)}"/></clipPath>`,
    );
    // Tick numbers where no panel lies below (x) or to the left (y).
    const below = k + cols < panels.length;
    const leftmost = c === 0;
    const heading = `${options.quantity} = ${valueText(panel.value)}${unit}`;
    panelParts.push(
      `<g id="panel-${k + 1}">`,
      `<text x="${svgNumber(plotX + side / 2)}" y="${svgNumber(plotY - 0.45 * fs)}" text-anchor="middle" font-size="${small}">${typesetLabel(heading, small).markup}</text>`,
      '<g class="regions">',
      ...regions,
      '</g>',
      `<g class="boundaries" clip-path="url(#${clip})" fill="none" stroke="${FIGURE_INK}" stroke-width="${FIGURE_LINE.curve}" stroke-linejoin="round">`,
      ...boundaries,
      '</g>',
      `<rect x="${svgNumber(plotX)}" y="${svgNumber(plotY)}" width="${svgNumber(side)}" height="${svgNumber(side)}" fill="none" stroke="${FIGURE_INK}" stroke-width="${FIGURE_LINE.frame}"/>`,
      axisSvg(sx, 'bottom', { at: plotY + side, ticks: 4, labels: !below, fontSize: small }),
      axisSvg(sy, 'left', { at: plotX, ticks: 4, labels: leftmost, fontSize: small }),
      axisSvg(sx, 'top', { at: plotY, ticks: 4, labels: false }),
      axisSvg(sy, 'right', { at: plotX + side, ticks: 4, labels: false }),
      '</g>',
    );
  });

  // Shared axis titles: once under the panels, once left of them.
  const gridLeft = left;
  const gridRight = left + cols * side + (cols - 1) * hGap;
  const gridTop = top + panelTitle;
  const gridBottom = top + gridHeight;
  const axisUnit = options.unit ? ` (${options.unit})` : '';
  const xTitle = typesetLabel(`${ax.label || 'x'}${axisUnit}`, fs);
  const yTitle = typesetLabel(`${ay.label || 'y'}${axisUnit}`, fs);
  const axisTitles = [
    `<text x="${svgNumber((gridLeft + gridRight) / 2)}" y="${svgNumber(gridBottom + gap + 1.25 * small + fs)}" text-anchor="middle">${xTitle.markup}</text>`,
    `<text transform="translate(${svgNumber(gridLeft - (gap + widestY + 0.5 * fs + 0.35 * fs))},${svgNumber((gridTop + gridBottom) / 2)}) rotate(-90)" text-anchor="middle">${yTitle.markup}</text>`,
  ];

  // One legend for all panels: labels by their pixels over the whole series.
  const counts = new Map<string, number>();
  for (const panel of panels) {
    for (const [label, pixels] of labelCounts(panel.map.labels)) {
      counts.set(label, (counts.get(label) ?? 0) + pixels);
    }
  }
  const legendX = left - 0.5 * fs;
  const legend = mapLegendSvg(
    legendOfCounts(counts).map((e) => e.label),
    legendX,
    gridBottom + bottom,
    width - legendX - right,
    fills,
    false,
  );
  const height = Math.ceil(legend.bottom + 0.6 * fs);

  body.push('<defs>', ...clips, ...fills.patterns, '</defs>');
  if (title !== '') {
    body.push(figureTitleSvg(title, (gridLeft + gridRight) / 2, fs));
  }
  body.push('<g id="panels">', ...panelParts, '</g>', ...axisTitles);
  body.push('<g id="legend">', ...legend.parts, '</g>');

  const [nx, ny] = input.plane.resolution;
  const description =
    `Fourfold ${SOFTWARE_VERSION} series of ${panels.length} Maps, ${nx} x ${ny} points each, ` +
    `${options.vary ?? options.quantity} = ${panels.map((p) => p.value).join(', ')}. ` +
    `Model (first Map): ${JSON.stringify(modelToJson(input.model))}. ` +
    `Plane: ${JSON.stringify(input.plane)}. ${MEAN_FIELD_CAUTION}`;
  return figureDocument(
    {
      widthPt: width,
      heightPt: height,
      title: title === '' ? 'Fourfold series of Maps' : title,
      description,
    },
    body.join('\n'),
  );
}
