import { beforeAll, describe, expect, test } from 'vitest';
import { cutFigureSvg } from '../app/figure/cutFigure';
import { mapFigureSvg } from '../app/figure/mapFigure';
import { latticeSvg } from '../app/probe/latticeSvg';
import { csvComment, csvText } from '../solver/csvText';
import {
  CHANNELS,
  MEAN_FIELD_CAUTION,
  ORDER_GROUPS,
  SOFTWARE_VERSION,
  computeCut,
  computePhaseMap,
  cutToCsv,
  mapCsvPieces,
  mapJsonPieces,
  mapToCsv,
  mapToJson,
  modelToJson,
  parseMapInput,
  parseModel,
  probeModel,
  textChunks,
  type CutResult,
  type MapInput,
  type PhaseMap,
} from '../solver/index';
import { INTERFACES_EXAMPLE, standardPlane } from './fixtures';
import { parseCsvStrictly, parseXmlStrictly, textsOf } from './strictParsers';

// Hostile text of our own: a leading formula character, control characters that XML 1.0 does
// not allow (U+0001, U+000B, U+FFFE, U+FFFF, a lone surrogate), quotes, commas, CR and LF,
// markup and a CDATA end.
const HOSTILE_X = '=HYPERLINK("x",1)\u0001 "quoted", a\nb\rc\ud800\ufffe\uffff <&> ]]>';
const HOSTILE_Y = '-u_z,\u000b@y';
const HOSTILE_TITLE = '=E_Z "title",\u0002 <b>&amp;\u001f';

/**
 * A text cell as a CSV file holds it: neutralised with a leading apostrophe (a spreadsheet shows
 * it as text) and in UTF-8, where a lone surrogate can only be U+FFFD (the reader gets bytes).
 */
const neutralised = (text: string) =>
  new TextDecoder().decode(new TextEncoder().encode(`'${text}`));

function hostileInput(nx: number, ny: number): MapInput {
  const plane = standardPlane(nx, ny);
  return parseMapInput({
    ...INTERFACES_EXAMPLE,
    plane: { ...plane, x: { ...plane.x, label: HOSTILE_X }, y: { ...plane.y, label: HOSTILE_Y } },
  });
}

let hostileMap: PhaseMap;
let plainMap: PhaseMap;
let lineCut: CutResult;
let sweepCut: CutResult;

beforeAll(async () => {
  hostileMap = await computePhaseMap(hostileInput(12, 10));
  plainMap = await computePhaseMap(
    parseMapInput({ ...INTERFACES_EXAMPLE, plane: standardPlane(9, 7) }),
  );
  const input = hostileInput(12, 10);
  lineCut = computeCut(input, { kind: 'line', from: [-1.8, 1.5], to: [1.5, -1.8] }, 60);
  sweepCut = computeCut(input, { kind: 'x', at: [0, 1], from: -1.8, to: 1.2 }, 40);
}, 120_000);

