import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { fourfold, type Run } from './cliRun';
import { INTERFACES_EXAMPLE, standardPlane } from './fixtures';
import { CHANNELS, type SolveJson } from '../solver/index';

// The CLI is driven exactly as the README (Command line) describes it, through fourfold.mjs in a
// child process.

/** The standard (uPerp, uZ) plane, at 24 x 24. */
const PLANE_24 = standardPlane(24, 24);

let dir = '';

function file(name: string, content: unknown): string {
  const path = join(dir, name);
  writeFileSync(path, typeof content === 'string' ? content : JSON.stringify(content));
  return path;
}

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'fourfold-cli-test-'));
  // The first run bundles the CLI; do it once here so that each test only runs it.
  fourfold('--help');
});

afterAll(() => {
  if (dir !== '') rmSync(dir, { recursive: true, force: true });
});

/** One line on stderr, "fourfold: ..." naming the problem, no stack trace, non-zero exit. */
function expectOneLineError(run: Run, mentions: string[]): void {
  expect(run.status).not.toBe(0);
  expect(run.status).not.toBeNull();
  expect(run.stdout).toBe('');
  expect(run.stderr.endsWith('\n')).toBe(true);
  const lines = run.stderr.slice(0, -1).split('\n');
  expect(lines).toHaveLength(1);
  expect(lines[0]!.startsWith('fourfold:')).toBe(true);
  expect(run.stderr).not.toContain('    at ');
  for (const word of mentions) expect(lines[0]).toContain(word);
}

describe('fourfold CLI: bad input ends in one line naming the problem (README, Command line)', () => {
  test('a missing model file', () => {
    const path = join(dir, 'no-such-model.json');
    expectOneLineError(fourfold('solve', '--model', path), [path, 'no such file']);
  });

  test('a directory as the model file', () => {
    const sub = join(dir, 'a-directory.json');
    mkdirSync(sub, { recursive: true });
    expectOneLineError(fourfold('solve', '--model', sub), [sub, 'directory']);
  });

  test('bad JSON', () => {
    const path = file('bad.json', '{ "filling": 0, "channels": { "x0": -1, } ');
    expectOneLineError(fourfold('solve', '--model', path), [path, 'JSON']);
  });

  test('an unknown channel "qq"', () => {
    const path = file('qq.json', { ...INTERFACES_EXAMPLE, channels: { qq: 1 } });
    expectOneLineError(fourfold('solve', '--model', path), ['channels.qq', 'unknown channel']);
  });

  test('NaN written as a string', () => {
    const path = file('nan.json', { ...INTERFACES_EXAMPLE, channels: { x0: { fock: 'NaN' } } });
    expectOneLineError(fourfold('solve', '--model', path), ['channels.x0.fock', 'NaN']);
  });

  test('filling 3', () => {
    const path = file('filling.json', { ...INTERFACES_EXAMPLE, filling: 3 });
    expectOneLineError(fourfold('solve', '--model', path), ['filling', '3']);
  });

  test('hartree alone', () => {
    const path = file('hartree.json', { ...INTERFACES_EXAMPLE, channels: { z0: { hartree: 2 } } });
    expectOneLineError(fourfold('solve', '--model', path), ['channels.z0.fock', 'hartree']);
  });

  test('a bad model inside an array is named by its index', () => {
    const path = file('array-bad.json', [INTERFACES_EXAMPLE, { ...INTERFACES_EXAMPLE, zz: 1 }]);
    expectOneLineError(fourfold('solve', '--model', path), ['[1].zz', 'unknown field']);
  });

  test('an unknown command', () => {
    const path = file('good.json', INTERFACES_EXAMPLE);
    expectOneLineError(fourfold('minimise', '--model', path), ['minimise', 'unknown command']);
  });

  test('a missing --model', () => {
    expectOneLineError(fourfold('solve'), ['--model']);
    expectOneLineError(fourfold('solve', '--model'), ['--model']);
  });

  test('map without --out', () => {
    const path = file('map-no-out.json', { ...INTERFACES_EXAMPLE, plane: PLANE_24 });
    expectOneLineError(fourfold('map', '--model', path), ['--out']);
  });

  test('map with --out x.txt', () => {
    const path = file('map-txt.json', { ...INTERFACES_EXAMPLE, plane: PLANE_24 });
    const out = join(dir, 'x.txt');
    expectOneLineError(fourfold('map', '--model', path, '--out', out), ['--out', 'x.txt']);
    expect(existsSync(out)).toBe(false);
  });

  test('map with a model that has no plane', () => {
    const path = file('map-no-plane.json', INTERFACES_EXAMPLE);
    const out = join(dir, 'no-plane.json');
    expectOneLineError(fourfold('map', '--model', path, '--out', out), ['plane', 'missing']);
    expect(existsSync(out)).toBe(false);
  });

  test('map with a bad resolution', () => {
    for (const [name, resolution, field] of [
      ['res-1.json', 1, 'plane.resolution'],
      ['res-frac.json', [24, 2.5], 'plane.resolution[1]'],
      ['res-big.json', [8193, 24], 'plane.resolution[0]'],
    ] as const) {
      const path = file(name, { ...INTERFACES_EXAMPLE, plane: { ...PLANE_24, resolution } });
      const out = join(dir, `${name}.out.json`);
      expectOneLineError(fourfold('map', '--model', path, '--out', out), [field]);
      expect(existsSync(out)).toBe(false);
    }
  });

  test('map with a bad target', () => {
    const plane = { ...PLANE_24, y: { ...PLANE_24.y, targets: { 'z0.direct': 1 } } };
    const path = file('bad-target.json', { ...INTERFACES_EXAMPLE, plane });
    expectOneLineError(
      fourfold('map', '--model', path, '--out', join(dir, 'bad-target.out.json')),
      ['plane.y.targets.z0.direct'],
    );
  });
});

