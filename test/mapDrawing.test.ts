import { describe, expect, test } from 'vitest';
import {
  EMPTY_COLOUR,
  TOKEN_COLOURS,
  UNKNOWN_TOKEN_COLOUR,
  labelColours,
} from '../app/figure/palette';
import { drawRegions, type RegionGrid } from '../app/map/drawRegions';
import { formatShare, labelCounts, legendEntries } from '../app/map/legendEntries';
import { PLOT_MARGIN, PLOT_MAX, PLOT_MIN, plotSide } from '../app/map/plotFrame';
import { pixelAtFraction } from '../app/map/plotPixels';
import { legendOf } from '../solver/index';

type Rgb = readonly [number, number, number];
type Matrix = readonly [Rgb, Rgb, Rgb];

function blankImage(width: number, height: number) {
  return { data: new Uint8ClampedArray(4 * width * height), width, height };
}

function hexAt(image: ReturnType<typeof blankImage>, px: number, py: number): string {
  const o = 4 * (py * image.width + px);
  expect(image.data[o + 3]).toBe(255);
  return '#' + [0, 1, 2].map((k) => image.data[o + k]!.toString(16).padStart(2, '0')).join('');
}

/** Six single-token labels on a 3 x 2 grid, row j = 0 first (the bottom row). */
const CORNER_GRID: RegionGrid = {
  nx: 3,
  ny: 2,
  labels: ['F', 'AF', 'CAF', 'CDW', 'KD', 'SB'],
};

describe('drawRegions', () => {
  test('bottom-left canvas pixel shows grid pixel (0, 0), top-right shows (nx-1, ny-1)', () => {
    const image = blankImage(30, 20);
    drawRegions(image, CORNER_GRID);
    expect(hexAt(image, 0, 19)).toBe(TOKEN_COLOURS.F);
    expect(hexAt(image, 29, 0)).toBe(TOKEN_COLOURS.SB);
    expect(hexAt(image, 0, 0)).toBe(TOKEN_COLOURS.CDW);
    expect(hexAt(image, 29, 19)).toBe(TOKEN_COLOURS.CAF);
  });

  test('every canvas pixel shows grid pixel (floor(px nx / w), ny - 1 - floor(py ny / h))', () => {
    // Sizes that the grid does not divide.
    const image = blankImage(7, 5);
    drawRegions(image, CORNER_GRID);
    for (let py = 0; py < 5; py++) {
      for (let px = 0; px < 7; px++) {
        const i = Math.floor((px * 3) / 7);
        const j = 1 - Math.floor((py * 2) / 5);
        expect(hexAt(image, px, py)).toBe(TOKEN_COLOURS[CORNER_GRID.labels[j * 3 + i]!]);
      }
    }
  });

  test('a grid finer than the canvas shows the grid pixel of the formula at every canvas pixel', () => {
    const tokens = ['F', 'AF', 'CAF', 'CDW', 'KD', 'SB'];
    // 11 x 9 grid pixels on a 4 x 3 canvas, in runs of equal labels and single pixels.
    const labels = Array.from({ length: 99 }, (_, p) => tokens[Math.floor(p / 4) % 5]!);
    const image = blankImage(4, 3);
    drawRegions(image, { nx: 11, ny: 9, labels });
    for (let py = 0; py < 3; py++) {
      for (let px = 0; px < 4; px++) {
        const i = Math.floor((px * 11) / 4);
        const j = 8 - Math.floor((py * 9) / 3);
        expect(hexAt(image, px, py)).toBe(TOKEN_COLOURS[labels[j * 11 + i]!]);
      }
    }
  });

  test('a composite label is drawn as diagonal stripes of its two token colours', () => {
    const image = blankImage(40, 40);
    drawRegions(image, { nx: 1, ny: 1, labels: ['CDW+SBxy'] }, { stripeWidth: 4 });
    const counts = new Map<string, number>();
    for (let py = 0; py < 40; py++) {
      for (let px = 0; px < 40; px++) {
        const hex = hexAt(image, px, py);
        counts.set(hex, (counts.get(hex) ?? 0) + 1);
        // Constant along the '/' diagonal (one pixel right, one pixel up).
        if (px + 1 < 40 && py > 0) expect(hexAt(image, px + 1, py - 1)).toBe(hex);
      }
    }
    expect([...counts.keys()].sort()).toEqual([TOKEN_COLOURS.CDW, TOKEN_COLOURS.SBxy].sort());
    expect(counts.get(TOKEN_COLOURS.CDW)! / 1600).toBeCloseTo(0.5, 1);
    // Along a row: 4 pixels of one token, 4 of the other, period 8.
    const row = Array.from({ length: 16 }, (_, px) => hexAt(image, px, 0));
    expect(row.slice(0, 4)).toEqual(Array(4).fill(TOKEN_COLOURS.CDW));
    expect(row.slice(4, 8)).toEqual(Array(4).fill(TOKEN_COLOURS.SBxy));
    expect(row.slice(8, 16)).toEqual(row.slice(0, 8));
  });

  test('a three-token label cycles through three colours; stripes follow the canvas, not the grid', () => {
    const image = blankImage(24, 12);
    // Two grid pixels with the same label: stripes run on across the grid pixel border.
    drawRegions(image, { nx: 2, ny: 1, labels: ['CAF+KD+SB', 'CAF+KD+SB'] }, { stripeWidth: 2 });
    const row = Array.from({ length: 24 }, (_, px) => hexAt(image, px, 4));
    const expected = Array.from(
      { length: 24 },
      (_, px) => labelColours('CAF+KD+SB')[Math.floor((px + 4) / 2) % 3],
    );
    expect(row).toEqual(expected);
  });

  test('pixels not computed yet are the empty colour; an unknown token is the fallback grey', () => {
    const image = blankImage(4, 2);
    drawRegions(image, { nx: 2, ny: 1, labels: ['', 'QX'] });
    expect(hexAt(image, 0, 0)).toBe(EMPTY_COLOUR);
    expect(hexAt(image, 3, 1)).toBe(UNKNOWN_TOKEN_COLOUR);
  });
});

