import { DOMParser, type Element } from '@xmldom/xmldom';
import { beforeAll, describe, expect, test } from 'vitest';
import { mapFigureSvg } from '../app/figure/mapFigure';
import { regionOutlines } from '../app/figure/regionOutlines';
import { computePhaseMap, parseMapInput, seededRandom, type PhaseMap } from '../solver/index';
import { INTERFACES_EXAMPLE, standardPlane } from './fixtures';

// A small fixed scenario: the standard model (H = F, E_Z = 0.4, Delta_V = 0)
// in its (uPerp, uZ) plane at 24 x 24, computed in-process.
const E_Z = INTERFACES_EXAMPLE.zeeman;
let map: PhaseMap;
let svg: string;

beforeAll(async () => {
  map = await computePhaseMap(
    parseMapInput({ ...INTERFACES_EXAMPLE, plane: standardPlane(24, 24) }),
  );
  svg = mapFigureSvg(map, { title: 'E_Z = 0.4', pins: [{ id: 1, x: -1, y: 0.5 }] });
}, 60_000);

/** Numbers rounded to one decimal, ids renumbered in order of appearance. */
function normalised(text: string): string {
  const ids = new Map<string, string>();
  for (const m of text.matchAll(/\bid="([^"]+)"/g)) {
    if (!ids.has(m[1]!)) ids.set(m[1]!, `id${ids.size + 1}`);
  }
  return text
    .replace(/\bid="([^"]+)"/g, (_, id: string) => `id="${ids.get(id)}"`)
    .replace(/url\(#([^)]+)\)/g, (_, id: string) => `url(#${ids.get(id) ?? id})`)
    .replace(/-?\d+\.\d{2,}/g, (n) => {
      const r = Number(Number(n).toFixed(1));
      return String(r === 0 ? 0 : r);
    });
}

function parse(text: string) {
  const errors: string[] = [];
  const doc = new DOMParser({
    onError: (level, message) => {
      if (level !== 'warning') errors.push(message);
    },
  }).parseFromString(text, 'image/svg+xml');
  expect(errors).toEqual([]);
  return doc;
}

function elements(root: { getElementsByTagName(name: string): ArrayLike<Element> }, name: string) {
  return Array.from(root.getElementsByTagName(name));
}

type Point = [number, number];

/** Subpaths of a path made of M, L (with implicit repeats) and Z commands, absolute. */
function subpaths(d: string): Point[][] {
  const out: Point[][] = [];
  for (const part of d.split('M').filter((s) => s.trim() !== '')) {
    const numbers = part.replace(/[LZ]/g, ' ').trim().split(/[ ,]+/).map(Number);
    expect(numbers.every(Number.isFinite)).toBe(true);
    const loop: Point[] = [];
    for (let k = 0; k + 1 < numbers.length; k += 2) loop.push([numbers[k]!, numbers[k + 1]!]);
    out.push(loop);
  }
  return out;
}

/** Signed area by the shoelace formula (Bronshtein and Semendyayev, Handbook of Mathematics). */
function signedArea(loop: Point[]): number {
  let s = 0;
  for (let m = 0; m < loop.length; m++) {
    const [x0, y0] = loop[m]!;
    const [x1, y1] = loop[(m + 1) % loop.length]!;
    s += x0 * y1 - x1 * y0;
  }
  return s / 2;
}

/** Winding number of the closed loops about (px, py) (nonzero = inside for fill-rule nonzero). */
function winding(loops: Point[][], px: number, py: number): number {
  let w = 0;
  for (const loop of loops) {
    for (let m = 0; m < loop.length; m++) {
      const [x0, y0] = loop[m]!;
      const [x1, y1] = loop[(m + 1) % loop.length]!;
      const side = (x1 - x0) * (py - y0) - (px - x0) * (y1 - y0);
      if (y0 <= py && y1 > py && side > 0) w++;
      else if (y0 > py && y1 <= py && side < 0) w--;
    }
  }
  return w;
}

function frameOf(doc: ReturnType<typeof parse>) {
  const frame = elements(doc, 'rect').find((r) => r.getAttribute('id') === 'frame')!;
  const x = Number(frame.getAttribute('x'));
  const y = Number(frame.getAttribute('y'));
  const w = Number(frame.getAttribute('width'));
  const h = Number(frame.getAttribute('height'));
  return { x, y, w, h };
}

function group(doc: ReturnType<typeof parse>, id: string): Element {
  return elements(doc, 'g').find((g) => g.getAttribute('id') === id)!;
}

test('the figure of a fixed small scenario matches its snapshot', async () => {
  await expect(normalised(svg)).toMatchFileSnapshot('snapshots/mapFigure.svg');
});

describe('the SVG file', () => {
  test('parses as XML: an SVG 1.1 root sized in cm with a viewBox in pt', () => {
    const root = parse(svg).documentElement!;
    expect(root.nodeName).toBe('svg');
    expect(root.getAttribute('xmlns')).toBe('http://www.w3.org/2000/svg');
    expect(root.getAttribute('version')).toBe('1.1');
    // Single column 8.6 cm = 243.78 pt (72 pt per inch, 2.54 cm per inch).
    expect(root.getAttribute('width')).toBe('8.6cm');
    const [, , w, h] = root.getAttribute('viewBox')!.split(' ').map(Number);
    expect(w).toBeCloseTo(243.78, 2);
    expect(Number(root.getAttribute('height')!.replace('cm', ''))).toBeCloseTo((h! * 2.54) / 72, 2);
  });

  test('holds no raster image, and its labels are text', () => {
    const doc = parse(svg);
    expect(elements(doc, 'image')).toHaveLength(0);
    expect(svg).not.toMatch(/data:image|<image|\.png/);
    const texts = elements(doc, 'text').map((t) => t.textContent ?? '');
    // Axis titles u⊥ and u_z, typeset as text with a subscript tspan.
    expect(texts).toContain('u\u22a5');
    expect(texts).toContain('uz');
    for (const label of ['F', 'CAF', 'KD', 'CDW']) expect(texts).toContain(label);
    expect(texts).toContain('first-order transition');
    expect(texts).toContain('continuous transition');
    expect(texts).toContain('EZ = 0.4');
    expect(elements(group(doc, 'pins'), 'text').map((t) => t.textContent)).toContain('1');
    // The model and the mean-field caution travel with the figure.
    const desc = elements(doc, 'desc')[0]!.textContent!;
    expect(desc).toContain('"zeeman":0.4');
    expect(desc).toContain('Mean-field');
  });

  test('a double-column figure is 17.8 cm wide', () => {
    const root = parse(mapFigureSvg(map, { column: 'double' })).documentElement!;
    expect(root.getAttribute('width')).toBe('17.8cm');
  });

  test('region paths cover the plot area once: area sum within 0.1 percent, no gap, no overlap', () => {
    const doc = parse(svg);
    const frame = frameOf(doc);
    const regions = elements(group(doc, 'regions'), 'path').map((p) =>
      subpaths(p.getAttribute('d')!),
    );
    expect(regions.length).toBe(new Set(map.labels).size);
    const area = regions.reduce(
      (sum, loops) => sum + Math.abs(loops.reduce((s, loop) => s + signedArea(loop), 0)),
      0,
    );
    expect(Math.abs(area - frame.w * frame.h) / (frame.w * frame.h)).toBeLessThan(1e-3);
    // Every sample of a fine grid (off the pixel lattice) lies in exactly one region.
    const n = 157;
    for (let a = 0; a < n; a++) {
      for (let b = 0; b < n; b++) {
        const px = frame.x + ((a + 0.5) / n) * frame.w;
        const py = frame.y + ((b + 0.5) / n) * frame.h;
        const inside = regions.filter((loops) => winding(loops, px, py) !== 0).length;
        if (inside !== 1) throw new Error(`sample (${px}, ${py}) lies in ${inside} regions`);
      }
    }
  });

  test('each region holds the labels of the pixel centres inside it', () => {
    const doc = parse(svg);
    const frame = frameOf(doc);
    const paths = elements(group(doc, 'regions'), 'path');
    const [nx, ny] = map.input.plane.resolution;
    let mismatched = 0;
    for (let j = 0; j < ny; j++) {
      for (let i = 0; i < nx; i++) {
        const px = frame.x + ((i + 0.5) / nx) * frame.w;
        const py = frame.y + frame.h - ((j + 0.5) / ny) * frame.h;
        const owner = paths.find((p) => winding(subpaths(p.getAttribute('d')!), px, py) !== 0);
        if (elements(owner!, 'title')[0]!.textContent !== map.labels[j * nx + i]) mismatched++;
      }
    }
    // A pixel centre can only fall on the other side where a boundary passes within rounding.
    expect(mismatched).toBeLessThanOrEqual(2);
  });
});

test('a tilt path is drawn through its points with both end angles, and only when given; axis units', () => {
  // A ray towards the origin (public/notes.html#units): (-1.2, 1.6) scaled by cos(theta) / cos(0).
  const points = [0, 40, 80].map((deg): [number, number] => {
    const c = Math.cos((deg * Math.PI) / 180);
    return [-1.2 * c, 1.6 * c];
  });
  const withPath = mapFigureSvg(map, { tiltPath: { points, fromDeg: 0, toDeg: 80, exact: true } });
  const group = elements(parse(withPath), 'g').find((g) => g.getAttribute('id') === 'tilt-path')!;
  const d = elements(group, 'path')[0]!.getAttribute('d')!;
  expect(subpaths(d)[0]).toHaveLength(3);
  expect(elements(group, 'text').map((t) => t.textContent)).toEqual(['0\u00b0', '80\u00b0']);
  expect(elements(group, 'path')[0]!.getAttribute('stroke-dasharray')).toBeNull();
  const guide = mapFigureSvg(map, { tiltPath: { points, fromDeg: 0, toDeg: 80, exact: false } });
  expect(guide).toMatch(/id="tilt-path"[^]*stroke-dasharray/);
  expect(svg).not.toContain('tilt-path');
  // In physical units both axis titles carry the unit.
  const inMeV = mapFigureSvg(map, { unit: 'meV' });
  expect((inMeV.match(/\(meV\)/g) ?? []).length).toBe(2);
  expect(svg).not.toContain('meV');
});

test('the consistent pixels of a fit are hatched, one rectangle each, with a legend line; only when given', () => {
  // A 4 x 3 grid over the plane [-2, 2]^2 in which 5 pixels hold both rows.
  const held = [2, 2, 1, 0, 2, 2, 0, 0, 2, 1, 1, 0];
  const x = [-1.5, -0.5, 0.5, 1.5];
  const y = [-4 / 3, 0, 4 / 3];
  const text = mapFigureSvg(map, { consistent: { x, y, held, total: 2 } });
  const doc = parse(text);
  const group = elements(doc, 'g').find((g) => g.getAttribute('id') === 'consistent')!;
  expect(group.getAttribute('fill')).toBe('url(#consistent-hatch)');
  const rects = elements(group, 'rect');
  expect(rects).toHaveLength(5);
  // Each rectangle is one grid pixel: a quarter of the plot's width, a third of its height.
  const frame = elements(doc, 'rect').find((r) => r.getAttribute('id') === 'frame')!;
  const side = Number(frame.getAttribute('width'));
  for (const r of rects) {
    expect(Number(r.getAttribute('width'))).toBeCloseTo(side / 4, 1);
    expect(Number(r.getAttribute('height'))).toBeCloseTo(side / 3, 1);
  }
  const left = Math.min(...rects.map((r) => Number(r.getAttribute('x'))));
  expect(left).toBeCloseTo(Number(frame.getAttribute('x')), 1);
  expect(elements(doc, 'pattern').some((p) => p.getAttribute('id') === 'consistent-hatch')).toBe(
    true,
  );
  expect(text).toContain('every observation holds (2 rows)');
  expect(svg).not.toContain('consistent-hatch');
});

describe('boundaries in the SVG lie on the closed-form lines (public/notes.html#closed-forms)', () => {
  // nu = 0, H = F, Delta_V = 0, energies per flux quantum (public/notes.html#closed-forms, derived
  // there from the energy): E_F = -2 uPerp - uZ - E_Z, E_CDW = uZ, E_KD = uPerp,
  // E_CAF = -uZ - E_Z^2 / (8 |uPerp|) for E_Z < 4 |uPerp|. The boundaries are where two of them
  // are equal: F/CAF at uPerp = -E_Z/4 (Phys. Rev. B 85, 155439 (2012): E_Z = 4 |uPerp| in our
  // convention), CAF/KD at uZ = -uPerp - E_Z^2 / (8 |uPerp|), KD/CDW at uZ = uPerp,
  // F/CDW at uZ = -uPerp - E_Z/2; at E_Z -> 0 these become the lines of that paper.
  const energy: Record<string, (u: number, v: number) => number> = {
    F: (u, v) => -2 * u - v - E_Z,
    CDW: (_u, v) => v,
    KD: (u) => u,
    CAF: (u, v) => -v - (E_Z * E_Z) / (8 * Math.abs(u)),
  };
  /** Distance of (u, v) from the line E_a = E_b, to first order: |dE| / |grad dE|. */
  function distance(a: string, b: string, u: number, v: number): number {
    const h = 1e-6;
    const f = (x: number, y: number) => energy[a]!(x, y) - energy[b]!(x, y);
    const g = Math.hypot(
      (f(u + h, v) - f(u - h, v)) / (2 * h),
      (f(u, v + h) - f(u, v - h)) / (2 * h),
    );
    return Math.abs(f(u, v)) / g;
  }

  test('every boundary point of F, CAF, KD, CDW lies on its line', () => {
    const doc = parse(svg);
    const frame = frameOf(doc);
    const toPlane = ([x, y]: Point): Point => [
      -2 + (4 * (x - frame.x)) / frame.w,
      -2 + (4 * (frame.y + frame.h - y)) / frame.h,
    ];
    const pixel = 4 / 24;
    const seen = new Map<string, { order: string; length: number }>();
    for (const path of elements(group(doc, 'boundaries'), 'path')) {
      const [pair, order] = elements(path, 'title')[0]!.textContent!.split(', ');
      const [a, b] = pair!.split(' | ') as [string, string];
      expect(Object.keys(energy)).toContain(a);
      expect(Object.keys(energy)).toContain(b);
      const points = subpaths(path.getAttribute('d')!)[0]!.map(toPlane);
      points.forEach(([u, v], m) => {
        // Inner points are located crossings (bisected to 1e-9, written to 0.01 pt); the ends
        // may be continued to the frame or to a triple point, within a pixel.
        const end = m === 0 || m === points.length - 1;
        const near = Math.abs(u + E_Z / 4) < pixel && Math.abs(v) < 2 * pixel;
        expect(distance(a, b, u, v)).toBeLessThan(end || near ? pixel : 2e-3);
      });
      let length = 0;
      for (let m = 1; m < points.length; m++)
        length += Math.hypot(points[m]![0] - points[m - 1]![0], points[m]![1] - points[m - 1]![1]);
      const key = [a, b].sort().join('|');
      seen.set(key, { order: order!, length: (seen.get(key)?.length ?? 0) + length });
      // Continuous transitions are dashed, first-order ones solid.
      expect(path.getAttribute('stroke-dasharray') !== null).toBe(order === 'continuous');
      expect(['first order', 'continuous']).toContain(order);
    }
    // F/CAF is continuous (public/notes.html#closed-forms: CAF merges continuously into F), the
    // rest first order; each runs from the frame to near the triple points about (-E_Z/4, 0): F/CAF
    // is about 1.9 long, the three diagonals about 2.5 to 2.7.
    expect(seen.get('CAF|F')).toMatchObject({ order: 'continuous' });
    expect(seen.get('CAF|F')!.length).toBeGreaterThan(1.8);
    for (const key of ['CAF|KD', 'CDW|KD', 'CDW|F']) {
      expect(seen.get(key)).toMatchObject({ order: 'first order' });
      expect(seen.get(key)!.length).toBeGreaterThan(2.3);
    }
  });
});

test('region outlines of a one-label plane are its frame', () => {
  const plane = standardPlane(3, 2, [1, 2], [-1, 0]);
  const { regions } = regionOutlines({
    plane: parseMapInput({ ...INTERFACES_EXAMPLE, plane }).plane,
    labels: new Array<string>(6).fill('F'),
    boundaries: [],
  });
  expect(regions).toHaveLength(1);
  expect(regions[0]!.loops).toHaveLength(1);
  expect(new Set(regions[0]!.loops[0]!.map((p) => p.join(',')))).toEqual(
    new Set(['1,-1', '2,-1', '2,0', '1,0']),
  );
});

test('region outlines of random label grids tile the plane, each pixel in its own region', () => {
  // Every cell configuration (two to four labels, saddles, triple and quadruple points) with
  // crossings drawn at random along the sides; seeded.
  const random = seededRandom(11);
  for (let trial = 0; trial < 12; trial++) {
    const nx = 2 + Math.floor(random() * 9);
    const ny = 2 + Math.floor(random() * 9);
    const plane = parseMapInput({
      ...INTERFACES_EXAMPLE,
      plane: standardPlane(nx, ny, [0, 1], [0, 1]),
    }).plane;
    const kinds = 2 + Math.floor(random() * 3);
    const labels = Array.from({ length: nx * ny }, () => 'ABCD'[Math.floor(random() * kinds)]!);
    const points: [number, number][] = [];
    for (let j = 0; j < ny; j++) {
      for (let i = 0; i < nx; i++) {
        const p = j * nx + i;
        const t = 0.05 + 0.9 * random();
        if (i + 1 < nx && labels[p] !== labels[p + 1])
          points.push([(i + 0.5 + t) / nx, (j + 0.5) / ny]);
        if (j + 1 < ny && labels[p] !== labels[p + nx])
          points.push([(i + 0.5) / nx, (j + 0.5 + t) / ny]);
      }
    }
    const { regions } = regionOutlines({
      plane,
      labels,
      boundaries: [{ between: ['A', 'B'], order: 'first', points }],
    });
    const loopsOf = regions.map((r) =>
      r.loops.map((loop) => loop.map(([x, y]) => [x, y] as Point)),
    );
    const area = loopsOf.reduce(
      (sum, loops) => sum + Math.abs(loops.reduce((a, loop) => a + signedArea(loop), 0)),
      0,
    );
    expect(area).toBeCloseTo(1, 12);
    const n = 61;
    for (let a = 0; a < n; a++) {
      for (let b = 0; b < n; b++) {
        const inside = loopsOf.filter((loops) => winding(loops, (a + 0.5) / n, (b + 0.5) / n));
        expect(inside).toHaveLength(1);
      }
    }
    for (let j = 0; j < ny; j++) {
      for (let i = 0; i < nx; i++) {
        const x = (i + 0.5) / nx + 1e-3;
        const y = (j + 0.5) / ny + 1e-3;
        const owner = regions.findIndex((_, k) => winding(loopsOf[k]!, x, y) !== 0);
        expect(regions[owner]!.label).toBe(labels[j * nx + i]);
      }
    }
  }
});
