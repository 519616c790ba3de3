import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { standardPlane } from './fixtures';

// `fit` driven as the README (Command line, Which couplings explain a sample) describes it.

const repoRoot = resolve(fileURLToPath(new URL('.', import.meta.url)), '..');

/** E_Z per tesla at zero tilt, g mu_B with g = 2 and mu_B from CODATA 2018 (E. Tiesinga et al.,
 * Rev. Mod. Phys. 93, 025010 (2021)), meV/T. */
const A = 2 * 5.788381806e-2;

function fourfold(...args: string[]) {
  const result = spawnSync(process.execPath, ['fourfold.mjs', ...args], {
    cwd: repoRoot,
    encoding: 'utf8',
  });
  return { status: result.status, stdout: result.stdout, stderr: result.stderr };
}

let dir = '';

function file(name: string, content: unknown): string {
  const path = join(dir, name);
  writeFileSync(path, typeof content === 'string' ? content : JSON.stringify(content));
  return path;
}

const PLANE = {
  filling: 0,
  channels: {},
  zeeman: 3,
  valleyZeeman: 0,
  plane: standardPlane(8, 6, [-0.12, -0.02], [0.15, 0.4]),
};
const HEADER = 'bPerp_T,tilt_deg,valleyZeeman_meV,kind,value,sigma';

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'fourfold-fit-test-'));
  fourfold('--help');
});

afterAll(() => {
  if (dir !== '') rmSync(dir, { recursive: true, force: true });
});

describe('fourfold fit', () => {
  test('writes the estimate, the grid and each row as JSON (FIT.json)', () => {
    const model = file('plane.json', PLANE);
    const observations = file(
      'obs.csv',
      [HEADER, '2,,,transition_tilt,60,1', '7,,,transition_tilt,60,2', '4,0,,phase,CAF,', ''].join(
        '\r\n',
      ),
    );
    const out = join(dir, 'fit.json');
    const run = fourfold(
      'fit',
      '--model',
      model,
      '--observations',
      observations,
      '--out',
      out,
      '--threads',
      '2',
    );
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    expect(run.stdout).toBe('');
    const fit = JSON.parse(readFileSync(out, 'utf8'));
    // The file's zeeman (3) is not used: E_Z comes from each row's field and tilt.
    const truth = -A / (4 * Math.cos(Math.PI / 3));
    expect(fit.parameters.x.label).toBe('u_perp');
    expect(Math.abs(fit.parameters.x.estimate - truth)).toBeLessThan(1e-6 * Math.abs(truth));
    const slope = (A / (4 * truth ** 2 * Math.sin(Math.PI / 3))) * (180 / Math.PI);
    const sigma = 1 / Math.sqrt(slope ** 2 + (slope / 2) ** 2);
    expect(fit.parameters.x.sigma / sigma).toBeCloseTo(1, 4);
    expect(fit.parameters.x.interval).toHaveLength(2);
    expect(fit.parameters.y).toMatchObject({
      label: 'u_z',
      estimate: null,
      sigma: null,
      interval: [0.15, 0.4],
    });
    expect(fit.chi2).toBeLessThan(1e-12);
    expect(fit.dof).toBe(1);
    expect(fit.grid.x).toHaveLength(8);
    expect(fit.grid.y).toHaveLength(6);
    expect(fit.grid.consistent).toHaveLength(6);
    expect(fit.grid.rows).toHaveLength(6);
    for (let j = 0; j < 6; j++) {
      expect(fit.grid.consistent[j]).toHaveLength(8);
      fit.grid.rows[j].forEach((held: number, i: number) => {
        expect(fit.grid.consistent[j][i]).toBe(held === 3);
      });
    }
    expect(fit.observations.map((o: { row: number; kind: string }) => [o.row, o.kind])).toEqual([
      [1, 'transition_tilt'],
      [2, 'transition_tilt'],
      [3, 'phase'],
    ]);
    expect(fit.observations[0].observed).toBe(60);
    expect(fit.observations[0].predicted).toBeCloseTo(60, 6);
    expect(Math.abs(fit.observations[0].residual)).toBeLessThan(1e-6);
    expect(fit.observations[2]).toMatchObject({
      observed: 'CAF',
      predicted: 'CAF',
      residual: null,
    });
    expect(fit.caution).toContain('Mean-field');
  });

  test.each([
    ['a word for a tilt', '5,,,transition_tilt,sixty,1', ['row 2', 'column value', 'sixty']],
    ['a transition without sigma', '5,,,transition_tilt,60,', ['row 2', 'column sigma']],
    ['an unknown kind', '5,0,,phaze,CAF,', ['row 2', 'column kind', 'phaze']],
    ['an unknown state', '5,0,,phase,FM,', ['row 2', 'column value', 'FM']],
    ['a phase with a sigma', '5,0,,phase,CAF,1', ['row 2', 'column sigma']],
    ['a field of zero', '0,0,,phase,CAF,', ['row 2', 'column bPerp_T']],
    ['a missing cell', '5,0,phase,CAF,', ['row 2', 'expected 6 cells']],
  ])('%s: one line naming row and column, exit 1', (_, line, mentions) => {
    const model = file('plane-bad.json', PLANE);
    const observations = file('bad.csv', [HEADER, '2,,,transition_tilt,60,1', line].join('\n'));
    const run = fourfold('fit', '--model', model, '--observations', observations);
    expect(run.status).toBe(1);
    expect(run.stdout).toBe('');
    const lines = run.stderr.trimEnd().split('\n');
    expect(lines).toHaveLength(1);
    expect(lines[0]!.startsWith('fourfold: --observations')).toBe(true);
    for (const word of mentions) expect(lines[0]).toContain(word);
  });

  test('a wrong header is named, with the header expected', () => {
    const model = file('plane-header.json', PLANE);
    const observations = file('header.csv', 'B,tilt,kind,value\n2,0,phase,CAF\n');
    const run = fourfold('fit', '--model', model, '--observations', observations);
    expect(run.status).toBe(1);
    expect(run.stderr).toContain(
      'header: expected bPerp_T,tilt_deg,valleyZeeman_meV,kind,value,sigma',
    );
    expect(run.stderr.trimEnd().split('\n')).toHaveLength(1);
  });

  test('an axis that sets E_Z is refused: E_Z comes from each row', () => {
    const plane = standardPlane(8, 8);
    const model = file('plane-zeeman.json', {
      ...PLANE,
      plane: { ...plane, y: { ...plane.y, targets: { zeeman: 1 } } },
    });
    const observations = file('ok.csv', [HEADER, '2,0,,phase,CAF,'].join('\n'));
    const run = fourfold('fit', '--model', model, '--observations', observations);
    expect(run.status).toBe(1);
    expect(run.stderr).toContain('plane.y.targets.zeeman');
    expect(run.stderr.trimEnd().split('\n')).toHaveLength(1);
  });
});