describe('SVG writers: hostile labels and titles still give well-formed XML', () => {
  test('the Map figure', () => {
    for (const column of ['single', 'double'] as const) {
      const svg = mapFigureSvg(hostileMap, { column, title: HOSTILE_TITLE, unit: 'meV' });
      const doc = parseXmlStrictly(svg);
      const texts = textsOf(doc).join('\n');
      // The readable parts survive; U+0001 and U+0002 show as their control pictures.
      expect(texts).toContain('=HYPERLINK("x",1)\u2401 "quoted", a');
      expect(texts).toContain('"title",\u2402 <b>&amp;\u241f');
      expect(textsOf(doc, 'title')[0]).toBe('=E_Z "title",\u2402 <b>&amp;\u241f');
      // The plane (with the labels, JSON-escaped) is in <desc>; U+FFFE and U+FFFF substituted.
      const desc = textsOf(doc, 'desc')[0]!;
      expect(desc).toContain(
        '"label":"=HYPERLINK(\\"x\\",1)\\u0001 \\"quoted\\", a\\nb\\rc\\ud800',
      );
      expect(desc).toContain('\u2426\u2426 <&> ]]>"');
    }
  });

  test('the Cut figure, along a line and along a sweep of the hostile axis', () => {
    for (const cut of [lineCut, sweepCut]) {
      const svg = cutFigureSvg(cut, { plane: hostileMap.input.plane, title: HOSTILE_TITLE });
      const doc = parseXmlStrictly(svg);
      expect(textsOf(doc, 'title')[0]).toBe('=E_Z "title",\u2402 <b>&amp;\u241f');
      expect(textsOf(doc, 'desc')[0]).toContain('=HYPERLINK("x",1)\u2401 "quoted", a');
    }
    expect(sweepCut.axis.label).toBe(HOSTILE_X);
  });

  test('the lattice picture', () => {
    const report = probeModel(parseModel(INTERFACES_EXAMPLE));
    const doc = parseXmlStrictly(latticeSvg(report, HOSTILE_TITLE));
    expect(textsOf(doc)[0]).toBe(`=E_Z "title",\u2402 <b>&amp;\u241f: ${report.state.phase}`);
  });
});

describe('CSV writers: RFC 4180, formula-leading text neutralised, numbers untouched', () => {
  test('csvText: each cell reads back through a strict RFC 4180 reader', () => {
    const cases: [string, string][] = [
      ['CAF', 'CAF'],
      ['', ''],
      ['=1+1', neutralised('=1+1')],
      ['+1', neutralised('+1')],
      ['-1.5', neutralised('-1.5')],
      ['@SUM(A1)', neutralised('@SUM(A1)')],
      ['\tx', neutralised('\tx')],
      ['\rx', neutralised('\rx')],
      ['a,b', 'a,b'],
      ['say "hi"', 'say "hi"'],
      ['a\nb', 'a\nb'],
      ['lone\rcr', 'lone\rcr'],
      ['#not a comment', '#not a comment'],
      ['u_perp', 'u_perp'],
    ];
    // Each case as the first cell of a row (where a `#` would start a comment) and inside one.
    const text =
      'h1,h2\n' + cases.map(([cell]) => `${csvText(cell)},${csvText(`x${cell}`)}`).join('\n');
    const { header, rows } = parseCsvStrictly(text + '\n');
    expect(header).toEqual(['h1', 'h2']);
    expect(rows).toEqual(cases.map(([cell, read]) => [read, `x${cell}`]));
    // Quoting is used only where RFC 4180 needs it (and for a leading #).
    expect(csvText('CAF+KD')).toBe('CAF+KD');
    expect(csvText('a"b')).toBe('"a""b"');
    expect(csvText('\rx')).toBe('"\'\rx"');
  });

  test('csvComment: one line whatever the text holds', () => {
    expect(csvComment('a\nb\rc\u2028d\u0000e')).toBe('# a b c d e');
  });

  test('the Map CSV with hostile axis names', () => {
    const { header, rows, comments } = parseCsvStrictly(mapToCsv(hostileMap));
    expect(comments).toEqual([
      `# ${MEAN_FIELD_CAUTION}`,
      `# fourfold ${SOFTWARE_VERSION}; model ${JSON.stringify(modelToJson(hostileMap.input.model))}`,
      csvComment(`plane ${JSON.stringify(hostileMap.input.plane)}`),
    ]);
    expect(header).toEqual([
      neutralised(HOSTILE_X),
      neutralised(HOSTILE_Y),
      'phase',
      'energy',
      'gap',
      ...CHANNELS,
    ]);
    const [nx, ny] = hostileMap.input.plane.resolution;
    expect(rows).toHaveLength(nx * ny);
    let negatives = 0;
    rows.forEach((row, p) => {
      const i = p % nx;
      const j = Math.floor(p / nx);
      expect(row).toHaveLength(20);
      expect(row[2]).toBe(hostileMap.labels[p]);
      const numbers = [
        hostileMap.x[i]!,
        hostileMap.y[j]!,
        hostileMap.energy[p]!,
        hostileMap.gap[p]!,
        ...hostileMap.order.subarray(15 * p, 15 * p + 15),
      ];
      const cells = [row[0], row[1], ...row.slice(3)];
      // Every number reads back exactly; negative ones stay plain numbers.
      expect(cells.map(Number)).toEqual(numbers);
      negatives += cells.filter((c) => c!.startsWith('-')).length;
    });
    expect(negatives).toBeGreaterThan(nx * ny);
  });

  test('the Cut CSV with hostile axis names: one # line per transition, cells read back', () => {
    for (const cut of [lineCut, sweepCut]) {
      const text = cutToCsv(cut, hostileMap.input);
      const { header, rows, comments } = parseCsvStrictly(text);
      expect(cut.transitions.length).toBeGreaterThan(0);
      expect(comments).toHaveLength(3 + cut.transitions.length);
      expect(comments.filter((c) => c.startsWith('# transition '))).toHaveLength(
        cut.transitions.length,
      );
      expect(header).toEqual([
        't',
        cut === lineCut ? 'distance' : neutralised(HOSTILE_X),
        neutralised(HOSTILE_X),
        neutralised(HOSTILE_Y),
        'phase',
        'energy',
        'slope',
        'gap',
        'canting_deg',
        ...ORDER_GROUPS.map((g) => g.key),
      ]);
      expect(rows).toHaveLength(cut.t.length);
      rows.forEach((row, i) => {
        expect(row[4]).toBe(cut.labels[i]);
        expect(Number(row[0])).toBe(cut.t[i]);
        expect(Number(row[5])).toBe(cut.energy[i]);
        expect(Number(row[6])).toBe(cut.slope[i]);
      });
    }
  });
});

