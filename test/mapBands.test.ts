import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, test } from 'vitest';
import { RowSpill } from '../cli/rowSpill';
import {
  MapGrid,
  cellRowCount,
  cellRowPixels,
  computeMapRows,
  computePhaseMap,
  joinBoundaries,
  localStages,
  locateCrossings,
  mapJsonPieces,
  mapRowsJsonPieces,
  nodeRange,
  parseMapInput,
  partEndLines,
  partHeader,
  partRowLines,
  readPartCrossing,
  readPartHeader,
  readPartRow,
  readPartSeam,
  seamEdges,
  shardCellRows,
  splitRange,
  type Crossing,
  type MapInput,
  type MapRowBlock,
  type PhaseMap,
} from '../solver/index';
import { sampleMapDocument, standardPlane } from './fixtures';

/** The invented sample of public/examples/sample-map.json, on a plane of the given size. */
function sampleInput(nx: number, ny: number): MapInput {
  return parseMapInput(sampleMapDocument(nx, ny));
}

/** An invented model at nu = 1 on the (E_Z, z0 Fock) plane. */
function oddFillingInput(nx: number, ny: number): MapInput {
  return parseMapInput({
    filling: 1,
    channels: {
      x0: { hartree: 0.3, fock: -0.7 },
      z0: { fock: 0.9 },
      zx: { hartree: -0.2, fock: 0.4 },
      xz: { fock: -0.5 },
    },
    zeeman: 0.2,
    valleyZeeman: 0.05,
    plane: {
      x: { label: 'E_Z', from: 0, to: 1.5, targets: { zeeman: 1 } },
      y: { label: 'u_z', from: -1, to: 2, targets: { 'z0.fock': 1 } },
      resolution: [nx, ny],
    },
  });
}

/**
 * The Map as it was assembled before it was computed in bands: every stage over the whole plane,
 * every pixel (with its frame) held by a MapGrid. The reference the banded run must equal.
 */
async function wholePlaneMap(input: MapInput, parts: number): Promise<PhaseMap> {
  const stages = localStages;
  const grid = new MapGrid(input);
  const coarseBlocks = await Promise.all(
    splitRange(grid.nodeCount, parts * 8).map(([first, count]) =>
      stages.coarse(input, nodeRange(first, count)),
    ),
  );
  for (const block of coarseBlocks) grid.placeCoarse(block);
  const coarse = grid.coarseNodes();
  const cellCols = grid.cols.length - 1;
  const cellRows = grid.rows.length - 1;
  const pixelBlocks = await Promise.all(
    splitRange(cellRows, parts * 16).map(([b0, count]) =>
      stages.cells(input, coarse, { a0: 0, b0, a1: cellCols, b1: b0 + count }),
    ),
  );
  for (const block of pixelBlocks) grid.placePixels(block);
  const edges = grid.boundaryEdges();
  const chunks = await Promise.all(
    splitRange(edges.length, parts * 16).map(([start, count]) => {
      const ids = edges.slice(start, start + count);
      const { endFrames, endLabels } = grid.edgeEnds(ids);
      return stages.crossings(input, ids, endFrames, endLabels);
    }),
  );
  return grid.phaseMap(chunks.flat());
}

/**
 * The Map from `computeMapRows` with bands of one row of coarse cells each (bandPixels 1); what
 * is not per pixel or crossing is taken from `reference`.
 */
async function narrowBandMap(
  input: MapInput,
  parts: number,
  reference: PhaseMap,
): Promise<PhaseMap> {
  const [nx, ny] = input.plane.resolution;
  const labels = new Array<string>(nx * ny).fill('');
  const energy = new Float64Array(nx * ny).fill(NaN);
  const gap = new Float64Array(nx * ny).fill(NaN);
  const order = new Float64Array(15 * nx * ny).fill(NaN);
  let bands = 0;
  const { crossings } = await computeMapRows(input, localStages, {
    parts,
    bandPixels: 1,
    onRows: (block) => {
      bands++;
      block.labels.forEach((l, n) => (labels[block.j0 * nx + n] = l));
      energy.set(block.energy, block.j0 * nx);
      gap.set(block.gap, block.j0 * nx);
      order.set(block.order, 15 * block.j0 * nx);
    },
  });
  expect(bands).toBe(cellRowCount(input));
  return {
    ...reference,
    labels,
    energy,
    gap,
    order,
    crossings,
    boundaries: joinBoundaries(crossings, nx, ny),
  };
}

function expectSameMap(banded: PhaseMap, reference: PhaseMap): void {
  expect(banded.labels).toEqual(reference.labels);
  expect(Array.from(banded.energy)).toEqual(Array.from(reference.energy));
  expect(Array.from(banded.gap)).toEqual(Array.from(reference.gap));
  expect(Array.from(banded.order)).toEqual(Array.from(reference.order));
  expect(banded.crossings).toEqual(reference.crossings);
  expect(banded.boundaries).toEqual(reference.boundaries);
}

