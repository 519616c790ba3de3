import { spawnSync } from 'node:child_process';
import {
  copyFileSync,
  mkdtempSync,
  readFileSync,
  readdirSync,
  rmSync,
  statSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { parseXmlStrictly, textsOf } from './strictParsers';

// Shards, merges and series through the command line, as README "Large Maps, shards and series"
// describes them: child processes of fourfold.mjs, as a scheduler would start them.

const repoRoot = resolve(fileURLToPath(new URL('.', import.meta.url)), '..');

interface Run {
  status: number | null;
  stdout: string;
  stderr: string;
}

function fourfold(...args: string[]): Run {
  const r = spawnSync(process.execPath, ['fourfold.mjs', ...args], {
    cwd: repoRoot,
    encoding: 'utf8',
  });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

function expectOk(run: Run): void {
  expect(run.stderr).toBe('');
  expect(run.status).toBe(0);
}

/** One line on stderr naming the problem, the exit code given. */
function expectRefused(run: Run, status: number, mentions: string[]): void {
  expect(run.status).toBe(status);
  expect(run.stdout).toBe('');
  const lines = run.stderr.trimEnd().split('\n');
  expect(lines).toHaveLength(1);
  expect(lines[0]!.startsWith('fourfold: ')).toBe(true);
  for (const word of mentions) expect(lines[0]).toContain(word);
}

/** The invented sample of public/examples/sample-map.json on a smaller plane. */
function sample(nx: number, ny: number, zeeman = 0.5) {
  return {
    filling: 0,
    channels: {
      x0: { hartree: -0.8, fock: -1.0 },
      y0: { hartree: -0.8, fock: -1.0 },
      z0: { fock: 1.5 },
    },
    zeeman,
    valleyZeeman: 0.1,
    plane: {
      x: {
        label: 'u_perp',
        from: -2,
        to: 2,
        targets: { 'x0.fock': 1, 'y0.fock': 1, 'x0.hartree': 0.8, 'y0.hartree': 0.8 },
      },
      y: { label: 'u_z', from: -2, to: 2, targets: { 'z0.fock': 1, 'z0.hartree': 1 } },
      resolution: [nx, ny],
    },
  };
}

let dir = '';
const path = (name: string) => join(dir, name);
const bytes = (name: string) => readFileSync(path(name));

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'fourfold-shards-test-'));
  fourfold('--help');
});

afterAll(() => {
  if (dir !== '') rmSync(dir, { recursive: true, force: true });
});