/** The documented fields of a `solve` result (README, Command line), as the solver types them. */
type SolveOutput = Pick<
  SolveJson,
  'energy' | 'projector' | 'order' | 'phase' | 'gap' | 'modes' | 'goldstone'
>;

function solveJson(content: unknown): unknown {
  const run = fourfold('solve', '--model', file('solve.json', content));
  expect(run.stderr).toBe('');
  expect(run.status).toBe(0);
  return JSON.parse(run.stdout) as unknown;
}

/** P^2 = P, P = P^dagger, tr P = Nf for the printed projector. */
function expectProjector({ re, im }: SolveOutput['projector'], nf: number): void {
  expect(re).toHaveLength(4);
  expect(im).toHaveLength(4);
  let trace = 0;
  for (let r = 0; r < 4; r++) {
    expect(re[r]).toHaveLength(4);
    expect(im[r]).toHaveLength(4);
    trace += re[r]![r]!;
    for (let c = 0; c < 4; c++) {
      expect(Math.abs(re[r]![c]! - re[c]![r]!)).toBeLessThan(1e-12);
      expect(Math.abs(im[r]![c]! + im[c]![r]!)).toBeLessThan(1e-12);
      let sr = 0;
      let si = 0;
      for (let k = 0; k < 4; k++) {
        sr += re[r]![k]! * re[k]![c]! - im[r]![k]! * im[k]![c]!;
        si += re[r]![k]! * im[k]![c]! + im[r]![k]! * re[k]![c]!;
      }
      expect(Math.abs(sr - re[r]![c]!)).toBeLessThan(1e-12);
      expect(Math.abs(si - im[r]![c]!)).toBeLessThan(1e-12);
    }
  }
  expect(Math.abs(trace - nf)).toBeLessThan(1e-12);
}