describe('the Map in bands of coarse-cell rows', () => {
  const cases: [string, MapInput][] = [
    ['the sample at 30 x 22', sampleInput(30, 22)],
    ['the sample at 3 x 70', sampleInput(3, 70)],
    ['nu = 1 on (E_Z, u_z) at 21 x 19', oddFillingInput(21, 19)],
    [
      'the standard model at 32 x 27',
      parseMapInput({
        filling: 0,
        channels: {},
        zeeman: 0.4,
        valleyZeeman: 0,
        plane: standardPlane(32, 27, [-2, 2.03], [-1.98, 2.01]),
      }),
    ],
  ];
  for (const [name, input] of cases) {
    test(`${name}: the same numbers, crossings and boundaries as the whole-plane assembly`, async () => {
      const reference = await wholePlaneMap(input, 1);
      expect(reference.crossings.length).toBeGreaterThan(10);
      expectSameMap(await computePhaseMap(input, localStages, 1), reference);
      expectSameMap(await narrowBandMap(input, 3, reference), reference);
    }, 300_000);
  }

  test('shards plus the crossings across their seams give the whole Map, for every split', async () => {
    const input = sampleInput(24, 40);
    const whole = await computePhaseMap(input);
    const [nx, ny] = input.plane.resolution;
    const cellRows = cellRowCount(input);
    expect(cellRows).toBe(13);
    for (const n of [1, 2, 5, cellRows]) {
      const labels = new Array<string>(nx * ny).fill('');
      const energy = new Float64Array(nx * ny).fill(NaN);
      const crossings: Crossing[] = [];
      let above: { j: number; labels: readonly string[]; frames: Float64Array } | undefined;
      let seamCrossings = 0;
      for (let k = 1; k <= n; k++) {
        const range = shardCellRows(input, k, n);
        const rows: number[] = [];
        const result = await computeMapRows(input, localStages, {
          cellRows: range,
          onRows: (block: MapRowBlock) => {
            for (let r = 0; r < block.rows; r++) rows.push(block.j0 + r);
            block.labels.forEach((l, p) => (labels[block.j0 * nx + p] = l));
            energy.set(block.energy, block.j0 * nx);
          },
        });
        const [j0, j1] = cellRowPixels(input, range);
        expect([result.j0, result.j1]).toEqual([j0, j1]);
        expect(rows).toEqual(Array.from({ length: j1 - j0 }, (_, r) => j0 + r));
        if (above !== undefined) {
          const seam = seamEdges(above, result.first, nx);
          const located = locateCrossings(input, seam.edges, seam.endFrames, seam.endLabels);
          seamCrossings += located.length;
          crossings.push(...located);
        }
        crossings.push(...result.crossings);
        above = result.last;
      }
      if (n > 1) expect(seamCrossings).toBeGreaterThan(0);
      crossings.sort((a, b) => a.edge - b.edge);
      expect(labels).toEqual(whole.labels);
      expect(Array.from(energy)).toEqual(Array.from(whole.energy));
      expect(crossings).toEqual(whole.crossings);
      expect(joinBoundaries(crossings, nx, ny)).toEqual(whole.boundaries);
    }
  }, 300_000);

  test('shards split the coarse-cell rows evenly and cover every pixel row once', () => {
    const input = sampleInput(64, 48);
    const count = cellRowCount(input);
    expect(count).toBe(12);
    expect([1, 2, 3].map((k) => shardCellRows(input, k, 3))).toEqual([
      [0, 4],
      [4, 8],
      [8, 12],
    ]);
    expect([1, 2, 3].map((k) => cellRowPixels(input, shardCellRows(input, k, 3)))).toEqual([
      [0, 16],
      [16, 32],
      [32, 48],
    ]);
    expect(shardCellRows(input, 5, 5)).toEqual([9, 12]);
  });

  test('a run can be stopped between bands', async () => {
    let bands = 0;
    await expect(
      computeMapRows(sampleInput(4, 60), localStages, {
        bandPixels: 1,
        onRows: () => bands++,
        stopped: () => bands >= 2,
      }),
    ).rejects.toThrow('stopped');
    expect(bands).toBe(2);
  });
});

