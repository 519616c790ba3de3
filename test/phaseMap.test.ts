import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, test } from 'vitest';
import { standardPlane } from './fixtures';
import {
  bisectTransition,
  computePhaseMap,
  couplingsOf,
  joinBoundaries,
  localStages,
  minimiseEnergy,
  parseMapInput,
  parseModel,
  type Crossing,
  type PhaseMap,
} from '../solver/index';

const repoRoot = resolve(fileURLToPath(new URL('.', import.meta.url)), '..');

/** Standard model (H = F) on the (uPerp, uZ) plane of test/fixtures.ts (standardPlane). */
function standardPlaneModel(
  zeeman: number,
  n: number,
  xRange: [number, number],
  yRange: [number, number],
) {
  return {
    filling: 0,
    channels: {},
    zeeman,
    valleyZeeman: 0,
    plane: standardPlane(n, n, xRange, yRange),
  };
}

/**
 * Distance of (uPerp, uZ) from the closed-form boundary of a label pair
 * (public/notes.html#closed-forms, derived there from the energy, H = F, Delta_V = 0).
 */
function closedFormDistance(pair: string, u: number, z: number, zeeman: number): number {
  switch (pair) {
    case 'CAF/F':
      return Math.abs(u + zeeman / 4);
    case 'CAF/KD':
      return Math.abs(z - (Math.abs(u) - zeeman ** 2 / (8 * Math.abs(u))));
    case 'CDW/F':
      return Math.abs(z - (-u - zeeman / 2));
    case 'CDW/KD':
      return Math.abs(z - u);
    default:
      return NaN;
  }
}

const EXPECTED_ORDER: Record<string, 'first' | 'continuous'> = {
  'CAF/F': 'continuous',
  'CAF/KD': 'first',
  'CDW/F': 'first',
  'CDW/KD': 'first',
};

describe('Map of the standard model', () => {
  for (const zeeman of [0.3, 0.8]) {
    test(`recovers the closed-form boundaries of public/notes.html#closed-forms at E_Z = ${zeeman} to 1e-6 of the span, typed`, async () => {
      // Ranges avoid putting pixel centres on the KD/CDW line uZ = uPerp, where H = F makes the two
      // states exactly degenerate (a valley-rotation family).
      const xRange: [number, number] = [-2, 2.03];
      const yRange: [number, number] = [-1.98, 2.01];
      const map = await computePhaseMap(
        parseMapInput(standardPlaneModel(zeeman, 80, xRange, yRange)),
      );
      const span = Math.max(xRange[1] - xRange[0], yRange[1] - yRange[0]);
      // Near the point where all four regions meet, (-E_Z/4, -E_Z/4), pixel edges may also see
      // F next to KD: the closed forms say nothing about those crossings.
      const junction = 3 * (span / 80);
      const counts: Record<string, number> = {};
      for (const c of map.crossings) {
        const pair = [c.near, c.far].sort().join('/');
        if (Math.hypot(c.x + zeeman / 4, c.y + zeeman / 4) < junction) continue;
        expect(Object.keys(EXPECTED_ORDER)).toContain(pair);
        expect(closedFormDistance(pair, c.x, c.y, zeeman)).toBeLessThan(1e-6 * span);
        expect(c.order).toBe(EXPECTED_ORDER[pair]);
        counts[pair] = (counts[pair] ?? 0) + 1;
      }
      for (const pair of Object.keys(EXPECTED_ORDER)) expect(counts[pair] ?? 0).toBeGreaterThan(10);
      expect(new Set(map.labels)).toEqual(new Set(['F', 'CAF', 'KD', 'CDW']));
      for (const b of map.boundaries) {
        expect(b.points.length).toBeGreaterThan(0);
        const pair = b.between.join('/');
        if (b.points.length > 4) expect(b.order).toBe(EXPECTED_ORDER[pair]);
      }
    });
  }

  test('labels at points whose phase is known in closed form (public/notes.html#closed-forms)', async () => {
    const map = await computePhaseMap(parseMapInput(standardPlaneModel(0.4, 40, [-2, 2], [-2, 2])));
    const at = (u: number, z: number): string => {
      const i = Math.floor(((u + 2) / 4) * 40);
      const j = Math.floor(((z + 2) / 4) * 40);
      return map.labels[j * 40 + i]!;
    };
    expect(at(1, 1)).toBe('F');
    expect(at(-1, 1.5)).toBe('CAF');
    expect(at(-1.5, 0)).toBe('KD');
    expect(at(0.5, -1.5)).toBe('CDW');
  });

  test('deterministic bit for bit, whatever the split of the work', async () => {
    const input = parseMapInput(standardPlaneModel(0.3, 30, [-2, 2.03], [-1.98, 2.01]));
    const one = await computePhaseMap(input, localStages, 1);
    const many = await computePhaseMap(input, localStages, 5);
    const same = (a: PhaseMap, b: PhaseMap) => {
      expect(Array.from(b.energy)).toEqual(Array.from(a.energy));
      expect(Array.from(b.order)).toEqual(Array.from(a.order));
      expect(b.labels).toEqual(a.labels);
      expect(b.boundaries).toEqual(a.boundaries);
    };
    same(one, many);
  });

  test('the CLI gives the same file with 1 and 2 worker threads', () => {
    const dir = mkdtempSync(join(tmpdir(), 'fourfold-'));
    const modelFile = join(dir, 'model.json');
    writeFileSync(
      modelFile,
      JSON.stringify(standardPlaneModel(0.3, 24, [-2, 2.03], [-1.98, 2.01])),
    );
    const outputs = [1, 2].map((threads) => {
      const out = join(dir, `map${threads}.json`);
      const run = spawnSync(
        process.execPath,
        ['fourfold.mjs', 'map', '--model', modelFile, '--out', out, '--threads', String(threads)],
        { cwd: repoRoot, encoding: 'utf8' },
      );
      expect(run.stderr).toBe('');
      expect(run.status).toBe(0);
      return readFileSync(out, 'utf8');
    });
    expect(outputs[1]).toBe(outputs[0]);
  });
});

