import { describe, expect, test } from 'vitest';
import { errorOf, standardPlane } from './fixtures';
import {
  BISECTION_TOLERANCE,
  MAX_CUT_POINTS,
  ORDER_GROUPS,
  CUT_DISTANCE_LABEL,
  computeCut,
  parseMapInput,
  type CutResult,
} from '../solver/index';
import { cutFigureSvg } from '../app/figure/cutFigure';
import { DEFAULT_CUT_POINTS, cutFromJson } from '../app/store/cutSlice';
import { cutPathOf } from '../app/cut/cutPath';
import { DEMO_SETUP } from '../app/scenario/demo';
import { setupToScenario } from '../app/scenario/scenario';

/** The standard model (H = F) on the (uPerp, uZ) plane (test/fixtures.ts), at E_Z and Delta_V. */
function standardInput(zeeman: number, valleyZeeman = 0) {
  return parseMapInput({
    filling: 0,
    channels: {},
    zeeman,
    valleyZeeman,
    plane: standardPlane(16, 16),
  });
}

const group = (cut: CutResult, key: string, i: number): number =>
  cut.groups[ORDER_GROUPS.length * i + ORDER_GROUPS.findIndex((g) => g.key === key)]!;

describe('Cut: a tilt sweep at fixed couplings in the CAF region', () => {
  // uPerp = -1, uZ = 2 (H = F), E_Z at zero tilt 0.4, tilt 0 to 85 degrees at fixed
  // perpendicular field: E_Z = 0.4 / cos(theta) (public/notes.html#units). CAF turns into F where
  // E_Z = 4 |uPerp_F| with cos(canting) = E_Z / (4 |uPerp_F|) before it
  // (public/notes.html#closed-forms; Phys. Rev. B 85, 155439 (2012), whose Zeeman symbol differs
  // from our full splitting E_Z by a factor, so its condition reads E_Z = 4 |uPerp| in our
  // convention, public/notes.html#checks).
  const zeemanPerp = 0.4;
  const cut = computeCut(
    standardInput(0.4),
    { kind: 'tilt', at: [-1, 2], from: 0, to: 85, zeemanPerp },
    200,
  );
  const critical = (Math.acos(zeemanPerp / 4) * 180) / Math.PI;
  const zeemanAt = (deg: number): number => zeemanPerp / Math.cos((deg * Math.PI) / 180);

  test('one continuous CAF -> F transition at cos(theta) = E_Z_perp / (4 |uPerp|), to 1e-9 of the cut', () => {
    expect(cut.transitions).toHaveLength(1);
    const [transition] = cut.transitions;
    expect(transition!.between).toEqual(['CAF', 'F']);
    expect(transition!.order).toBe('continuous');
    expect(Math.abs(transition!.s - critical)).toBeLessThanOrEqual(BISECTION_TOLERANCE * 85);
    expect(Math.abs(transition!.t - critical / 85)).toBeLessThanOrEqual(BISECTION_TOLERANCE);
    // The pin stays where it is.
    expect([transition!.x, transition!.y]).toEqual([-1, 2]);
  });

  test('the canting angle and energy follow the closed forms along the way (public/notes.html#closed-forms)', () => {
    let before = 0;
    for (let i = 0; i < cut.t.length; i++) {
      const zeeman = zeemanAt(cut.s[i]!);
      if (cut.s[i]! < critical) {
        before++;
        expect(cut.labels[i]).toBe('CAF');
        expect(Math.abs(Math.cos(cut.canting[i]!) - zeeman / 4)).toBeLessThan(1e-9);
        // E = -uZ_F - E_Z^2 / (8 |uPerp_F|); in-plane Neel 2 sin(theta), total spin 2 cos(theta).
        expect(Math.abs(cut.energy[i]! - (-2 - zeeman ** 2 / 8))).toBeLessThan(1e-12);
        expect(group(cut, 'neelInPlane', i)).toBeCloseTo(2 * Math.sqrt(1 - (zeeman / 4) ** 2), 9);
        expect(group(cut, 'spinAlongField', i)).toBeCloseTo(zeeman / 2, 9);
      } else {
        expect(cut.labels[i]).toBe('F');
        expect(Math.abs(cut.canting[i]!)).toBeLessThan(1e-9);
        // E = -2 uPerp_F - uZ_F - E_Z.
        expect(Math.abs(cut.energy[i]! - (2 - 2 - zeeman))).toBeLessThan(1e-12);
      }
    }
    expect(before).toBe(198);
  });

  test('dE/dtheta is exact: the derivative of the closed-form energy (public/notes.html#closed-forms and public/notes.html#units)', () => {
    for (let i = 0; i < cut.t.length; i++) {
      const theta = (cut.s[i]! * Math.PI) / 180;
      const zeeman = zeemanAt(cut.s[i]!);
      // dE_Z/dtheta per degree; dE/dE_Z = -E_Z / 4 in CAF, -1 in F.
      const rate = (zeeman * Math.tan(theta) * Math.PI) / 180;
      const expected = cut.labels[i] === 'CAF' ? (-zeeman / 4) * rate : -rate;
      expect(Math.abs(cut.slope[i]! - expected)).toBeLessThan(
        1e-9 * Math.max(1, Math.abs(expected)),
      );
    }
  });
});

