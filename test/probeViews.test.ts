import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { afterEach, beforeEach, describe, expect, test, vi } from 'vitest';
import { formatDegrees } from '../app/format';
import { OrientationDiscs } from '../app/probe/OrientationDiscs';
import { SpinorTable } from '../app/probe/SpinorTable';
import { electronsPerFluxQuantum } from '../app/setup/fillingCount';
import { parseModel, probeModel, type ProbeReport } from '../solver/index';

/** The anisotropic contact model (H = F) of public/notes.html#energy. */
function standard(uPerp: number, uZ: number, zeeman: number) {
  return parseModel({ filling: 0, channels: { x0: uPerp, y0: uPerp, z0: uZ }, zeeman });
}

/** The attributes and text of the element with data-testid `id` in static markup. */
function element(markup: string, id: string): string {
  const start = markup.indexOf(`data-testid="${id}"`);
  expect(start, `element ${id}`).toBeGreaterThan(-1);
  const open = markup.lastIndexOf('<', start);
  const end = markup.indexOf('</figure>', start);
  return markup.slice(open, end);
}

describe('Probe views render every number they show, and nothing that is not a number', () => {
  // React reports attributes it cannot render (NaN among them) through console.error.
  let consoleErrors: unknown[][];
  beforeEach(() => {
    consoleErrors = [];
    vi.spyOn(console, 'error').mockImplementation((...args: unknown[]) => {
      consoleErrors.push(args);
    });
  });
  afterEach(() => {
    vi.restoreAllMocks();
  });

  test('a disc whose vector is zero says "no direction" and carries no NaN attribute', () => {
    // F at nu = 0: both spin-up flavours filled, so the spin-up valley pseudospin
    // (o_a0 + o_az) / 2 is zero and the spin-down sector is empty (public/notes.html#probe).
    const report = probeModel(standard(0.5, 1.5, 0.6));
    expect(report.state.phase).toBe('F');
    const markup = renderToStaticMarkup(createElement(OrientationDiscs, { report }));
    expect(consoleErrors).toEqual([]);
    expect(markup).not.toContain('NaN');
    for (const id of ['probe-valley-up', 'probe-valley-down']) {
      const disc = element(markup, id);
      expect(disc).toContain('data-direction="none"');
      expect(disc).not.toContain('data-polar');
      expect(disc).not.toContain('data-cos');
      expect(disc).toContain('no direction');
    }
    // The spin on A is one electron's <sigma> along the field: length 1, cos(theta) = 1.
    const spinA = element(markup, 'probe-spin-a');
    expect(spinA).toContain('data-direction="some"');
    expect(spinA).toContain('data-cos="1"');
    expect(Number(/data-length="([^"]*)"/.exec(spinA)![1])).toBeCloseTo(1, 12);
  });

  test('a spinor phase of -pi prints as 180.0 degrees, as +pi does', () => {
    const report = probeModel(standard(-1.5, 1.5, 0.4));
    const spinor = report.spinors[0]!;
    const k = spinor.modulus.findIndex((m) => m > 1e-3);
    const withPhase = (phase: number): ProbeReport => ({
      ...report,
      spinors: [{ ...spinor, phase: spinor.phase.map((p, r) => (r === k ? phase : p)) }],
    });
    const angles = (r: ProbeReport) =>
      [
        ...renderToStaticMarkup(createElement(SpinorTable, { report: r })).matchAll(/∠([^°]*)°/g),
      ].map((m) => m[1]);
    // -pi itself, a phase just above it that rounds to -180.0, and +pi: one text for all three.
    for (const phase of [-Math.PI, -Math.PI + 1e-4, Math.PI]) {
      expect(angles(withPhase(phase))).toEqual(['180.0']);
    }
    expect(consoleErrors).toEqual([]);
  });
});

describe('angles in degrees print in (-180, 180]', () => {
  test.each([
    [Math.PI, '180.0'],
    [-Math.PI, '180.0'],
    [-Math.PI + 1e-5, '180.0'],
    [-Math.PI + 1e-2, '-179.4'],
    [3 * Math.PI, '180.0'],
    [Math.PI / 2 + 2 * Math.PI, '90.0'],
    [-Math.PI / 2, '-90.0'],
    [1e-5, '0'],
    [-1e-5, '0'],
  ])('%f rad prints as %s', (radians, text) => {
    expect(formatDegrees(radians, 1)).toBe(text);
  });

  test('not a number stays spelled out', () => {
    expect(formatDegrees(NaN, 1)).toBe('NaN');
  });
});

describe('the filling hint counts electrons in words', () => {
  test.each([
    [-1, 'one electron per flux quantum'],
    [0, 'two electrons per flux quantum'],
    [1, 'three electrons per flux quantum'],
  ] as const)('nu = %i holds %s', (filling, text) => {
    expect(electronsPerFluxQuantum(filling)).toBe(text);
  });
});
