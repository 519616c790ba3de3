import { deflateSync } from 'node:zlib';
import { scaleLinear } from 'd3';
import { describe, expect, test } from 'vitest';
import {
  FIGURE_COLUMNS,
  PT_PER_CM,
  axisSvg,
  figureDocument,
  linearTicks,
  typesetLabel,
} from '../app/figure/figureStyle';
import { pngResolution, pngWithResolution } from '../app/figure/pngResolution';

describe('figure style', () => {
  test('column presets: 8.6 cm and 17.8 cm (APS widths, from memory) in pt', () => {
    expect(PT_PER_CM).toBeCloseTo(28.3465, 4);
    expect(FIGURE_COLUMNS.single.widthPt).toBeCloseTo(243.78, 2);
    expect(FIGURE_COLUMNS.double.widthPt).toBeCloseTo(504.57, 2);
  });

  test('labels are typeset: subscripts, Greek, italic variables, upright units', () => {
    const perp = typesetLabel('u_perp', 8);
    expect(perp.text).toBe('u\u22a5');
    expect(perp.markup).toBe(
      '<tspan font-style="italic">u</tspan><tspan dy="2" font-size="5.6">\u22a5</tspan>',
    );
    expect(typesetLabel('Delta_V').text).toBe('\u0394V');
    expect(typesetLabel('u_x0').markup).toContain('>x0</tspan>');
    // After a subscript the baseline comes back for the text that follows.
    const field = typesetLabel('B_tot (T)', 10);
    expect(field.markup).toBe(
      '<tspan font-style="italic">B</tspan><tspan dy="2.5" font-size="7">tot</tspan><tspan dy="-2.5" xml:space="preserve"> (T)</tspan>',
    );
    expect(typesetLabel('a<b & c').markup).not.toMatch(/<b|& /);
    // Only scripted or lone letters are variables: the sample name and the unit stay upright.
    const title = typesetLabel('Sample A, B_perp = 9 T').markup;
    expect(title.match(/italic/g)).toHaveLength(1);
    expect(title).toContain('<tspan font-style="italic">B</tspan>');
    expect(typesetLabel('x').markup).toBe('<tspan font-style="italic">x</tspan>');
  });

  test('an axis: one tick per round value, numbers with a true minus, a typeset title', () => {
    const scale = scaleLinear().domain([-2, 2]).range([10, 110]);
    expect(linearTicks(-2, 2, 5)).toEqual([-2, -1, 0, 1, 2]);
    const svg = axisSvg(scale, 'bottom', { at: 50, title: 'E_Z' });
    expect(svg.match(/M/g)).toHaveLength(5);
    expect(svg).toContain('>\u22122</text>');
    expect(svg).toContain('<tspan font-style="italic">E</tspan>');
    const mirror = axisSvg(scale, 'top', { at: 0, labels: false });
    expect(mirror).not.toContain('<text');
  });

  test('a document is SVG 1.1 with its size in cm and the viewBox in pt', () => {
    const doc = figureDocument({ widthPt: 243.78, heightPt: 100, title: 'a & b' }, '<g/>');
    expect(doc).toContain('version="1.1"');
    expect(doc).toContain('width="8.6cm"');
    expect(doc).toContain('viewBox="0 0 243.78 100"');
    expect(doc).toContain('<title>a &amp; b</title>');
  });
});

const crcTable = Array.from({ length: 256 }, (_, n) => {
  let c = n;
  for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  return c >>> 0;
});

/** CRC-32 by table (PNG specification, annex D), independent of the code under test. */
function crc(bytes: Uint8Array): number {
  let c = 0xffffffff;
  for (const b of bytes) c = crcTable[(c ^ b) & 0xff]! ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

/** A 1 x 1 grey PNG built by hand (PNG specification: signature, IHDR, IDAT, IEND). */
function tinyPng(): Uint8Array {
  const chunk = (type: string, data: Uint8Array) => {
    const out = Buffer.alloc(12 + data.length);
    out.writeUInt32BE(data.length, 0);
    out.write(type, 4, 'latin1');
    Buffer.from(data).copy(out, 8);
    out.writeUInt32BE(crc(out.subarray(4, 8 + data.length)), 8 + data.length);
    return out;
  };
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(1, 0);
  ihdr.writeUInt32BE(1, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 0; // greyscale
  return Buffer.concat([
    Buffer.from([137, 80, 78, 71, 13, 10, 26, 10]),
    chunk('IHDR', ihdr),
    chunk('IDAT', deflateSync(Buffer.from([0, 128]))),
    chunk('IEND', new Uint8Array(0)),
  ]);
}

describe('PNG resolution', () => {
  test('a pHYs chunk after IHDR carries the dpi, replacing an older one', () => {
    const png = tinyPng();
    expect(pngResolution(png)).toBeNull();
    const marked = pngWithResolution(png, 300);
    // 300 dpi = 11811 pixels per metre (1 in = 0.0254 m exactly).
    expect(pngResolution(marked)).toBeCloseTo(300, 0);
    expect(Buffer.from(marked.subarray(37, 41)).toString('latin1')).toBe('pHYs');
    const view = new DataView(marked.buffer);
    expect(view.getUint32(41)).toBe(11811);
    expect(view.getUint32(50)).toBe(crc(marked.subarray(37, 50)));
    const again = pngWithResolution(marked, 600);
    expect(again.length).toBe(marked.length);
    expect(pngResolution(again)).toBeCloseTo(600, 0);
    expect(() => pngWithResolution(new Uint8Array(40), 300)).toThrow('not a PNG file');
  });
});