describe('Cut: line cuts across first-order boundaries (public/notes.html#checks, H = F)', () => {
  test('KD/CDW at uZ = uPerp (uPerp < 0) is located on the line and typed first order', () => {
    // A vertical cut at uPerp = -1.5 from uZ = -1.8 to 1.8 (E_Z = 0.4): CDW, then KD from
    // uZ = uPerp = -1.5 (Phys. Rev. B 85, 155439 (2012)), then CAF where
    // -uZ - E_Z^2 / (8 |uPerp|) = uPerp, i.e. uZ = 1.5 - 0.16 / 12 (public/notes.html#closed-forms,
    // derived).
    const cut = computeCut(
      standardInput(0.4),
      { kind: 'line', from: [-1.5, -1.8], to: [-1.5, 1.8] },
      121,
    );
    expect(cut.transitions.map((t) => t.between)).toEqual([
      ['CDW', 'KD'],
      ['KD', 'CAF'],
    ]);
    const [cdwKd, kdCaf] = cut.transitions;
    expect(cdwKd!.order).toBe('first');
    expect(kdCaf!.order).toBe('first');
    expect(Math.abs(cdwKd!.y - -1.5)).toBeLessThanOrEqual(BISECTION_TOLERANCE * 3.6);
    expect(Math.abs(kdCaf!.y - (1.5 - 0.16 / 12))).toBeLessThanOrEqual(BISECTION_TOLERANCE * 3.6);
    expect(cdwKd!.x).toBe(-1.5);
    // The line changes u_z only: the horizontal axis is u_z itself, s = y from -1.8 to 1.8.
    expect(cut.axis).toEqual({ label: 'u_z', unit: '', from: -1.8, to: 1.8 });
    cut.s.forEach((s, i) => expect(s).toBe(cut.y[i]));
    expect(cdwKd!.s).toBe(cdwKd!.y);
    // dE/du_z: CDW has E = uZ, so 1; KD has E = uPerp, constant here.
    for (let i = 0; i < cut.t.length; i++) {
      if (cut.labels[i] === 'CDW') expect(cut.slope[i]).toBeCloseTo(1, 12);
      if (cut.labels[i] === 'KD') expect(Math.abs(cut.slope[i]!)).toBeLessThan(1e-12);
    }
  });

  test('F/CDW on a slanted cut lies on uZ = -uPerp - E_Z / 2 (public/notes.html#closed-forms, derived)', () => {
    const from: [number, number] = [0.4, -1.9];
    const to: [number, number] = [1.6, 0.3];
    const cut = computeCut(standardInput(0.4), { kind: 'line', from, to }, 80);
    expect(cut.transitions).toHaveLength(1);
    const [transition] = cut.transitions;
    expect(transition!.between).toEqual(['CDW', 'F']);
    expect(transition!.order).toBe('first');
    // Where the line meets uZ = -uPerp - 0.2: solve from + t (to - from) for t.
    const t = (-0.2 - from[0] - from[1]) / (to[0] - from[0] + to[1] - from[1]);
    expect(Math.abs(transition!.t - t)).toBeLessThanOrEqual(BISECTION_TOLERANCE);
    expect(Math.abs(transition!.y - (-transition!.x - 0.2))).toBeLessThan(1e-8);
  });

  test('dE/ds matches a central difference of the energy where no transition intervenes', () => {
    const cut = computeCut(
      standardInput(0.4),
      { kind: 'line', from: [-1.9, 1.2], to: [1.9, -1.4] },
      150,
    );
    // Both coordinates change: s is the distance from the start, up to the line's length.
    const length = Math.hypot(3.8, 2.6);
    expect(cut.axis).toMatchObject({ label: CUT_DISTANCE_LABEL, unit: '', from: 0 });
    expect(cut.axis.to).toBeCloseTo(length, 14);
    cut.s.forEach((s, i) =>
      expect(s).toBeCloseTo(Math.hypot(cut.x[i]! + 1.9, cut.y[i]! - 1.2), 12),
    );
    cut.transitions.forEach((tr) => expect(tr.s).toBeCloseTo(tr.t * length, 12));
    expect(cut.transitions.length).toBeGreaterThan(1);
    let checked = 0;
    for (let i = 1; i + 1 < cut.t.length; i++) {
      if (cut.labels[i - 1] !== cut.labels[i + 1]) continue;
      const difference =
        (cut.energy[i + 1]! - cut.energy[i - 1]!) / (cut.s[i + 1]! - cut.s[i - 1]!);
      expect(Math.abs(cut.slope[i]! - difference)).toBeLessThan(1e-6);
      checked++;
    }
    expect(checked).toBeGreaterThan(100);
  });
});