describe('fourfold solve (README, Command line)', () => {
  test('the worked point is CAF with E = -uZ_F - E_Z^2/(8|uPerp_F|) = -2.02 (public/notes.html#closed-forms, derived)', () => {
    const result = solveJson(INTERFACES_EXAMPLE) as SolveOutput;
    expect(Math.abs(result.energy - -2.02)).toBeLessThan(1e-12);
    expect(result.phase).toBe('CAF');
    expect(result.goldstone).toBe(1);
    expect(Object.keys(result.order).sort()).toEqual([...CHANNELS].sort());
    // cos(theta) = E_Z / (4 |uPerp_F|) = 0.1: total spin 2 cos(theta), in-plane Neel 2 sin(theta).
    expect(result.order['0z']).toBeCloseTo(0.2, 12);
    expect(Math.hypot(result.order.zx!, result.order.zy!)).toBeCloseTo(2 * Math.sqrt(0.99), 12);
    for (const name of CHANNELS) {
      if (!['0z', 'zx', 'zy'].includes(name))
        expect(Math.abs(result.order[name]!)).toBeLessThan(1e-9);
    }
    expectProjector(result.projector, 2);
    // One omega >= 0 per pair for the 2 Nf (4 - Nf) = 8 real tangent directions, ascending.
    expect(result.modes).toHaveLength(4);
    result.modes.forEach((w, k) => {
      expect(w).toBeGreaterThanOrEqual(0);
      if (k > 0) expect(w).toBeGreaterThanOrEqual(result.modes[k - 1]!);
    });
    expect(result.modes[0]).toBeLessThan(1e-6 * 2);
    expect(result.gap).toBeGreaterThan(0);
  });

  test('an array of two models gives an array of two results in the same order', () => {
    // E_Z = 5 > 4 |uPerp_F| puts the second model in F: E = -2 uPerp_F - uZ_F - E_Z = -5
    // (public/notes.html#closed-forms, derived).
    const ferromagnet = { ...INTERFACES_EXAMPLE, zeeman: 5 };
    const results = solveJson([ferromagnet, INTERFACES_EXAMPLE]) as SolveOutput[];
    expect(Array.isArray(results)).toBe(true);
    expect(results).toHaveLength(2);
    expect(results.map((r) => r.phase)).toEqual(['F', 'CAF']);
    expect(Math.abs(results[0]!.energy - -5)).toBeLessThan(1e-12);
    expect(Math.abs(results[1]!.energy - -2.02)).toBeLessThan(1e-12);
    expect(results[0]!.order['0z']).toBeCloseTo(2, 12);
    for (const r of results) expectProjector(r.projector, 2);
  });

  test('energies in another unit (the example times 1e-22, e.g. joules): every energy scales by 1e-22', () => {
    // README: energies "in one unit of your choice". Energy, gap and modes are
    // all energies, so each must scale with the unit.
    const s = 1e-22;
    const scaled = {
      filling: 0,
      channels: { x0: -1 * s, y0: -1 * s, z0: 2 * s },
      zeeman: 0.4 * s,
      valleyZeeman: 0,
    };
    const reference = solveJson(INTERFACES_EXAMPLE) as SolveOutput;
    const result = solveJson(scaled) as SolveOutput;
    expect(result.phase).toBe('CAF');
    expect(result.goldstone).toBe(1);
    expect(Math.abs(result.energy / s - reference.energy)).toBeLessThan(1e-12);
    expect(Math.abs(result.gap / s - reference.gap)).toBeLessThan(1e-9);
    result.modes.forEach((w, k) =>
      expect(Math.abs(w / s - reference.modes[k]!)).toBeLessThan(1e-6),
    );
  });
});