describe('plot geometry', () => {
  test('the pointer maps to the pixel drawn under it, row 0 at the bottom', () => {
    expect(pixelAtFraction(0, 1, 4, 4)).toEqual({ i: 0, j: 0 });
    expect(pixelAtFraction(1, 0, 4, 4)).toEqual({ i: 3, j: 3 });
    expect(pixelAtFraction(0.999, 0.001, 4, 4)).toEqual({ i: 3, j: 3 });
    expect(pixelAtFraction(0.5, 0.5, 4, 4)).toEqual({ i: 2, j: 1 });
    expect(pixelAtFraction(0.3, 0.9, 10, 5)).toEqual({ i: 3, j: 0 });
    expect(pixelAtFraction(-0.01, 0.5, 4, 4)).toBeNull();
    expect(pixelAtFraction(0.5, 1.01, 4, 4)).toBeNull();
  });

  test('the plot is a square between PLOT_MIN and PLOT_MAX that fits the width', () => {
    const margins = PLOT_MARGIN.left + PLOT_MARGIN.right;
    expect(plotSide(0)).toBe(PLOT_MIN);
    expect(plotSide(3000)).toBe(PLOT_MAX);
    expect(plotSide(500.7 + margins)).toBe(500);
  });
});

describe('legend entries', () => {
  test('largest area first, shares of the whole plot, meanings per token', () => {
    const labels = ['F', 'F', 'F', 'F', 'CDW+SBxy', 'CDW+SBxy', 'sym', '', '', ''];
    const entries = legendEntries(labels);
    expect(entries.map((e) => e.label)).toEqual(['F', 'CDW+SBxy', 'sym']);
    expect(entries.map((e) => e.share)).toEqual([0.4, 0.2, 0.1]);
    expect(entries[1]!.colours).toEqual([TOKEN_COLOURS.CDW, TOKEN_COLOURS.SBxy]);
    expect(entries[1]!.meaning).toMatch(/^charge density wave.*; spin bond order perpendicular/);
    expect(entries[2]!.meaning).toBe('no broken symmetry: no group to name');
  });

  test('label counts agree with the solver legend, runs or not, ties by name', () => {
    const labels = ['KD', 'F', 'F', 'KD', '', 'CAF', 'CAF', 'CAF', 'F', 'KD', 'KD', 'F', ''];
    const expected = legendOf(labels).map(({ label, pixels }) => ({ label, pixels }));
    expect(labelCounts(labels)).toEqual(expected);
    expect(labelCounts(labels)).toEqual([
      { label: 'F', pixels: 4 },
      { label: 'KD', pixels: 4 },
      { label: 'CAF', pixels: 3 },
      { label: '', pixels: 2 },
    ]);
    expect(labelCounts([])).toEqual([]);
  });

  test('shares read as short percentages', () => {
    expect(formatShare(0.4)).toBe('40%');
    expect(formatShare(0.04213)).toBe('4.2%');
    expect(formatShare(0.0004)).toBe('<0.1%');
    expect(formatShare(0)).toBe('0%');
  });
});

// Colour science for the palette checks.

/** sRGB decoding (IEC 61966-2-1:1999): '#rrggbb' to linear RGB in [0, 1]. */
function linearRgb(hex: string): Rgb {
  const channel = (k: number): number => {
    const c = parseInt(hex.slice(1 + 2 * k, 3 + 2 * k), 16) / 255;
    return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  };
  return [channel(0), channel(1), channel(2)];
}

function map3(f: (k: number) => number): Rgb {
  return [f(0), f(1), f(2)];
}

