import { spawnSync } from 'node:child_process';
import {
  chmodSync,
  mkdirSync,
  mkdtempSync,
  readFileSync,
  readdirSync,
  rmSync,
  statSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { CHANNELS, seededRandom } from '../solver/index';
import { fourfold, repoRoot, type Run } from './cliRun';
import { randomMapDocument, sampleMapDocument } from './fixtures';
import { parseXmlStrictly, textsOf } from './strictParsers';

// Shards, merges and series through the command line, as README "Large Maps, shards and series"
// describes them: child processes of fourfold.mjs, as a scheduler would start them.

/** Runs a script of public/examples/ with `sh`, from the repository folder, with `env` added. */
function example(script: string, env: Record<string, string>): Run {
  const r = spawnSync('sh', [join('public/examples', script)], {
    cwd: repoRoot,
    encoding: 'utf8',
    env: { ...process.env, ...env },
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

/**
 * `map --shard K/N --threads 1` of `model` for each K of `shards`, `jobs` at a time through
 * `xargs -P` (as a scheduler starts them), into `part` with {} standing for K.
 */
function shardsSideBySide(
  model: string,
  shards: number[],
  n: number,
  jobs: number,
  part: string,
): void {
  const run = spawnSync(
    'sh',
    [
      '-c',
      `printf '%s\\n' ${shards.join(' ')} | xargs -P ${jobs} -I {} "${process.execPath}" fourfold.mjs map --model "${model}" --shard {}/${n} --threads 1 --out "${part}"`,
    ],
    { cwd: repoRoot, encoding: 'utf8' },
  );
  expect(run.stderr).toBe('');
  expect(run.status).toBe(0);
}

/** The pixel rows [first, end) a part's first line names. */
function partRows(file: string): [number, number] {
  const first = readFileSync(file, 'utf8').split('\n')[0]!;
  return (JSON.parse(first.replace(/,$/, '}')) as { rows: [number, number] }).rows;
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
    writeFileSync(path('model.json'), JSON.stringify(sampleMapDocument(64, 48)));
    for (const format of formats) {
      expectOk(fourfold('map', '--model', path('model.json'), '--out', path(`single.${format}`)));
    }
  }, 300_000);

  test('3 shards run side by side through xargs -P, merged in any order: the single run, byte for byte', () => {
    shardsSideBySide(path('model.json'), [1, 2, 3], 3, 3, path('part-{}.json'));
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
  }, 300_000);

  test('a random plane (seeded; both axes reversed, no fields, four phases), 5 shards: merged JSON and CSV are the single run, byte for byte', () => {
    const random = seededRandom(20261216);
    let document: ReturnType<typeof randomMapDocument> = {};
    for (let k = 0; k < 24; k++) document = randomMapDocument(random);
    (document.plane as { resolution: number[] }).resolution = [37, 29];
    writeFileSync(path('random-model.json'), JSON.stringify(document));
    for (const format of ['json', 'csv']) {
      expectOk(
        fourfold('map', '--model', path('random-model.json'), '--out', path(`random.${format}`)),
      );
    }
    shardsSideBySide(path('random-model.json'), [5, 4, 3, 2, 1], 5, 2, path('random-part-{}.json'));
    const whole = JSON.parse(readFileSync(path('random.json'), 'utf8')) as {
      y: number[];
      phases: { label: string }[];
      boundaries: { points: [number, number][] }[];
    };
    expect(whole.phases.length).toBeGreaterThanOrEqual(4);
    // Seams between the parts' pixel rows; the F | CAF and CAF | AF boundaries run along two of
    // them, so points of them lie on edges across a seam (between the centres of its two pixel
    // rows), which only merge locates.
    const seams = [2, 3, 4, 5].map((k) => partRows(path(`random-part-${k}.json`))[0]);
    expect(seams).toEqual([6, 12, 18, 24]);
    const acrossSeam = (j: number) => {
      const [below, above] = [whole.y[j - 1]!, whole.y[j]!].sort((a, b) => a - b);
      return whole.boundaries.flatMap((b) => b.points.filter(([, y]) => y > below! && y < above!))
        .length;
    };
    expect(acrossSeam(12)).toBeGreaterThan(20);
    expect(acrossSeam(18)).toBeGreaterThan(20);
    const parts = [1, 2, 3, 4, 5].map((k) => path(`random-part-${k}.json`));
    for (const format of ['json', 'csv']) {
      expectOk(fourfold('merge', '--out', path(`random-merged.${format}`), ...parts.reverse()));
      expect(bytes(`random-merged.${format}`).equals(bytes(`random.${format}`))).toBe(true);
    }
  }, 300_000);

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

  test('public/examples/map-parallel.sh (GNU parallel stood in for by a script that runs its jobs one by one): the single run', () => {
    // The stand-in takes `parallel -j N COMMAND... ::: ARGS...` and runs COMMAND once per ARG
    // with {} replaced by it, as GNU parallel does (its -j only limits how many run at once).
    const bin = path('bin');
    mkdirSync(bin);
    writeFileSync(
      join(bin, 'parallel'),
      `#!${process.execPath}\n` +
        "const { spawnSync } = require('node:child_process');\n" +
        'const argv = process.argv.slice(2);\n' +
        "if (argv[0] !== '-j') process.exit(9);\n" +
        "const split = argv.indexOf(':::');\n" +
        'const command = argv.slice(2, split);\n' +
        'for (const arg of argv.slice(split + 1)) {\n' +
        "  const words = command.map((w) => w.split('{}').join(arg));\n" +
        "  const r = spawnSync(words[0], words.slice(1), { stdio: 'inherit' });\n" +
        '  if (r.status !== 0) process.exit(r.status ?? 1);\n' +
        '}\n',
    );
    chmodSync(join(bin, 'parallel'), 0o755);
    const run = example('map-parallel.sh', {
      PATH: `${bin}:${process.env.PATH ?? ''}`,
      MODEL: path('model.json'),
      PARTS: path('parallel-parts'),
      OUT: path('parallel.json'),
    });
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    expect(readdirSync(path('parallel-parts')).sort()).toEqual(
      [1, 2, 3, 4, 5, 6, 7, 8].map((k) => `part-${k}.json`).sort(),
    );
    expect(bytes('parallel.json').equals(bytes('single.json'))).toBe(true);
  }, 300_000);

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
      fourfold('map', '--model', model, '--shard', '1/13', '--out', path('p.json')),
      2,
      ['has 12 rows of coarse cells', 'at most 12 shards'],
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

describe('grids of more than 2048 per side (long, thin strips, so that they are cheap)', () => {
  /**
   * The invented sample on a strip of its (u_perp, u_z) plane in its CAF and F regions: their
   * boundary (at u_perp near -0.125, whatever u_z) runs along a tall strip and across a wide one.
   */
  const strip = (nx: number, ny: number, x: [number, number], y: [number, number]) => {
    const document = sampleMapDocument(nx, ny);
    Object.assign(document.plane.x, { from: x[0], to: x[1] });
    Object.assign(document.plane.y, { from: y[0], to: y[1] });
    return document;
  };
  /** `map --out` of the whole Map into single.json and single.csv, one thread. */
  const single = (name: string) => {
    for (const format of ['json', 'csv']) {
      expectOk(
        fourfold(
          'map',
          '--model',
          path(`${name}-model.json`),
          '--threads',
          '1',
          '--out',
          path(`${name}-single.${format}`),
        ),
      );
    }
  };
  /** merge of the given parts into JSON and CSV: the single run's files, byte for byte. */
  const expectMergedAsSingle = (name: string, parts: string[]) => {
    for (const format of ['json', 'csv']) {
      expectOk(fourfold('merge', '--out', path(`${name}.${format}`), ...parts.map(path)));
      expect(bytes(`${name}.${format}`).equals(bytes(`${name}-single.${format}`))).toBe(true);
    }
  };

  beforeAll(() => {
    writeFileSync(
      path('tall-model.json'),
      JSON.stringify(strip(2, 2100, [-0.3, 0.05], [0.2, 1.5])),
    );
    writeFileSync(path('wide-model.json'), JSON.stringify(strip(2100, 2, [-0.6, 0.3], [0.4, 0.6])));
  });

  test('2 x 2100 in 3 shards (17 rows of coarse cells of 128 pixel rows), merged: the single run in JSON and CSV, byte for byte, its boundary whole across both seams', () => {
    single('tall');
    shardsSideBySide(path('tall-model.json'), [3, 1, 2], 3, 2, path('tall-{}.json'));
    expect([1, 2, 3].map((k) => partRows(path(`tall-${k}.json`)))).toEqual([
      [0, 640],
      [640, 1408],
      [1408, 2100],
    ]);
    expectMergedAsSingle('tall', ['tall-3.json', 'tall-1.json', 'tall-2.json']);
    const map = JSON.parse(bytes('tall.json').toString('utf8')) as {
      y: number[];
      boundaries: { between: string[]; points: [number, number][] }[];
    };
    // One polyline from the bottom of the strip to its top, through both seams.
    expect(map.boundaries.map((b) => [b.between.join('|'), b.points.length])).toEqual([
      ['CAF|F', 2100],
    ]);
    const ys = map.boundaries[0]!.points.map(([, y]) => y);
    expect(Math.min(...ys)).toBe(map.y[0]);
    expect(Math.max(...ys)).toBe(map.y[2099]);
  }, 300_000);

  test('2100 x 2 in one shard (a single row of coarse cells), merged: the single run in JSON and CSV, byte for byte', () => {
    single('wide');
    expectOk(
      fourfold(
        'map',
        '--model',
        path('wide-model.json'),
        '--shard',
        '1/1',
        '--threads',
        '1',
        '--out',
        path('wide-1.json'),
      ),
    );
    expectMergedAsSingle('wide', ['wide-1.json']);
    const map = JSON.parse(bytes('wide.json').toString('utf8')) as { phases: { label: string }[] };
    expect(map.phases.map((p) => p.label).sort()).toEqual(['CAF', 'F']);
  }, 300_000);

  test('what holds a whole Map (a figure, a series) refuses above 2048 per side, and any side above 8192 is refused, in one line', () => {
    expectRefused(
      fourfold('map', '--model', path('tall-model.json'), '--out', path('tall.svg')),
      2,
      ['plane.resolution[1]: 2100 is more than a figure draws (at most 2048 per side)', '.csv'],
    );
    expectRefused(fourfold('merge', '--out', path('wide.svg'), path('wide-1.json')), 2, [
      'plane.resolution[0]: 2100 is more than a figure draws (at most 2048 per side)',
    ]);
    expectRefused(
      fourfold(
        'series',
        '--model',
        path('wide-model.json'),
        '--vary',
        'zeeman',
        '--values',
        '0.4,0.5',
        '--out',
        path('wide-series'),
      ),
      2,
      ['plane.resolution[0]: 2100 is more than a series draws in its figure', '--shard K/N'],
    );
    expectRefused(
      fourfold(
        'map',
        '--model',
        path('wide-model.json'),
        '--shard',
        '1/2',
        '--out',
        path('p.json'),
      ),
      2,
      ['a 2100 x 2 map has 1 row of coarse cells', 'use 1 shard'],
    );
    writeFileSync(path('huge-model.json'), JSON.stringify(strip(8193, 2, [0, 1], [0, 1])));
    expectRefused(fourfold('map', '--model', path('huge-model.json'), '--out', path('h.csv')), 1, [
      'plane.resolution[0]: expected an integer from 2 to 8192, got 8193',
    ]);
    for (const name of ['tall.svg', 'wide.svg', 'wide-series', 'p.json', 'h.csv']) {
      expect(() => statSync(path(name))).toThrow();
    }
  });
});

describe('series of Maps', () => {
  const values = '0.2,0.5,0.8';
  /** `series` of the small sample over three Zeeman energies. */
  const series = (...args: string[]) =>
    fourfold(
      'series',
      '--model',
      path('series-model.json'),
      '--vary',
      'zeeman',
      '--values',
      values,
      ...args,
    );

  beforeAll(() => {
    writeFileSync(path('series-model.json'), JSON.stringify(sampleMapDocument(16, 12)));
    expectOk(series('--out', path('series')));
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
    writeFileSync(path('zeeman-0.5.json'), JSON.stringify(sampleMapDocument(16, 12, 0.5)));
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
    expectOk(series('--out', path('series')));
    expect(['map-01.json', 'map-02.json'].map(mtime)).toEqual(before.slice(0, 2));
    expect(readFileSync(path('series/map-03.json')).equals(whole)).toBe(true);
  }, 300_000);

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
    // A series map's parts merged into CSV: its lines name the model, plane, version, caution
    // and the series value.
    expectOk(
      fourfold(
        'merge',
        '--out',
        path('sharded/fig-02.csv'),
        path('sharded/fig-02.part-2-of-2.json'),
        path('sharded/fig-02.part-1-of-2.json'),
      ),
    );
    const head = readFileSync(path('sharded/fig-02.csv'), 'utf8').split('\n').slice(0, 5);
    expect(head[0]).toContain('Mean-field');
    expect(head[1]).toMatch(/^# fourfold \S+; model \{.*"zeeman":0\.5/);
    expect(head[2]).toMatch(/^# plane \{/);
    expect(head[3]).toBe('# series {"vary":"zeeman","value":0.5,"index":2,"of":3}');
    expect(head[4]).toBe(['u_perp', 'u_z', 'phase', 'energy', 'gap', ...CHANNELS].join(','));
  }, 300_000);

  test('public/examples/series-array.sh as a Slurm job array of 2 tasks, then its merging job: the same files as one run', () => {
    const job = {
      MODEL: path('series-model.json'),
      VARY: 'zeeman',
      VALUES: values,
      OUT: path('array'),
    };
    for (const task of ['2', '1']) {
      const run = example('series-array.sh', {
        ...job,
        SLURM_ARRAY_TASK_ID: task,
        SLURM_ARRAY_TASK_COUNT: '2',
      });
      expect(run.stderr).toBe('');
      expect(run.status).toBe(0);
    }
    expect(readdirSync(path('array')).filter((name) => name.endsWith('.json'))).toHaveLength(6);
    const merge = example('series-array.sh', job);
    expect(merge.stderr).toBe('');
    expect(merge.status).toBe(0);
    for (const name of ['map-01.json', 'map-02.json', 'map-03.json', 'series.svg']) {
      expect(bytes(`array/${name}`).equals(bytes(`series/${name}`))).toBe(true);
    }
  }, 300_000);

  test('the command line of series: bad quantities and values refused in one line', () => {
    const refusal = (...args: string[]) =>
      fourfold('series', '--model', path('series-model.json'), '--out', path('never'), ...args);
    expectRefused(refusal('--vary', 'x0.fock', '--values', values), 2, [
      'x axis sets x0.fock',
      'every map would be the same',
    ]);
    expectRefused(refusal('--vary', 'qq.fock', '--values', values), 2, ['"qq"', 'not a channel']);
    expectRefused(refusal('--vary', 'zeeman', '--values', '0.1,x'), 2, [
      '"x"',
      'not a finite number',
    ]);
    expectRefused(refusal('--vary', 'zeeman', '--values', '0:1:1'), 2, ['from:to:n']);
    expectRefused(refusal('--values', values), 2, ['--vary', 'missing']);
    expectRefused(series('--out', path('never.png')), 2, [
      'never.png',
      'give a folder or end it in .svg',
    ]);
    expect(() => statSync(path('never.png'))).toThrow();
    expect(() => statSync(path('never'))).toThrow();
  });
});