/** A small check that every start tag has its end tag in order; returns the element names met. */
function balancedTags(xml: string): string[] {
  const stack: string[] = [];
  const names: string[] = [];
  const body = xml.replace(/<!--[\s\S]*?-->/g, '').replace(/<\?[\s\S]*?\?>/g, '');
  for (const match of body.matchAll(/<(\/?)([A-Za-z][\w:-]*)((?:\s+[\w:-]+="[^"]*")*)\s*(\/?)>/g)) {
    const [, closing, name, , selfClosing] = match;
    if (closing) {
      expect(stack.pop()).toBe(name);
    } else {
      names.push(name!);
      if (!selfClosing) stack.push(name!);
    }
  }
  expect(stack).toEqual([]);
  // Every '<' opens a tag the pattern recognises, so the balance check skipped nothing.
  expect([...body.matchAll(/<\/?[A-Za-z][\w:-]*(?:\s+[\w:-]+="[^"]*")*\s*\/?>/g)].length).toBe(
    body.split('<').length - 1,
  );
  // No bare ampersands outside entities.
  expect(body.replace(/&(?:amp|lt|gt|quot|apos|#\d+|#x[\da-fA-F]+);/g, '')).not.toContain('&');
  return names;
}

describe('fourfold map on the standard plane at 24 x 24 (E_Z = 0.4)', () => {
  const mapModel = { filling: 0, zeeman: 0.4, valleyZeeman: 0, plane: PLANE_24 };

  function runMap(name: string): string {
    const out = join(dir, name);
    const run = fourfold('map', '--model', file(`${name}.model.json`, mapModel), '--out', out);
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    return readFileSync(out, 'utf8');
  }

  test('.json holds x, y, phase, energy and boundaries of the stated shapes', () => {
    const map = JSON.parse(runMap('map.json')) as {
      x: number[];
      y: number[];
      phase: string[][];
      energy: number[][];
      boundaries: { between: [string, string]; order: string; points: [number, number][] }[];
    };
    const centres = Array.from({ length: 24 }, (_, i) => -2 + ((i + 0.5) * 4) / 24);
    expect(map.x).toHaveLength(24);
    expect(map.y).toHaveLength(24);
    map.x.forEach((v, i) => expect(v).toBeCloseTo(centres[i]!, 12));
    map.y.forEach((v, j) => expect(v).toBeCloseTo(centres[j]!, 12));
    expect(map.phase).toHaveLength(24);
    expect(map.energy).toHaveLength(24);
    for (let j = 0; j < 24; j++) {
      expect(map.phase[j]).toHaveLength(24);
      expect(map.energy[j]).toHaveLength(24);
      map.phase[j]!.forEach((label) => expect(label).toMatch(/^[A-Za-z0-9+]+$/));
      map.energy[j]!.forEach((e) => expect(Number.isFinite(e)).toBe(true));
    }
    // phase[j][i] sits at (x[i], y[j]). Closed forms of public/notes.html#closed-forms (derived),
    // at points away from the boundaries of public/notes.html#checks (Phys. Rev. B 85, 155439
    // (2012)):
    const at = (i: number, j: number) => ({ phase: map.phase[j]![i]!, energy: map.energy[j]![i]! });
    // (uPerp, uZ) = (-13/12, 23/12): CAF, E = -uZ - E_Z^2 / (8 |uPerp|).
    expect(at(5, 23).phase).toBe('CAF');
    expect(at(5, 23).energy).toBeCloseTo(-23 / 12 - 0.16 / ((8 * 13) / 12), 12);
    // (13/12, 23/12): F, E = -2 uPerp - uZ - E_Z.
    expect(at(18, 23).phase).toBe('F');
    expect(at(18, 23).energy).toBeCloseTo(-26 / 12 - 23 / 12 - 0.4, 12);
    // (-23/12, 1/12): KD, E = 2 uPerp - uPerp = uPerp.
    expect(at(0, 12).phase).toBe('KD');
    expect(at(0, 12).energy).toBeCloseTo(-23 / 12, 12);
    // (1/12, -23/12): CDW, E = 2 uZ - uZ = uZ.
    expect(at(12, 0).phase).toBe('CDW');
    expect(at(12, 0).energy).toBeCloseTo(-23 / 12, 12);

    const labels = new Set(map.phase.flat());
    expect(map.boundaries.length).toBeGreaterThan(0);
    for (const b of map.boundaries) {
      expect(b.between).toHaveLength(2);
      expect(b.between[0]).not.toBe(b.between[1]);
      b.between.forEach((label) => expect(labels.has(label)).toBe(true));
      expect(['first', 'continuous']).toContain(b.order);
      expect(b.points.length).toBeGreaterThanOrEqual(2);
      for (const [x, y] of b.points) {
        expect(x).toBeGreaterThanOrEqual(-2);
        expect(x).toBeLessThanOrEqual(2);
        expect(y).toBeGreaterThanOrEqual(-2);
        expect(y).toBeLessThanOrEqual(2);
      }
    }
    // F/CAF is continuous (public/notes.html#closed-forms, derived); CAF/KD is first order (Phys.
    // Rev. B 85, 155439 (2012), recalled from memory).
    const pairs = (a: string, b: string) =>
      map.boundaries.filter((x) => [...x.between].sort().join('|') === [a, b].sort().join('|'));
    expect(pairs('CAF', 'F').length).toBeGreaterThan(0);
    pairs('CAF', 'F').forEach((b) => expect(b.order).toBe('continuous'));
    expect(pairs('CAF', 'KD').length).toBeGreaterThan(0);
    pairs('CAF', 'KD').forEach((b) => expect(b.order).toBe('first'));
    // F/CAF sits at E_Z = 4 |uPerp|, i.e. uPerp = -0.1, located more finely than the 1/6 grid step.
    for (const b of pairs('CAF', 'F')) {
      for (const [x] of b.points) expect(Math.abs(x - -0.1)).toBeLessThan(1e-3);
    }
  });

  test('.csv holds a header and 24 * 24 data rows of 20 fields', () => {
    const lines = runMap('map.csv').trimEnd().split('\n');
    const table = lines.filter((line) => !line.startsWith('#'));
    expect(table[0]!.split(',')).toEqual(['u_perp', 'u_z', 'phase', 'energy', 'gap', ...CHANNELS]);
    const rows = table.slice(1);
    expect(rows).toHaveLength(24 * 24);
    for (const row of rows) {
      const fields = row.split(',');
      expect(fields).toHaveLength(20);
      [0, 1, 3, 4, ...CHANNELS.map((_, k) => 5 + k)].forEach((f) =>
        expect(Number.isFinite(Number(fields[f]))).toBe(true),
      );
    }
    // Row-major with x fastest: the second row is (x[1], y[0]).
    const second = rows[1]!.split(',');
    expect(Number(second[0])).toBeCloseTo(-2 + 1.5 / 6, 12);
    expect(Number(second[1])).toBeCloseTo(-2 + 0.5 / 6, 12);
  });

  test('.svg is one balanced <svg> element', () => {
    const svg = runMap('map.svg').trim();
    expect(svg.startsWith('<svg')).toBe(true);
    expect(svg.endsWith('</svg>')).toBe(true);
    expect(svg).toContain('xmlns="http://www.w3.org/2000/svg"');
    const names = balancedTags(svg);
    expect(names[0]).toBe('svg');
    expect(names.filter((n) => n === 'svg')).toHaveLength(1);
    expect(names.filter((n) => n === 'rect').length).toBeGreaterThan(0);
    // The labels of the map appear in the figure.
    for (const label of ['CAF', 'F', 'KD', 'CDW']) expect(svg).toContain(`>${label}<`);
  });
});

describe('fourfold cut (a straight line of the plane)', () => {
  // The standard model (H = F) on the standard plane, E_Z = 0.4.
  const cutModel = { filling: 0, zeeman: 0.4, valleyZeeman: 0, plane: PLANE_24 };
  const line = ['--from', '-1.9,1.2', '--to', '1.9,-1.4'];

  function runCut(name: string, ...extra: string[]): string {
    const out = join(dir, name);
    const model = file(`${name}.model.json`, cutModel);
    const run = fourfold('cut', '--model', model, ...line, '--n', '120', ...extra, '--out', out);
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    return readFileSync(out, 'utf8');
  }

  test('.json: samples, profiles and transitions on the closed-form lines', () => {
    const cut = JSON.parse(runCut('cut.json')) as {
      axis: { label: string; from: number; to: number };
      t: number[];
      s: number[];
      x: number[];
      y: number[];
      phase: string[];
      energy: number[];
      slope: number[];
      cantingDeg: (number | null)[];
      groups: Record<string, number[]>;
      transitions: {
        t: number;
        s: number;
        x: number;
        y: number;
        between: string[];
        order: string;
      }[];
      caution: string;
    };
    expect(cut.t).toHaveLength(120);
    expect(cut.t[0]).toBe(0);
    expect(cut.t[119]).toBe(1);
    expect([cut.x[0], cut.y[0], cut.x[119], cut.y[119]]).toEqual([-1.9, 1.2, 1.9, -1.4]);
    expect(Object.keys(cut.groups)).toHaveLength(8);
    expect(cut.caution).toContain('Mean-field');
    // KD (E = uPerp) at the start, F (E = -2 uPerp - uZ - E_Z) at the end:
    // public/notes.html#closed-forms.
    expect(cut.phase[0]).toBe('KD');
    expect(cut.energy[0]).toBeCloseTo(-1.9, 12);
    expect(cut.cantingDeg[0]).toBeNull();
    expect(cut.phase[119]).toBe('F');
    expect(cut.energy[119]).toBeCloseTo(-3.8 + 1.4 - 0.4, 12);
    // Both couplings change along the line: the horizontal axis is the distance s from the
    // start, up to the length sqrt(3.8^2 + 2.6^2).
    const length = Math.hypot(3.8, 2.6);
    expect(cut.axis.label).toBe('distance');
    expect(cut.axis.to).toBeCloseTo(length, 12);
    expect(cut.s[119]).toBeCloseTo(length, 12);
    // dE/ds: KD changes by d(uPerp)/dt = 3.8 per unit t, F by -2 (3.8) - (-2.6) = -5.
    expect(cut.slope[0]).toBeCloseTo(3.8 / length, 12);
    expect(cut.slope[119]).toBeCloseTo(-5 / length, 12);
    // KD -> CAF (first order), then CAF -> F (continuous) at uPerp = -E_Z / 4 = -0.1
    // (public/notes.html#closed-forms; Phys. Rev. B 85, 155439 (2012)).
    expect(cut.transitions.map((t) => [...t.between, t.order])).toEqual([
      ['KD', 'CAF', 'first'],
      ['CAF', 'F', 'continuous'],
    ]);
    const continuous = cut.transitions[1]!;
    expect(Math.abs(continuous.x - -0.1)).toBeLessThan(3.8e-9);
    expect(continuous.y).toBeCloseTo(1.2 - 2.6 * continuous.t, 12);
    expect(continuous.s).toBeCloseTo(length * continuous.t, 12);
  });

  test('.csv: comment lines, a header and one row per sample', () => {
    const lines = runCut('cut.csv').trimEnd().split('\n');
    const comments = lines.filter((l) => l.startsWith('#'));
    expect(comments.some((l) => l.includes('CAF -> F (continuous)'))).toBe(true);
    const table = lines.filter((l) => !l.startsWith('#'));
    expect(table[0]!.split(',').slice(0, 9)).toEqual([
      't',
      'distance',
      'u_perp',
      'u_z',
      'phase',
      'energy',
      'slope',
      'gap',
      'canting_deg',
    ]);
    expect(table[0]!.split(',')).toHaveLength(17);
    expect(table).toHaveLength(121);
    const last = table[120]!.split(',');
    expect(Number(last[0])).toBe(1);
    expect(last[4]).toBe('F');
  });

  test('.svg: one balanced figure with the phase labels and one line per transition', () => {
    const svg = runCut('cut.svg').trim();
    expect(svg.endsWith('</svg>')).toBe(true);
    const names = balancedTags(svg);
    expect(names[0]).toBe('svg');
    expect(svg).toContain('>KD<');
    expect(svg).toContain('>F<');
    const transitions = /<g class="transitions"[^>]*>([\s\S]*?)<\/g>/.exec(svg)![1]!;
    expect(transitions.match(/<path /g)).toHaveLength(2);
    expect(transitions.match(/stroke-dasharray/g)).toHaveLength(1);
  });

  test('bad flags end in one line naming the flag', () => {
    const model = file('cut-bad.model.json', cutModel);
    const out = join(dir, 'cut-bad.json');
    const base = ['cut', '--model', model];
    expectOneLineError(fourfold(...base, '--to', '1,1', '--out', out), ['--from', 'missing']);
    expectOneLineError(fourfold(...base, '--from', '0,0', '--out', out), ['--to', 'missing']);
    expectOneLineError(fourfold(...base, '--from', '0', '--to', '1,1', '--out', out), ['--from']);
    expectOneLineError(fourfold(...base, '--from', '0,NaN', '--to', '1,1', '--out', out), [
      '--from',
    ]);
    expectOneLineError(fourfold(...base, '--from', '0,', '--to', '1,1', '--out', out), ['--from']);
    expectOneLineError(fourfold(...base, '--from', '1,1', '--to', '1,1', '--out', out), ['--to']);
    for (const n of ['1', '2.5', 'ten', '10001', '1e9'])
      expectOneLineError(fourfold(...base, ...line, '--n', n, '--out', out), ['--n', n]);
    expectOneLineError(fourfold(...base, ...line), ['--out', 'missing']);
    expectOneLineError(fourfold(...base, ...line, '--out', join(dir, 'cut.txt')), ['--out']);
    expectOneLineError(fourfold('map', '--model', model, ...line, '--out', out), ['--from', 'cut']);
    const planeless = file('cut-no-plane.json', INTERFACES_EXAMPLE);
    expectOneLineError(fourfold('cut', '--model', planeless, ...line, '--out', out), ['plane']);
    expect(existsSync(out)).toBe(false);
  });
});

describe('fourfold probe', () => {
  interface ProbeOut {
    point?: { x: number; y: number };
    format: string;
    state: SolveJson;
    sublattices: { a: { angleToField: number } };
    modes: { goldstone: number; gapless: { generators: string[] }[] };
    competitors: { phase: string; above: number }[];
  }

  test('the worked point: the solve result plus canting, the broken symmetry and competitors', () => {
    const model = file('probe.model.json', INTERFACES_EXAMPLE);
    const run = fourfold('probe', '--model', model);
    expect(run.status).toBe(0);
    const probe = JSON.parse(run.stdout) as ProbeOut;
    const solve = JSON.parse(fourfold('solve', '--model', model).stdout) as SolveJson;
    expect(probe.format).toBe('fourfold-probe');
    expect(probe.state.energy).toBe(solve.energy);
    expect(probe.state.phase).toBe(solve.phase);
    expect(probe.state.modes).toEqual(solve.modes);
    // CAF canting cos(theta) = E_Z / (4 |uPerp_F|) = 0.1 (public/notes.html#closed-forms, derived).
    expect(Math.cos(probe.sublattices.a.angleToField)).toBeCloseTo(0.1, 10);
    expect(probe.modes.gapless.map((m) => m.generators)).toEqual([['0z']]);
    expect(probe.competitors[0]).toMatchObject({ phase: 'CAF', above: 0 });
  });

  test('--at takes the point of the plane; --out writes the lattice picture', () => {
    const model = file('probe-plane.model.json', { ...INTERFACES_EXAMPLE, plane: PLANE_24 });
    const out = join(dir, 'probe-lattice.svg');
    const run = fourfold('probe', '--model', model, '--at', '-1.5,1.5', '--out', out);
    expect(run.status).toBe(0);
    const probe = JSON.parse(run.stdout) as ProbeOut;
    expect(probe.point).toEqual({ x: -1.5, y: 1.5 });
    // uPerp = -1.5, uZ = 1.5, E_Z = 0.4: CAF with E = -uZ - E_Z^2 / (8 |uPerp|)
    // (public/notes.html#closed-forms).
    expect(probe.state.phase).toBe('CAF');
    expect(probe.state.energy).toBeCloseTo(-1.5 - 0.16 / 12, 12);
    const svg = readFileSync(out, 'utf8');
    expect(svg).toContain('<svg xmlns="http://www.w3.org/2000/svg" version="1.1"');
    expect(svg).toContain('Fourfold Probe lattice picture: CAF');
  });

  test('bad flags end in one line naming the flag', () => {
    const planeless = file('probe-no-plane.json', INTERFACES_EXAMPLE);
    expectOneLineError(fourfold('probe', '--model', planeless, '--at', '1,1'), ['--at', 'plane']);
    expectOneLineError(fourfold('probe', '--model', planeless, '--at', '1'), ['--at']);
    expectOneLineError(fourfold('probe', '--model', planeless, '--out', 'x.png'), [
      '--out',
      '.svg',
    ]);
    const pair = file('probe-pair.json', [INTERFACES_EXAMPLE, INTERFACES_EXAMPLE]);
    expectOneLineError(fourfold('probe', '--model', pair, '--out', join(dir, 'p.svg')), [
      '--out',
      'one model',
    ]);
    expectOneLineError(fourfold('solve', '--model', planeless, '--at', '1,1'), ['--at', 'probe']);
  });
});

describe('fourfold: every option is used or refused, input is quoted briefly', () => {
  /** One line on stderr, exit code 2, naming every word of `mentions`. */
  function expectRefused(run: Run, mentions: string[]): void {
    expectOneLineError(run, mentions);
    expect(run.status).toBe(2);
  }

  test('solve --out writes the JSON there (nothing on stdout); another ending is refused', () => {
    const model = file('solve-out.model.json', INTERFACES_EXAMPLE);
    const out = join(dir, 'solve-out.json');
    const run = fourfold('solve', '--model', model, '--out', out);
    expect(run.status).toBe(0);
    expect(run.stdout).toBe('');
    expect(run.stderr).toBe('');
    expect(readFileSync(out, 'utf8')).toBe(fourfold('solve', '--model', model).stdout);
    const txt = join(dir, 'solve-out.txt');
    expectRefused(fourfold('solve', '--model', model, '--out', txt), ['--out', '.json']);
    expect(existsSync(txt)).toBe(false);
  });

  test('an option the command does not take is refused, naming the option and the command', () => {
    const model = file('refused.model.json', { ...INTERFACES_EXAMPLE, plane: PLANE_24 });
    const out = join(dir, 'refused.json');
    const cases: [string[], string][] = [
      [['solve', '--threads', '2'], '--threads'],
      [['solve', '--title', 'T'], '--title'],
      [['solve', '--column', 'double'], '--column'],
      [['solve', '--from', '0,0'], '--from'],
      [['probe', '--threads', '2'], '--threads'],
      [['probe', '--column', 'single'], '--column'],
      [['probe', '--n', '5'], '--n'],
      [['cut', '--threads', '2', '--from', '0,0', '--to', '1,1', '--out', out], '--threads'],
      [['cut', '--at', '0,0', '--from', '0,0', '--to', '1,1', '--out', out], '--at'],
      [['map', '--at', '0,0', '--out', out], '--at'],
    ];
    for (const [[command, ...rest], flag] of cases) {
      expectRefused(fourfold(command!, '--model', model, ...rest), [flag, command!]);
    }
    // A figure's options with a data output: refused, not ignored.
    expectRefused(fourfold('map', '--model', model, '--out', out, '--title', 'T'), [
      '--title',
      '.svg',
    ]);
    const csv = join(dir, 'refused.csv');
    expectRefused(
      fourfold(
        'cut',
        '--model',
        model,
        '--from',
        '0,0',
        '--to',
        '1,1',
        '--out',
        csv,
        '--column',
        'double',
      ),
      ['--column', '.svg'],
    );
    expect(existsSync(out)).toBe(false);
    expect(existsSync(csv)).toBe(false);
  });

  test('a repeated option or a stray argument is refused', () => {
    const model = file('repeat.model.json', INTERFACES_EXAMPLE);
    expectRefused(fourfold('solve', '--model', model, '--model', model), ['--model', 'twice']);
    expectRefused(fourfold('solve', '--model', model, 'extra'), ['"extra"']);
    expectRefused(fourfold('solve', '--model', model, '--verbose'), ['"--verbose"', 'unknown']);
  });

  test('a UTF-8 byte order mark before the JSON is accepted', () => {
    const plain = file('no-bom.json', INTERFACES_EXAMPLE);
    const withBom = file('bom.json', `\ufeff${JSON.stringify(INTERFACES_EXAMPLE)}`);
    expect(readFileSync(withBom).subarray(0, 3)).toEqual(Buffer.from([0xef, 0xbb, 0xbf]));
    const run = fourfold('solve', '--model', withBom);
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    expect(run.stdout).toBe(fourfold('solve', '--model', plain).stdout);
  });

  test('long input is quoted briefly: every message stays one line of about 120 characters', () => {
    const long = 'k'.repeat(100_000);
    const runs = [
      fourfold('solve', '--model', file('long-key.json', { ...INTERFACES_EXAMPLE, [long]: 1 })),
      fourfold(
        'solve',
        '--model',
        file('long-channel.json', { filling: 0, channels: { [long]: 1 } }),
      ),
      fourfold(
        'solve',
        '--model',
        file('newline-key.json', { filling: 0, ['a\nb'.repeat(50)]: 1 }),
      ),
      fourfold('solve', '--model', file('long-string.json', { filling: long })),
      fourfold('solve', '--model', join(dir, 'p'.repeat(3000))),
      fourfold('solve', '--model', file('long-ok.json', INTERFACES_EXAMPLE), long.slice(0, 5000)),
      fourfold('cut', '--model', 'm.json', '--from', `0,${long.slice(0, 5000)}`),
      fourfold('c'.repeat(5000)),
    ];
    for (const run of runs) {
      expectOneLineError(run, ['\u2026']);
      // The longest is an unknown top-level field: the key cut to 16 characters, then the list
      // of a model's fields (134 characters since the list names coulomb).
      expect(run.stderr.trimEnd().length).toBeLessThanOrEqual(135);
    }
  });
});
