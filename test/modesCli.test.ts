import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import cephes from 'cephes';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { collectiveModes, parseModel, solve } from '../solver/index';
import { parseCsvStrictly, parseXmlStrictly, textsOf } from './strictParsers';

// `npm run --silent modes` as the README (Command line) describes it, through fourfold.mjs.

const repoRoot = resolve(fileURLToPath(new URL('.', import.meta.url)), '..');

function fourfold(...args: string[]) {
  const r = spawnSync(process.execPath, ['fourfold.mjs', ...args], {
    cwd: repoRoot,
    encoding: 'utf8',
  });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

let dir = '';
function file(name: string, content: unknown): string {
  const path = join(dir, name);
  writeFileSync(path, JSON.stringify(content));
  return path;
}

beforeAll(async () => {
  await cephes.compiled;
  dir = mkdtempSync(join(tmpdir(), 'fourfold-modes-test-'));
  fourfold('--help');
});
afterAll(() => {
  if (dir !== '') rmSync(dir, { recursive: true, force: true });
});

function oneLineError(run: ReturnType<typeof fourfold>, code: number, words: string[]): void {
  expect(run.status).toBe(code);
  expect(run.stdout).toBe('');
  const lines = run.stderr.trimEnd().split('\n');
  expect(lines).toHaveLength(1);
  expect(lines[0]!.startsWith('fourfold:')).toBe(true);
  for (const w of words) expect(lines[0]).toContain(w);
}

const CAF = { filling: 0, channels: { x0: -1, y0: -1, z0: 2 }, zeeman: 0.4, coulomb: 3 };

interface ModesJson {
  format: string;
  q: number[];
  branches: number[][];
  goldstone: boolean[];
  velocities: (number | null)[];
  stiffness: (number | null)[];
  gaps: number[];
  unit: { q: string; energy: string };
  caution: string;
  model: { coulomb: number };
}

describe('fourfold modes', () => {
  test('JSON on stdout: the default grid 0:6:61, branches ascending, q = 0 the modes of solve', () => {
    const run = fourfold('modes', '--model', file('caf.json', CAF));
    expect(run.status).toBe(0);
    const out = JSON.parse(run.stdout) as ModesJson;
    expect(out.format).toBe('fourfold-modes');
    expect(out.q).toHaveLength(61);
    expect(out.q[0]).toBe(0);
    expect(out.q[60]).toBe(6);
    expect(out.branches).toHaveLength(4);
    for (let n = 0; n < 61; n++) {
      for (let b = 1; b < 4; b++) {
        expect(out.branches[b]![n]!).toBeGreaterThanOrEqual(out.branches[b - 1]![n]!);
      }
    }
    const r = solve(parseModel(CAF));
    expect(out.branches.map((b) => b[0])).toEqual(
      collectiveModes(r.couplings, r.frame).frequencies,
    );
    expect(out.goldstone).toEqual([true, false, false, false]);
    expect(out.velocities[0]).toBeGreaterThan(0);
    expect(out.velocities.slice(1)).toEqual([null, null, null]);
    expect(out.stiffness[0]).toBeNull();
    expect(out.unit).toMatchObject({ q: '1/l_B', energy: 'model unit' });
    expect(out.caution).toContain('Landau-level mixing');
  });

  test('--coulomb overrides the model; --q sets the grid (Kallin and Halperin, PRB 30, 5655 (1984))', () => {
    const model = file('f.json', { filling: 0, channels: {}, zeeman: 0.2, coulomb: 7 });
    const run = fourfold('modes', '--model', model, '--coulomb', '1.5', '--q', '0.5:2.5:5');
    expect(run.status).toBe(0);
    const out = JSON.parse(run.stdout) as ModesJson;
    expect(out.q).toEqual([0.5, 1, 1.5, 2, 2.5]);
    out.q.forEach((q, n) => {
      const expected = 0.2 + Math.sqrt(Math.PI / 2) * 1.5 * (1 - cephes.i0e((q * q) / 4));
      for (const b of out.branches) expect(Math.abs(b[n]! - expected)).toBeLessThan(1e-9);
    });
  });

  test('CSV (RFC 4180, strict) and SVG (well-formed XML) outputs', () => {
    const model = file('caf2.json', CAF);
    const csvPath = join(dir, 'modes.csv');
    expect(fourfold('modes', '--model', model, '--q', '0:3:31', '--out', csvPath).status).toBe(0);
    const csv = parseCsvStrictly(readFileSync(csvPath, 'utf8'));
    expect(csv.header).toEqual([
      'q',
      ...[1, 2, 3, 4].map((b) => `omega_${b}`),
      ...[1, 2, 3, 4].map((b) => `growth_${b}`),
      ...[1, 2, 3, 4].map((b) => `rotates_${b}`),
    ]);
    expect(csv.rows).toHaveLength(31);
    expect(csv.rows[0]![9]).toBe('spinAlongField');
    expect(csv.comments.some((c) => c.includes('branch 1') && c.includes('Goldstone'))).toBe(true);
    const svgPath = join(dir, 'modes.svg');
    const run = fourfold(
      'modes',
      '--model',
      model,
      '--out',
      svgPath,
      '--column',
      'double',
      '--title',
      'CAF, E_Z = 0.4',
    );
    expect(run.status).toBe(0);
    const doc = parseXmlStrictly(readFileSync(svgPath, 'utf8'));
    expect(doc.documentElement!.getAttribute('width')).toBe('17.8cm');
    expect(textsOf(doc).join(' ')).toContain('Goldstone');
  });

  test('a model without a Coulomb scale: one line, exit 1', () => {
    const model = file('none.json', { filling: 0, channels: { x0: -1 }, zeeman: 0.3 });
    oneLineError(fourfold('modes', '--model', model), 1, ['coulomb', '--coulomb']);
    oneLineError(fourfold('modes', '--model', file('neg.json', { filling: 0, coulomb: -2 })), 1, [
      'coulomb',
    ]);
  });

  test('bad options: one line, exit 2', () => {
    const model = file('ok.json', CAF);
    oneLineError(fourfold('modes', '--model', model, '--q', '0:6'), 2, ['--q']);
    oneLineError(fourfold('modes', '--model', model, '--q', '3:1:10'), 2, ['--q']);
    oneLineError(fourfold('modes', '--model', model, '--coulomb', 'x'), 2, ['--coulomb']);
    oneLineError(fourfold('modes', '--model', model, '--gate', '0'), 2, ['--gate']);
    oneLineError(fourfold('modes', '--model', model, '--title', 'T'), 2, ['--title']);
    oneLineError(fourfold('modes', '--model', model, '--threads', '2'), 2, ['--threads']);
    oneLineError(fourfold('modes', '--model', model, '--out', 'x.txt'), 2, ['--out']);
    oneLineError(fourfold('modes', '--model', model, '--q', '0:1:3', '--q', '0:1:3'), 2, ['twice']);
  });

  test('a gate lowers E_X and keeps q = 0', () => {
    const model = file('gate.json', CAF);
    const free = JSON.parse(
      fourfold('modes', '--model', model, '--q', '0:1:2').stdout,
    ) as ModesJson & {
      exchange: number;
    };
    const gated = JSON.parse(
      fourfold('modes', '--model', model, '--q', '0:1:2', '--gate', '1').stdout,
    ) as ModesJson & { exchange: number; gateDistance: number };
    expect(gated.gateDistance).toBe(1);
    expect(gated.exchange).toBeLessThan(free.exchange);
    expect(gated.gaps).toEqual(free.gaps);
  });
});
