import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, test } from 'vitest';
import { RowSpill } from '../cli/rowSpill';
import {
  MapGrid,
  cellRowCount,
  cellSpan,
  coarseStride,
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
  type MapStages,
  type PhaseMap,
  type PixelBlock,
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

  test('coarse cells are at most 128 pixels wide: about 16 along the longer side up to 2048, more beyond', () => {
    expect(coarseStride(256, 256)).toBe(16);
    expect(coarseStride(2000, 3)).toBe(125);
    expect(coarseStride(2048, 2048)).toBe(128);
    expect(coarseStride(2, 2100)).toBe(128);
    expect(coarseStride(8192, 8192)).toBe(128);
    expect(cellRowCount(sampleInput(2, 2100))).toBe(17);
    expect(cellRowCount(sampleInput(8192, 8192))).toBe(64);
  });

  test('a grid 8192 wide: cell tasks of at most 65,536 pixels, and every edge of differing labels gets the states of its two ends, within a task, between tasks and between bands', async () => {
    // Stand-in stages (nothing is solved): each pixel's label follows an invented pattern of
    // stripes in three directions, and its frame holds its own index, so the frames an edge is
    // given say which pixels they came from.
    const input = sampleInput(8192, 130);
    const [nx, ny] = input.plane.resolution;
    const labelAt = (i: number, j: number) =>
      `P${(Math.floor((i + 2 * j) / 700) + Math.floor(j / 37) + (i % 4096 < 9 ? 1 : 0)) % 3}`;
    const taskPixels: number[] = [];
    const seen: number[] = [];
    const stages: MapStages = {
      coarse: async (_input, nodes) => ({
        nodes: Int32Array.from(nodes),
        frames: new Float64Array(32 * nodes.length),
        energy: new Float64Array(nodes.length),
        order: new Float64Array(15 * nodes.length),
        gap: new Float64Array(nodes.length),
        labels: Array.from(nodes, () => 'P0'),
        searched: 0,
      }),
      cells: async (_input, coarse, cells) => {
        const [i0, i1] = [
          cellSpan(coarse.cols, cells.a0, nx)[0],
          cellSpan(coarse.cols, cells.a1 - 1, nx)[1],
        ];
        const [j0, j1] = [
          cellSpan(coarse.rows, cells.b0, ny)[0],
          cellSpan(coarse.rows, cells.b1 - 1, ny)[1],
        ];
        const [width, height] = [i1 - i0, j1 - j0];
        taskPixels.push(width * height);
        const block: PixelBlock = {
          i0,
          j0,
          width,
          height,
          energy: new Float64Array(width * height),
          order: new Float64Array(15 * width * height),
          gap: new Float64Array(width * height),
          frames: new Float64Array(32 * width * height),
          labels: [],
          searched: new Int32Array(1),
        };
        for (let j = j0; j < j1; j++) {
          for (let i = i0; i < i1; i++) {
            const n = (j - j0) * width + (i - i0);
            block.labels.push(labelAt(i, j));
            block.energy[n] = j * nx + i;
            block.frames[32 * n] = j * nx + i;
          }
        }
        return block;
      },
      crossings: async (_input, edges, endFrames, endLabels) =>
        Array.from(edges, (edge, k) => {
          const p = edge >> 1;
          const q = edge % 2 === 0 ? p + 1 : p + nx;
          seen.push(edge);
          expect([endFrames[64 * k], endFrames[64 * k + 32]]).toEqual([p, q]);
          const [ip, jp, iq, jq] = [p % nx, Math.floor(p / nx), q % nx, Math.floor(q / nx)];
          expect([endLabels[2 * k], endLabels[2 * k + 1]]).toEqual([
            labelAt(ip, jp),
            labelAt(iq, jq),
          ]);
          return {
            edge,
            x: 0,
            y: 0,
            near: endLabels[2 * k]!,
            far: endLabels[2 * k + 1]!,
            order: 'first' as const,
          };
        }),
    };
    const blocks: MapRowBlock[] = [];
    const result = await computeMapRows(input, stages, { onRows: (b) => blocks.push(b) });
    // Two bands (rows of coarse cells): 128 pixel rows, then 2.
    expect(blocks.map((b) => [b.j0, b.rows])).toEqual([
      [0, 128],
      [128, 2],
    ]);
    expect(Math.max(...taskPixels)).toBeLessThanOrEqual(1 << 16);
    expect(taskPixels.reduce((a, b) => a + b, 0)).toBe(nx * ny);
    for (const b of blocks) {
      expect(b.energy.every((e, n) => e === b.j0 * nx + n)).toBe(true);
      expect(b.labels.every((l, n) => l === labelAt(n % nx, b.j0 + Math.floor(n / nx)))).toBe(true);
    }
    const expected: number[] = [];
    for (let j = 0; j < ny; j++) {
      for (let i = 0; i < nx; i++) {
        if (i + 1 < nx && labelAt(i, j) !== labelAt(i + 1, j)) expected.push(2 * (j * nx + i));
        if (j + 1 < ny && labelAt(i, j) !== labelAt(i, j + 1)) expected.push(2 * (j * nx + i) + 1);
      }
    }
    expect(expected.length).toBeGreaterThan(1000);
    expect(result.crossings.map((c) => c.edge)).toEqual(expected);
    expect(seen.length).toBe(expected.length);
    expect(Array.from({ length: nx }, (_, i) => result.first.frames[32 * i])).toEqual(
      Array.from({ length: nx }, (_, i) => i),
    );
    expect(Array.from({ length: nx }, (_, i) => result.last.frames[32 * i])).toEqual(
      Array.from({ length: nx }, (_, i) => (ny - 1) * nx + i),
    );
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