describe('map --shard K/N and merge', () => {
  const formats = ['json', 'csv', 'svg'] as const;

  beforeAll(() => {
    writeFileSync(path('model.json'), JSON.stringify(sample(64, 48)));
    for (const format of formats) {
      expectOk(fourfold('map', '--model', path('model.json'), '--out', path(`single.${format}`)));
    }
  }, 300_000);

  test('3 shards run side by side through xargs -P, merged in any order: the single run, byte for byte', () => {
    const run = spawnSync(
      'sh',
      [
        '-c',
        `printf '%s\\n' 1 2 3 | xargs -P 3 -I K "${process.execPath}" fourfold.mjs map --model "${path('model.json')}" --shard K/3 --threads 1 --out "${path('part-K.json')}"`,
      ],
      { cwd: repoRoot, encoding: 'utf8' },
    );
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    // A boundary crosses the seams: merge had crossings to locate there.
    const seams = readFileSync(path('part-2.json'), 'utf8')
      .split('\n')
      .filter((line) => line.startsWith('{"j":') && line.includes('"frames"'))
      .map((line) => JSON.parse(line.replace(/,$/, '')) as { j: number; phase: string[] });
    expect(seams.map((s) => s.j)).toEqual([16, 31]);
    const above = readFileSync(path('part-1.json'), 'utf8')
      .split('\n')
      .find((line) => line.startsWith('{"j":15,') && line.includes('"frames"'))!;
    const lower = (JSON.parse(above) as { phase: string[] }).phase;
    expect(lower.some((label, i) => label !== seams[0]!.phase[i])).toBe(true);
    for (const format of formats) {
      const out = `merged.${format}`;
      expectOk(
        fourfold(
          'merge',
          '--out',
          path(out),
          path('part-2.json'),
          path('part-3.json'),
          path('part-1.json'),
        ),
      );
      expect(bytes(out).equals(bytes(`single.${format}`))).toBe(true);
    }
    // Nothing half-written is left beside the outputs.
    expect(readdirSync(dir).filter((name) => name.startsWith('.'))).toEqual([]);
  });

  test('merge refuses parts that do not make one Map, in one line each', () => {
    const merge = (...parts: string[]) =>
      fourfold('merge', '--out', path('bad.json'), ...parts.map(path));
    expectRefused(merge('part-1.json', 'part-3.json'), 1, ['part 2 of 3 is missing']);
    expectRefused(merge('part-1.json', 'part-2.json', 'part-1.json'), 1, ['part-1.json', 'again']);
    const first = (name: string) => readFileSync(path(name), 'utf8').split('\n')[0]!;
    const edited = (name: string, from: string, to: string) => {
      const text = readFileSync(path('part-2.json'), 'utf8');
      expect(first('part-2.json')).toContain(from);
      writeFileSync(path(name), text.replace(from, to));
    };
    edited('other-model.json', '"zeeman":0.5', '"zeeman":0.6');
    expectRefused(merge('part-1.json', 'other-model.json', 'part-3.json'), 1, [
      'other-model.json',
      'not a part of the same Map',
    ]);
    edited('other-version.json', '"version":"', '"version":"9.');
    expectRefused(merge('part-1.json', 'other-version.json', 'part-3.json'), 1, [
      'other-version.json',
      'written by fourfold',
    ]);
    edited('other-count.json', '"shard":[2,3]', '"shard":[2,4]');
    expectRefused(merge('part-1.json', 'other-count.json', 'part-3.json'), 1, ['one of 4 parts']);
    const lines = readFileSync(path('part-2.json'), 'utf8').split('\n');
    writeFileSync(path('cut-short.json'), lines.slice(0, 9).join('\n') + '\n');
    expectRefused(merge('part-1.json', 'cut-short.json', 'part-3.json'), 1, [
      'cut-short.json',
      'incomplete',
    ]);
    expectRefused(merge('part-1.json', 'model.json', 'part-3.json'), 1, [
      'model.json',
      'not a part of a Map',
    ]);
    expectRefused(merge('part-1.json', 'no-such-part.json'), 1, [
      'no-such-part.json',
      'no such file',
    ]);
    expect(() => statSync(path('bad.json'))).toThrow();
  });

  test('the command line of shards and merges: every option used or refused (exit 2)', () => {
    const model = path('model.json');
    expectRefused(fourfold('map', '--model', model, '--shard', '0/3', '--out', path('p.json')), 2, [
      '--shard',
      '"0/3"',
    ]);
    expectRefused(fourfold('map', '--model', model, '--shard', '4/3', '--out', path('p.json')), 2, [
      '--shard',
    ]);
    expectRefused(
      fourfold('map', '--model', model, '--shard', '1/25', '--out', path('p.json')),
      2,
      ['has 24 rows of coarse cells'],
    );
    expectRefused(fourfold('map', '--model', model, '--shard', '1/3', '--out', path('p.csv')), 2, [
      'end it in .json',
    ]);
    expectRefused(
      fourfold('map', '--model', model, '--shard', '1/3', '--title', 'T', '--out', path('p.json')),
      2,
      ['--title', 'only for a figure'],
    );
    expectRefused(fourfold('merge', '--out', path('m.json')), 2, ['no parts given']);
    expectRefused(fourfold('merge', '--out', path('m.txt'), path('part-1.json')), 2, [
      '.json, .csv or .svg',
    ]);
    expectRefused(
      fourfold('merge', '--title', 'T', '--out', path('m.csv'), path('part-1.json')),
      2,
      ['--title', 'only for a figure'],
    );
    expectRefused(fourfold('merge', '--model', model, '--out', path('m.json')), 2, [
      '--model',
      'merge does not take it',
    ]);
  });
});