describe('parts of a Map (map --shard) and the spill file of the JSON writer', () => {
  const dir = mkdtempSync(join(tmpdir(), 'fourfold-bands-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  test('pixel rows, seam rows and crossings read back to the same numbers, NaN and Infinity included', () => {
    const nx = 3;
    const block: MapRowBlock = {
      j0: 4,
      rows: 2,
      labels: ['F', 'CAF', 'KD', 'F', 'F', 'CDW'],
      energy: Float64Array.of(-1.25, 0.1 + 0.2, 1e-300, NaN, Infinity, -Infinity),
      gap: Float64Array.of(1, 2, 3, 4, 5, 6),
      order: Float64Array.from({ length: 90 }, (_, k) => Math.sin(k) / 3),
    };
    const lines = [...partRowLines(block, nx, 5)].join('').split('\n');
    expect(lines.at(-1)).toBe('');
    expect(lines[0]!.endsWith(',')).toBe(true);
    expect(lines[1]!.endsWith('}')).toBe(true);
    const back = lines.slice(0, 2).map((line) => readPartRow(line, nx));
    expect(back.map((r) => r.j0)).toEqual([4, 5]);
    expect(back.flatMap((r) => r.labels)).toEqual(block.labels);
    expect(back.flatMap((r) => Array.from(r.energy))).toEqual(Array.from(block.energy));
    expect(back.flatMap((r) => Array.from(r.order))).toEqual(Array.from(block.order));
    const seam = {
      j: 5,
      labels: ['F', 'F', 'CDW'],
      frames: Float64Array.from({ length: 96 }, (_, k) => Math.cos(k)),
    };
    const crossing: Crossing = {
      edge: 31,
      x: 0.1 + 0.2,
      y: -1 / 3,
      near: 'F',
      far: 'CDW',
      order: 'first',
    };
    const end = [...partEndLines([seam], [crossing, crossing])].join('').split('\n');
    expect(end.slice(0, 2)).toEqual(['],', '"seams":[']);
    expect(readPartSeam(end[2]!, nx)).toEqual(seam);
    expect(end.slice(3, 5)).toEqual(['],', '"crossings":[']);
    expect(readPartCrossing(end[5]!)).toEqual(crossing);
    expect(readPartCrossing(end[6]!)).toEqual(crossing);
    expect(end.slice(7)).toEqual(['],', '"complete":true}', '']);
    expect(() => readPartRow('{"j":4,"phase":["F"]}', nx)).toThrow('expected 3 labels');
  });

  test('a part is one JSON document, and its first line names the Map and the shard', () => {
    const input = sampleInput(6, 4);
    const header = partHeader(
      input,
      { shard: [2, 3], rows: [2, 4] },
      { series: { vary: 'zeeman', value: 0.3 } },
    );
    const back = readPartHeader(header.trimEnd());
    expect(back.place).toEqual({ shard: [2, 3], rows: [2, 4] });
    expect(back.series).toEqual({ vary: 'zeeman', value: 0.3 });
    expect(back.input).toEqual(input);
    const block: MapRowBlock = {
      j0: 2,
      rows: 2,
      labels: new Array<string>(12).fill('F'),
      energy: new Float64Array(12),
      gap: new Float64Array(12),
      order: new Float64Array(180),
    };
    const text =
      header +
      '"pixels":[\n' +
      [...partRowLines(block, 6, 3)].join('') +
      [...partEndLines([], [])].join('');
    const json = JSON.parse(text) as Record<string, unknown>;
    expect(json.complete).toBe(true);
    expect((json.pixels as unknown[]).length).toBe(2);
    expect(() => readPartHeader('{"filling":0}')).toThrow('not a part of a Map');
    expect(() => readPartHeader(header.replace('"shard":[2,3]', '"shard":[4,3]'))).toThrow('shard');
  });

  test('the JSON written from the spill file is the in-memory JSON, byte for byte', async () => {
    const input = oddFillingInput(13, 11);
    const map = await computePhaseMap(input);
    const spill = new RowSpill(input, join(dir, 'map.json'));
    try {
      // Rows arrive in bands, in any order.
      for (const [j0, rows] of [
        [6, 5],
        [0, 6],
      ] as const) {
        const [nx] = input.plane.resolution;
        spill.add({
          j0,
          rows,
          labels: map.labels.slice(j0 * nx, (j0 + rows) * nx),
          energy: map.energy.slice(j0 * nx, (j0 + rows) * nx),
          gap: map.gap.slice(j0 * nx, (j0 + rows) * nx),
          order: map.order.slice(15 * j0 * nx, 15 * (j0 + rows) * nx),
        });
      }
      spill.boundaries = map.boundaries;
      const provenance = { series: { vary: 'zeeman', value: 0.25, index: 1, of: 2 } };
      expect([...mapRowsJsonPieces(spill, provenance)].join('')).toBe(
        [...mapJsonPieces(map, provenance)].join(''),
      );
      expect([...mapRowsJsonPieces(spill)].join('')).toBe([...mapJsonPieces(map)].join(''));
    } finally {
      spill.close();
    }
  });
});