describe('transition typing does not depend on how narrow the final bracket is', () => {
  test('the continuous F/CAF transition is typed continuous at the browser tolerance too (square-root onset, public/notes.html#closed-forms)', () => {
    // Standard model uZ = 1, E_Z = 0.6: CAF for uPerp < -E_Z/4 = -0.15, F beyond, with the Neel
    // order 2 sin(theta) growing as the square root of the distance
    // (public/notes.html#closed-forms). A bracket of 1e-6 of a 4-wide span (the browser's) still
    // leaves a step of about 0.015 in the order parameters, above FIRST_ORDER_JUMP; the typing must
    // look closer.
    const model = (uPerp: number) =>
      couplingsOf(
        parseModel({ filling: 0, channels: { x0: uPerp, y0: uPerp, z0: 1 }, zeeman: 0.6 }),
      );
    const frameAt = (uPerp: number) => minimiseEnergy(model(uPerp)).frame;
    for (const [from, to] of [
      [-0.17, -0.13],
      [-0.1613, -0.1397],
      [-0.1555, -0.1444],
    ] as const) {
      const located = bisectTransition(
        (t) => model(from + t * (to - from)),
        2,
        { frame: frameAt(from), label: 'CAF' },
        { frame: frameAt(to), label: 'F' },
        (1e-6 * 4) / (to - from),
      );
      expect(located.order).toBe('continuous');
      expect(Math.abs(from + located.t * (to - from) - -0.15)).toBeLessThan(1e-5);
    }
  });
});

describe('boundary polylines', () => {
  test('a single crossing typed unlike both neighbours along a line takes their type (no split)', () => {
    // A 4 x 4 grid with a vertical line between columns 1 and 2: it crosses the horizontal pixel
    // edges 2 (j nx + 1), j = 0..3. The crossing of row 2 sits on a pixel centre and shows no jump.
    const nx = 4;
    const crossings: Crossing[] = [0, 1, 2, 3].map((j) => ({
      edge: 2 * (j * nx + 1),
      x: 1.5,
      y: j,
      near: 'KD',
      far: 'CDW',
      order: j === 2 ? 'continuous' : 'first',
    }));
    const joined = joinBoundaries(crossings, nx, 4);
    expect(joined).toHaveLength(1);
    expect(joined[0]!.order).toBe('first');
    expect(joined[0]!.points).toHaveLength(4);
    // Two neighbouring crossings of the other type are a real change: the chain splits there.
    const changed = crossings.map((c, j) => ({ ...c, order: j >= 2 ? 'continuous' : c.order }));
    expect(joinBoundaries(changed as Crossing[], nx, 4).map((b) => b.order)).toEqual([
      'first',
      'continuous',
    ]);
  });

  test('a line across the whole grid (its end cells on the border) and a loop around one pixel are joined whole', () => {
    const nx = 5;
    const crossing = (edge: number, x: number, y: number): Crossing => ({
      edge,
      x,
      y,
      near: 'A',
      far: 'B',
      order: 'first',
    });
    // Between pixel rows 1 and 2, on the vertical edge of every column, the last one included.
    const line = [4, 0, 2, 1, 3].map((i) => crossing(2 * (1 * nx + i) + 1, i, 1.5));
    expect(joinBoundaries(line, nx, 3)).toEqual([
      {
        between: ['A', 'B'],
        order: 'first',
        points: [
          [4, 1.5],
          [3, 1.5],
          [2, 1.5],
          [1, 1.5],
          [0, 1.5],
        ],
      },
    ]);
    // Around pixel (2, 2): its left, right, lower and upper edges; the loop closes on its start.
    const loop = [
      crossing(2 * (2 * nx + 1), 1.5, 2),
      crossing(2 * (2 * nx + 2), 2.5, 2),
      crossing(2 * (1 * nx + 2) + 1, 2, 1.5),
      crossing(2 * (2 * nx + 2) + 1, 2, 2.5),
    ];
    const [ring] = joinBoundaries(loop, nx, 5);
    expect(ring!.points).toHaveLength(5);
    expect(ring!.points[4]).toEqual(ring!.points[0]);
    expect(new Set(ring!.points.map((q) => q.join())).size).toBe(4);
  });
});