describe('Cut: parameter sweeps at a pinned point', () => {
  test('an E_Z sweep from the CAF pin (-1, 2) crosses to F at E_Z = 4 |uPerp| = 4, continuously', () => {
    const cut = computeCut(
      standardInput(0.4),
      { kind: 'zeeman', at: [-1, 2], from: 0.5, to: 6 },
      60,
    );
    expect(cut.axis.label).toBe('E_Z');
    expect(cut.transitions).toHaveLength(1);
    expect(cut.transitions[0]!.between).toEqual(['CAF', 'F']);
    expect(cut.transitions[0]!.order).toBe('continuous');
    expect(Math.abs(cut.transitions[0]!.s - 4)).toBeLessThanOrEqual(BISECTION_TOLERANCE * 5.5);
    // dE/dE_Z = -o_0z / 2: -E_Z / 4 in CAF, -1 in F (public/notes.html#closed-forms, derived).
    for (let i = 0; i < cut.t.length; i++) {
      const expected = cut.s[i]! < 4 ? -cut.s[i]! / 4 : -1;
      expect(Math.abs(cut.slope[i]! - expected)).toBeLessThan(1e-9);
    }
  });

  test('an x sweep at a pin equals the horizontal line cut through it', () => {
    const input = standardInput(0.4);
    const sweep = computeCut(input, { kind: 'x', at: [0, 1], from: -1.8, to: 1.2 }, 50);
    const line = computeCut(input, { kind: 'line', from: [-1.8, 1], to: [1.2, 1] }, 50);
    expect(sweep.axis.label).toBe('u_perp');
    expect(sweep.labels).toEqual(line.labels);
    expect(sweep.transitions.map((t) => t.x)).toEqual(line.transitions.map((t) => t.x));
    // The horizontal axis is the swept value: s = x there.
    sweep.s.forEach((s, i) => expect(s).toBeCloseTo(sweep.x[i]!, 12));
    // KD/CAF at uZ = 1, uPerp = -(uZ ... ): -uZ - E_Z^2 / (8 |uPerp|) = uPerp (derived); F/CAF at
    // uPerp = -E_Z / 4 = -0.1 (public/notes.html#closed-forms).
    const caf = sweep.transitions.find((t) => t.between.join() === 'CAF,F');
    expect(Math.abs(caf!.x - -0.1)).toBeLessThanOrEqual(BISECTION_TOLERANCE * 3);
  });
});

describe('Cut: bad input is refused with a message naming it', () => {
  const input = standardInput(0.4);
  test('sample counts, coinciding end points, non-finite numbers, tilt at 90 degrees', () => {
    const line = { kind: 'line', from: [0, 0], to: [1, 1] } as const;
    expect(errorOf(() => computeCut(input, line, 1))).toContain('cut.n');
    expect(errorOf(() => computeCut(input, line, MAX_CUT_POINTS + 1))).toContain('cut.n');
    expect(errorOf(() => computeCut(input, line, 2.5))).toContain('cut.n');
    expect(
      errorOf(() => computeCut(input, { kind: 'line', from: [1, 1], to: [1, 1] }, 10)),
    ).toContain('coincide');
    expect(
      errorOf(() => computeCut(input, { kind: 'line', from: [NaN, 1], to: [1, 1] }, 10)),
    ).toContain('cut.x0');
    expect(
      errorOf(() =>
        computeCut(input, { kind: 'tilt', at: [-1, 2], from: 0, to: 90, zeemanPerp: 0.4 }, 10),
      ),
    ).toContain('cut.to');
  });
});