function apply(m: Matrix, v: Rgb): Rgb {
  return map3((r) => m[r]![0] * v[0] + m[r]![1] * v[1] + m[r]![2] * v[2]);
}

/** Linear sRGB to XYZ, D65 (IEC 61966-2-1:1999). */
const SRGB_TO_XYZ: Matrix = [
  [0.4124, 0.3576, 0.1805],
  [0.2126, 0.7152, 0.0722],
  [0.0193, 0.1192, 0.9505],
];
const D65_WHITE: Rgb = [0.95047, 1, 1.08883];

/** CIE 1976 L*a*b* (CIE 15:2004) of a linear sRGB colour, D65 white. */
function lab(rgb: Rgb): Rgb {
  const xyz = apply(SRGB_TO_XYZ, rgb);
  const f = (t: number): number => (t > 216 / 24389 ? Math.cbrt(t) : ((24389 / 27) * t + 16) / 116);
  const [fx, fy, fz] = map3((k) => f(xyz[k]! / D65_WHITE[k]!));
  return [116 * fy - 16, 500 * (fx - fy), 200 * (fy - fz)];
}

function deltaE76(a: Rgb, b: Rgb): number {
  return Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]);
}

/**
 * Dichromat simulation of Machado, Oliveira and Fernandes, IEEE TVCG 15, 1291 (2009), severity
 * 1.0, applied to linear RGB (matrix values from memory; the checks below test their defining
 * properties: white is kept, and a dichromat's colours span a plane).
 */
const PROTANOPIA: Matrix = [
  [0.152286, 1.052583, -0.204868],
  [0.114503, 0.786281, 0.099216],
  [-0.003882, -0.048116, 1.051998],
];
const DEUTERANOPIA: Matrix = [
  [0.367322, 0.860646, -0.227968],
  [0.280085, 0.672501, 0.047413],
  [-0.01182, 0.04294, 0.968881],
];
const IDENTITY: Matrix = [
  [1, 0, 0],
  [0, 1, 0],
  [0, 0, 1],
];

function seenBy(vision: Matrix, hex: string): Rgb {
  const rgb = apply(vision, linearRgb(hex));
  return lab(map3((k) => Math.min(1, Math.max(0, rgb[k]!))));
}

function determinant(m: Matrix): number {
  return (
    m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) -
    m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0]) +
    m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0])
  );
}

const TOKENS = Object.keys(TOKEN_COLOURS);
const PAIRS = TOKENS.flatMap((a, n) => TOKENS.slice(n + 1).map((b) => [a, b] as const));

/**
 * Thresholds. A CIE 1976 colour difference of about 2.3 is often quoted as just noticeable
 * (from memory: Mahy, Van Eycken and Oosterlinck, Color Res. Appl. 19, 105 (1994)); regions
 * named by colour need several times that. Nine tokens fit L* 31..92 at 7.5 apart.
 */
const MIN_LIGHTNESS_STEP = 7;
const MIN_DELTA_E = 15;

describe('palette', () => {
  test('the recalled dichromat matrices keep white and project onto a plane', () => {
    for (const m of [PROTANOPIA, DEUTERANOPIA]) {
      for (const row of m) expect(row[0] + row[1] + row[2]).toBeCloseTo(1, 5);
      expect(Math.abs(determinant(m))).toBeLessThan(1e-5);
    }
  });

  test(`every pair of token colours differs in L* by at least ${MIN_LIGHTNESS_STEP} (greyscale print)`, () => {
    const tooClose = PAIRS.filter(
      ([a, b]) =>
        Math.abs(lab(linearRgb(TOKEN_COLOURS[a]!))[0] - lab(linearRgb(TOKEN_COLOURS[b]!))[0]) <
        MIN_LIGHTNESS_STEP,
    );
    expect(tooClose).toEqual([]);
    expect(PAIRS.length).toBe(36);
  });

  test.each([
    ['normal vision', IDENTITY],
    ['simulated protanopia', PROTANOPIA],
    ['simulated deuteranopia', DEUTERANOPIA],
  ] as const)(`token colours differ by Delta E*ab >= ${MIN_DELTA_E} under %s`, (_, vision) => {
    const smallest = Math.min(
      ...PAIRS.map(([a, b]) =>
        deltaE76(seenBy(vision, TOKEN_COLOURS[a]!), seenBy(vision, TOKEN_COLOURS[b]!)),
      ),
    );
    expect(smallest).toBeGreaterThanOrEqual(MIN_DELTA_E);
  });

  test('the empty colour is lighter than every token colour by at least 6 in L*', () => {
    const empty = lab(linearRgb(EMPTY_COLOUR))[0];
    for (const token of TOKENS) {
      expect(empty - lab(linearRgb(TOKEN_COLOURS[token]!))[0]).toBeGreaterThanOrEqual(6);
    }
  });
});