describe('series of Maps', () => {
  const values = '0.2,0.5,0.8';

  beforeAll(() => {
    writeFileSync(path('series-model.json'), JSON.stringify(sample(16, 12)));
    expectOk(
      fourfold(
        'series',
        '--model',
        path('series-model.json'),
        '--vary',
        'zeeman',
        '--values',
        values,
        '--out',
        path('series'),
      ),
    );
  }, 300_000);

  test('one JSON per value with its provenance, each the map of its model; one figure of small multiples', () => {
    expect(readdirSync(path('series')).sort()).toEqual([
      'map-01.json',
      'map-02.json',
      'map-03.json',
      'series.svg',
    ]);
    const second = readFileSync(path('series/map-02.json'), 'utf8');
    const json = JSON.parse(second) as {
      model: { zeeman: number };
      series: Record<string, unknown>;
      caution: string;
      version: string;
    };
    expect(json.model.zeeman).toBe(0.5);
    expect(json.series).toEqual({ vary: 'zeeman', value: 0.5, index: 2, of: 3 });
    expect(json.caution).toContain('Mean-field');
    // Without its series value, the file is what `map` writes for that model.
    writeFileSync(path('zeeman-0.5.json'), JSON.stringify(sample(16, 12, 0.5)));
    expectOk(
      fourfold('map', '--model', path('zeeman-0.5.json'), '--out', path('zeeman-0.5.map.json')),
    );
    expect(second.replace(/,"series":\{[^}]*\}/, '')).toBe(
      readFileSync(path('zeeman-0.5.map.json'), 'utf8'),
    );
    const doc = parseXmlStrictly(readFileSync(path('series/series.svg'), 'utf8'));
    const panels = Array.from(doc.getElementsByTagName('g')).filter((g) =>
      /^panel-\d+$/.test(g.getAttribute('id') ?? ''),
    );
    expect(panels).toHaveLength(3);
    const texts = textsOf(doc).join('|');
    for (const v of ['0.2', '0.5', '0.8']) expect(texts).toContain(`= ${v}`);
    // One legend, shared axes: each axis title once.
    expect(doc.getElementsByTagName('desc')[0]!.textContent).toContain('zeeman = 0.2, 0.5, 0.8');
    expect(textsOf(doc).filter((t) => t === 'u\u22a5')).toHaveLength(1);
    expect(textsOf(doc).filter((t) => t === 'uz')).toHaveLength(1);
    expect(textsOf(doc).filter((t) => t === 'CAF')).toHaveLength(1);
  });

  test('a rerun keeps the finished maps and redoes one that is cut short', () => {
    const mtime = (name: string) => statSync(path(`series/${name}`)).mtimeMs;
    const before = ['map-01.json', 'map-02.json', 'map-03.json'].map(mtime);
    const whole = readFileSync(path('series/map-03.json'));
    writeFileSync(path('series/map-03.json'), whole.subarray(0, whole.length - 40));
    expectOk(
      fourfold(
        'series',
        '--model',
        path('series-model.json'),
        '--vary',
        'zeeman',
        '--values',
        values,
        '--out',
        path('series'),
      ),
    );
    expect(['map-01.json', 'map-02.json'].map(mtime)).toEqual(before.slice(0, 2));
    expect(readFileSync(path('series/map-03.json')).equals(whole)).toBe(true);
  });

  test('sharded: every map in pieces, then one plain run merges them into the same files', () => {
    const args = ['--model', path('series-model.json'), '--vary', 'zeeman', '--values', values];
    expectOk(fourfold('series', ...args, '--shard', '2/2', '--out', path('sharded/fig.svg')));
    expect(readdirSync(path('sharded')).sort()).toEqual([
      'fig-01.part-2-of-2.json',
      'fig-02.part-2-of-2.json',
      'fig-03.part-2-of-2.json',
    ]);
    expectOk(fourfold('series', ...args, '--shard', '1/2', '--out', path('sharded/fig.svg')));
    expectOk(fourfold('series', ...args, '--out', path('sharded/fig.svg')));
    for (const k of [1, 2, 3]) {
      expect(bytes(`sharded/fig-0${k}.json`).equals(bytes(`series/map-0${k}.json`))).toBe(true);
    }
    expect(bytes('sharded/fig.svg').equals(bytes('series/series.svg'))).toBe(true);
  });

  test('the command line of series: bad quantities and values refused in one line', () => {
    const model = path('series-model.json');
    const series = (...args: string[]) =>
      fourfold('series', '--model', model, '--out', path('never'), ...args);
    expectRefused(series('--vary', 'x0.fock', '--values', values), 2, [
      'x axis sets x0.fock',
      'every map would be the same',
    ]);
    expectRefused(series('--vary', 'qq.fock', '--values', values), 2, ['"qq"', 'not a channel']);
    expectRefused(series('--vary', 'zeeman', '--values', '0.1,x'), 2, [
      '"x"',
      'not a finite number',
    ]);
    expectRefused(series('--vary', 'zeeman', '--values', '0:1:1'), 2, ['from:to:n']);
    expectRefused(series('--values', values), 2, ['--vary', 'missing']);
    expect(() => statSync(path('never'))).toThrow();
  });
});
