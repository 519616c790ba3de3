import { describe, expect, test } from 'vitest';
import { labelPieces } from '../app/notation/labelPieces';
import { dispersionFigureSvg } from '../app/probe/dispersionFigure';
import {
  ROTATION_NAMES,
  branchRuns,
  energyExtent,
  energyTitle,
  groupsPresent,
  wavevectorScale,
  wavevectorTitle,
} from '../app/probe/dispersionSeries';
import { modeDispersion, parseModel, solve, type ModeDispersion } from '../solver/index';
import { parseXmlStrictly, textsOf } from './strictParsers';

// The Probe's dispersion chart and its SVG figure (app/probe/dispersionSeries.ts and
// dispersionFigure.ts): units of the axes, colour runs, the energy range and the marks.

const CAF = parseModel({
  filling: 0,
  channels: { x0: -1, y0: -1, z0: 2 },
  zeeman: 0.4,
  coulomb: 3,
});
const Q = Array.from({ length: 31 }, (_, n) => n / 5);

function cafDispersion(): ModeDispersion {
  const r = solve(CAF);
  return modeDispersion(r.couplings, r.frame, { coulomb: 3, q: Q });
}

describe('axis units', () => {
  test('q in 1/l_B and energy in the model unit, or q in 1/nm and energy in meV', () => {
    expect(wavevectorTitle({})).toBe('q l_B');
    expect(wavevectorScale({})).toBe(1);
    expect(energyTitle({})).toBe('omega (model unit)');
    const physical = { magneticLengthNm: 8.5, energyUnit: 'meV' };
    expect(wavevectorTitle(physical)).toBe('q (1/nm)');
    expect(wavevectorScale(physical)).toBe(1 / 8.5);
    expect(energyTitle(physical)).toBe('omega (meV)');
  });

  test('the figure in physical units: q up to 6 / l_B is 6/8.5 = 0.706 / nm on its axis', () => {
    const d = cafDispersion();
    const svg = dispersionFigureSvg(
      d,
      { model: CAF, phase: 'CAF', energyUnit: 'meV', magneticLengthNm: 8.5 },
      { magneticLengthNm: 8.5, energyUnit: 'meV' },
    );
    const doc = parseXmlStrictly(svg);
    const bottom = Array.from(doc.getElementsByTagName('g')).find(
      (g) => g.getAttribute('class') === 'axis axis-bottom',
    )!;
    const labels = Array.from(bottom.getElementsByTagName('text'), (e) => e.textContent ?? '');
    const ticks = labels.map(Number).filter((v) => Number.isFinite(v));
    expect(Math.max(...ticks)).toBeLessThanOrEqual(6 / 8.5);
    expect(Math.max(...ticks)).toBeGreaterThanOrEqual(0.6);
    expect(labels.join(' ')).toContain('(1/nm)');
    expect(textsOf(doc).join(' ')).toContain('(meV)');
  });
});

describe('colours and marks', () => {
  test('CAF (E_Z = 0.4): one Goldstone mark, the spin rotation about the field first in the legend', () => {
    const d = cafDispersion();
    expect(groupsPresent(d)[0]).toBe('spinAlongField');
    const doc = parseXmlStrictly(dispersionFigureSvg(d, { model: CAF, phase: 'CAF' }));
    expect(doc.getElementsByTagName('circle')).toHaveLength(1);
    const text = textsOf(doc).join(' ');
    expect(text).toContain('spin about the field');
    expect(text).toContain('Goldstone');
    expect(text).not.toContain('growth rate');
  });

  test('a branch is cut where the rotation of its mode changes, the runs sharing the point between', () => {
    const d = cafDispersion();
    const runs = branchRuns(d);
    // Every point of every branch is in some run, and consecutive runs of a branch touch.
    d.branches.forEach((values, b) => {
      const mine = runs.filter((r) => r.branch === b);
      expect(mine[0]!.from).toBe(0);
      expect(mine[mine.length - 1]!.to).toBe(values.length - 1);
      for (let k = 1; k < mine.length; k++) {
        expect(mine[k]!.from).toBe(mine[k - 1]!.to);
        expect(mine[k]!.group).not.toBe(mine[k - 1]!.group);
      }
    });
    const made: ModeDispersion = {
      ...d,
      branches: [[0, 1, 2, 3]],
      growth: [[0, 0, 0, 0]],
      rotates: [[null, 'cdw', 'cdw', 'bondOrder']],
    };
    expect(branchRuns(made)).toEqual([
      { branch: 0, from: 0, to: 2, group: 'cdw' },
      { branch: 0, from: 2, to: 3, group: 'bondOrder' },
    ]);
  });

  test('the energy range reaches the large-q limits, and below zero for a growth rate', () => {
    const d = cafDispersion();
    const [lo, hi] = energyExtent(d);
    expect(lo).toBe(0);
    expect(hi).toBeGreaterThan(Math.max(...d.particleHole));
    const unstable: ModeDispersion = {
      ...d,
      growth: d.growth.map((g, b) => (b === 0 ? g.map((_, n) => (n === 3 ? 0.5 : 0)) : g)),
      stable: false,
      unstableAt: [Q[3]!],
    };
    expect(energyExtent(unstable)[0]).toBeLessThan(-0.5);
    const text = textsOf(
      parseXmlStrictly(dispersionFigureSvg(unstable, { model: CAF, phase: 'CAF' })),
    ).join(' ');
    expect(text).toContain('growth rate');
  });

  test('rotation names read by the one notation: Greek letters upright, their indices as subscripts', () => {
    const pieces = (name: string) => labelPieces(name).map((p) => [p.text, p.level]);
    expect(pieces(ROTATION_NAMES.spinAlongField)).toEqual([
      ['σ', 0],
      ['z', -1],
      [': spin about the field', 0],
    ]);
    expect(pieces(ROTATION_NAMES.spinBondInPlane)).toEqual([
      ['τ', 0],
      ['x,y', -1],
      [' σ', 0],
      ['x,y', -1],
    ]);
    expect(labelPieces(ROTATION_NAMES.spinBondInPlane).every((p) => !p.italic)).toBe(true);
  });
});
