import {
  MapRunStopped,
  computeMapRows,
  joinBoundaries,
  parseMapInput,
  seriesDocument,
  seriesQuantityLabel,
  seriesQuantityName,
  type MapStages,
  type SeriesQuantity,
} from '../../solver/index';
import { runSeriesTask } from '../sidePool';
import { seriesFigureSvg, type SeriesPanel } from './seriesFigure';

/** What a series asks for: the Map's model and plane at a panel resolution, one quantity varied. */
export interface SeriesRequest {
  /** The scenario document (model and plane) the series starts from. */
  readonly document: Record<string, unknown>;
  readonly quantity: SeriesQuantity;
  readonly values: readonly number[];
  /** Pixels per side of each panel's Map. */
  readonly resolution: number;
  readonly column: 'single' | 'double';
  readonly title: string;
}

/** How a running series reports and is stopped. */
export interface SeriesControl {
  /** Maps finished so far (`done` of `of`), with the running Map's fraction. */
  readonly progress: (done: number, of: number, fraction: number) => void;
  /** True once the user cancelled: no further task is sent and the series rejects. */
  readonly stopped: () => boolean;
}

/**
 * The Map stages on the page's worker pool, behind the Map on screen. Each task carries the
 * map's model file as text (the workers parse it once and keep it). A task whose turn comes
 * after a cancel is not sent to the worker; the run then stops with `MapRunStopped`.
 */
function poolStages(json: string, stopped: () => boolean): MapStages {
  const unlessStopped = async <T>(result: Promise<T | null>): Promise<T> => {
    const value = await result;
    if (value === null) throw new MapRunStopped();
    return value;
  };
  return {
    coarse: (_input, nodes) =>
      unlessStopped(runSeriesTask((api) => (stopped() ? nullAnswer() : api.coarse(json, nodes)))),
    cells: (_input, coarse, cells) =>
      unlessStopped(
        runSeriesTask((api) => (stopped() ? nullAnswer() : api.cells(json, coarse, cells))),
      ),
    crossings: (_input, edges, endFrames, endLabels, tolerance) =>
      unlessStopped(
        runSeriesTask((api) =>
          stopped()
            ? nullAnswer()
            : api.crossings(json, edges, endFrames, endLabels, tolerance as number),
        ),
      ),
  };
}

/** The answer of a task dropped after a cancel (resolved, so the pool keeps its worker). */
const nullAnswer = (): Promise<null> => Promise.resolve(null);

/**
 * Computes one Map per value on the page's worker pool, in turn, with the banded run the CLI's
 * `series` uses (same stages, same bisection tolerance), and draws them with the CLI's figure
 * function: the SVG equals `series --out FIG.svg` for the same model, plane and values.
 */
export async function computeSeriesFigure(
  request: SeriesRequest,
  control: SeriesControl,
): Promise<string> {
  const { quantity, values } = request;
  const base = parseMapInput({
    ...request.document,
    plane: {
      ...(request.document.plane as Record<string, unknown>),
      resolution: [request.resolution, request.resolution],
    },
  });
  const parts = Math.max(1, navigator.hardwareConcurrency || 1);
  const panels: SeriesPanel[] = [];
  for (const [k, value] of values.entries()) {
    if (control.stopped()) throw new MapRunStopped();
    control.progress(k, values.length, 0);
    const document = seriesDocument(base, quantity, value);
    const input = parseMapInput(document);
    const [nx, ny] = input.plane.resolution;
    const labels = new Array<string>(nx * ny).fill('');
    const { crossings } = await computeMapRows(
      input,
      poolStages(JSON.stringify(document), control.stopped),
      {
        parts,
        stopped: control.stopped,
        progress: (fraction) => control.progress(k, values.length, fraction),
        onRows: (block) => {
          for (let n = 0; n < block.labels.length; n++)
            labels[block.j0 * nx + n] = block.labels[n]!;
        },
      },
    );
    panels.push({ value, map: { input, labels, boundaries: joinBoundaries(crossings, nx, ny) } });
  }
  control.progress(values.length, values.length, 0);
  return seriesFigureSvg(panels, {
    column: request.column,
    title: request.title,
    quantity: seriesQuantityLabel(quantity),
    vary: seriesQuantityName(quantity),
  });
}
