import { describe, expect, test } from 'vitest';
import {
  checkSeriesQuantity,
  modelAtPoint,
  parseMapInput,
  parseSeriesQuantity,
  parseSeriesValues,
  seriesDocument,
  seriesQuantityName,
} from '../solver/index';
import { errorOf, sampleMapDocument } from './fixtures';

// The model of each map of a series (README, "Large Maps, shards and series"): what `--vary` and
// `--values` set, checked on the model at plane points, where the axes' targets act too.

/** The sample of public/examples/sample-map.json with one more channel, xx, that no axis sets. */
const sample = sampleMapDocument(8, 6);
const base = parseMapInput({
  ...sample,
  channels: { ...sample.channels, xx: { hartree: 0.2, fock: 0.6 } },
});

/** The model of the series map at `value`, at the plane point (x, y). */
function seriesModelAt(vary: string, value: number, x: number, y: number) {
  const quantity = parseSeriesQuantity(vary);
  return modelAtPoint(parseMapInput(seriesDocument(base, quantity, value)), x, y);
}

describe('series quantities', () => {
  test('zeeman and valleyZeeman set the field; the couplings keep the plane', () => {
    const m = seriesModelAt('zeeman', 0.9, 1, -0.5);
    expect(m.zeeman).toBe(0.9);
    expect(m.valleyZeeman).toBe(0.1);
    // The x axis sets x0's Fock part to x and its Hartree part to 0.8 x (the sample's plane).
    expect(m.channels.x0).toEqual({ hartree: 0.8, fock: 1 });
    expect(m.channels.xx).toEqual({ hartree: 0.2, fock: 0.6 });
    expect(seriesModelAt('valleyZeeman', -0.3, 0, 0).valleyZeeman).toBe(-0.3);
  });

  test('CH.fock and CH.hartree set one part of a channel; an unlisted channel follows the file rule', () => {
    expect(seriesModelAt('xx.fock', 0.7, 0, 0.25).channels.xx).toEqual({ hartree: 0.2, fock: 0.7 });
    expect(seriesModelAt('xx.hartree', -0.4, 0, 0.25).channels.xx).toEqual({
      hartree: -0.4,
      fock: 0.6,
    });
    // xz is not listed: its Hartree part follows a varied Fock part; a varied Hartree part alone
    // leaves its Fock part at 0.
    expect(seriesModelAt('xz.fock', 0.3, 0, 0).channels.xz).toEqual({ hartree: 0.3, fock: 0.3 });
    expect(seriesModelAt('xz.hartree', 0.3, 0, 0).channels.xz).toEqual({ hartree: 0.3, fock: 0 });
  });

  test('ratio:CH makes the Hartree part the value times the Fock part, on the axes too', () => {
    // The x axis sets the Fock parts of x0 and y0 to x; their Hartree parts become 0.5 x.
    const m = seriesModelAt('ratio:x0+y0', 0.5, 1.5, 0);
    expect(m.channels.x0).toEqual({ hartree: 0.75, fock: 1.5 });
    expect(m.channels.y0).toEqual({ hartree: 0.75, fock: 1.5 });
    expect(seriesModelAt('ratio:xx', 0.5, 1.5, 0).channels.xx).toEqual({ hartree: 0.3, fock: 0.6 });
    expect(seriesQuantityName(parseSeriesQuantity('ratio:x0+y0'))).toBe('ratio:x0+y0');
  });

  test('values: a list or from:to:n (both ends exact); bad ones refused in one line', () => {
    expect(parseSeriesValues('0.1,-2,3e-3')).toEqual([0.1, -2, 0.003]);
    expect(parseSeriesValues('0:1:5')).toEqual([0, 0.25, 0.5, 0.75, 1]);
    expect(parseSeriesValues('0.1:0.7:3')).toEqual([0.1, 0.1 + 0.3, 0.7]);
    expect(errorOf(() => parseSeriesValues('1,1'))).toContain('given twice');
    expect(errorOf(() => parseSeriesValues('0:1:101'))).toContain('from 2 to 100');
    expect(errorOf(() => parseSeriesValues('1:1:3'))).toContain('must differ');
    expect(errorOf(() => parseSeriesQuantity('ratio:x0+x0'))).toContain('named twice');
    expect(errorOf(() => parseSeriesQuantity('zeeman.fock'))).toContain('is not a channel');
    expect(errorOf(() => parseSeriesQuantity('field'))).toContain('expected zeeman, valleyZeeman');
  });

  test('a quantity an axis sets, or a ratio of a channel without a Fock part, is refused', () => {
    expect(errorOf(() => checkSeriesQuantity(base, parseSeriesQuantity('x0.hartree')))).toContain(
      "the plane's x axis sets x0.hartree",
    );
    expect(errorOf(() => checkSeriesQuantity(base, parseSeriesQuantity('ratio:zz')))).toContain(
      'zz has no Fock part',
    );
    expect(() => checkSeriesQuantity(base, parseSeriesQuantity('ratio:z0'))).not.toThrow();
  });
});