/** The Map CSV as the one-shot writer built it before it was streamed (plain labels only). */
function oneShotCsv(map: PhaseMap): string {
  const [nx, ny] = map.input.plane.resolution;
  const lines = [
    `# ${MEAN_FIELD_CAUTION}`,
    `# fourfold ${SOFTWARE_VERSION}; model ${JSON.stringify(modelToJson(map.input.model))}`,
    `# plane ${JSON.stringify(map.input.plane)}`,
    [map.input.plane.x.label, map.input.plane.y.label, 'phase', 'energy', 'gap', ...CHANNELS].join(
      ',',
    ),
  ];
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const p = j * nx + i;
      const order = Array.from(map.order.subarray(15 * p, 15 * p + 15), (v) => String(v));
      lines.push(
        [map.x[i], map.y[j], map.labels[p], map.energy[p], map.gap[p], ...order].join(','),
      );
    }
  }
  return lines.join('\n') + '\n';
}

describe('streamed Map writers give the one-shot text, byte for byte', () => {
  test('JSON: the pieces joined are JSON.stringify(mapToJson(map))', () => {
    for (const map of [plainMap, hostileMap]) {
      const pieces = [...mapJsonPieces(map)];
      const [, ny] = map.input.plane.resolution;
      // Written a row at a time: far more pieces than rows.
      expect(pieces.length).toBeGreaterThan(18 * ny);
      expect(pieces.join('')).toBe(JSON.stringify(mapToJson(map)));
      const chunks = [...textChunks(mapJsonPieces(map), 1000)];
      expect(chunks.length).toBeGreaterThan(5);
      expect(chunks.join('')).toBe(pieces.join(''));
    }
  });

  test('CSV: the pieces joined are the one-shot CSV', () => {
    const [nx, ny] = plainMap.input.plane.resolution;
    const pieces = [...mapCsvPieces(plainMap)];
    // The lines above the rows in one piece, then one piece per grid point.
    expect(pieces).toHaveLength(1 + nx * ny);
    expect(pieces.join('')).toBe(oneShotCsv(plainMap));
    expect([...textChunks(mapCsvPieces(plainMap), 700)].join('')).toBe(oneShotCsv(plainMap));
  });
});