describe('Cut figure (SVG, the same function as the CLI and the app)', () => {
  const cut = computeCut(
    standardInput(0.4),
    { kind: 'line', from: [-1.9, 1.2], to: [1.9, -1.4] },
    60,
  );
  test('sized for a journal column, typeset title, one line per transition, solid or dashed', () => {
    const single = cutFigureSvg(cut);
    const double = cutFigureSvg(cut, { column: 'double', title: 'E_Z = 0.4' });
    expect(single).toContain('width="8.6cm"');
    expect(double).toContain('width="17.8cm"');
    // E_Z typeset as E with subscript Z.
    expect(double).toMatch(/<tspan[^>]*font-style="italic"[^>]*>E<\/tspan><tspan[^>]*>Z<\/tspan>/);
    const lines = /<g class="transitions"[^>]*>([\s\S]*?)<\/g>/.exec(single)![1]!;
    expect(lines.match(/<path /g)).toHaveLength(cut.transitions.length);
    expect(lines.match(/stroke-dasharray/g) ?? []).toHaveLength(
      cut.transitions.filter((t) => t.order === 'continuous').length,
    );
    expect(single).toContain('Mean-field');
  });
});

describe('Cut in the autosave: anything malformed is dropped', () => {
  test('stored Cuts read back', () => {
    expect(cutFromJson({ spec: { kind: 'line', from: [0, 1], to: [2, 3] }, n: 50 })).toEqual({
      spec: { kind: 'line', from: [0, 1], to: [2, 3] },
      n: 50,
    });
    expect(
      cutFromJson({ spec: { kind: 'tilt', at: [-1, 2], from: 0, to: 80 }, n: 10 }).spec,
    ).toEqual({ kind: 'tilt', at: [-1, 2], from: 0, to: 80 });
    for (const bad of [
      null,
      'x',
      { spec: { kind: 'line', from: [0, 'a'], to: [1, 1] } },
      { spec: { kind: 'line', from: [1, 1], to: [1, 1] } },
      { spec: { kind: 'spin', at: [0, 0], from: 0, to: 1 } },
      { spec: { kind: 'zeeman', at: [0, 0], from: 1, to: 1 } },
      { spec: { kind: 'zeeman', at: [0, null], from: 0, to: 1 } },
    ]) {
      expect(cutFromJson(bad).spec).toBeNull();
    }
    expect(cutFromJson({ spec: null, n: 1e9 }).n).toBe(DEFAULT_CUT_POINTS);
    expect(cutFromJson({ spec: null, n: 2.5 }).n).toBe(DEFAULT_CUT_POINTS);
  });
});

describe('Cut in the app: the tilt sweep takes E_Z at zero tilt from the Setup', () => {
  const input = parseMapInput(setupToScenario(DEMO_SETUP));
  const spec = { kind: 'tilt', at: [-1, 1.5], from: 0, to: 80 } as const;
  test('dimensionless: the Setup E_Z is E_Z at zero tilt', () => {
    expect(cutPathOf(spec, input, DEMO_SETUP)).toEqual({ ...spec, zeemanPerp: DEMO_SETUP.zeeman });
  });
  test('physical units: the Setup holds E_Z at its tilt, so E_Z(0) = E_Z cos(tilt) (public/notes.html#units)', () => {
    const physical = {
      ...DEMO_SETUP,
      physical: {
        bPerpTesla: 10,
        tiltDeg: 60,
        gFactor: 2,
        epsilonR: 4,
        exchangeInGap: false,
        tiltMaxDeg: 80,
      },
    };
    const path = cutPathOf(spec, input, physical);
    expect(path.kind === 'tilt' && path.zeemanPerp).toBeCloseTo(DEMO_SETUP.zeeman * 0.5, 14);
  });
  test('an axis that sets E_Z gives the pin its own E_Z', () => {
    const setup = {
      ...DEMO_SETUP,
      y: { quantity: 'zeeman', from: 0, to: 2, hartreeRatio: 1 },
    } as const;
    const path = cutPathOf(
      { ...spec, at: [-1, 1.3] },
      parseMapInput(setupToScenario(setup)),
      setup,
    );
    expect(path.kind === 'tilt' && path.zeemanPerp).toBeCloseTo(1.3, 14);
  });
});
