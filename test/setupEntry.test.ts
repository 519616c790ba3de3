import { storedItems } from './memoryStorage';
import { describe, expect, test } from 'vitest';
import { DEMO_SETUP } from '../app/scenario/demo';
import {
  COUPLING_RULE,
  ENTRY_BOUND,
  formatEntry,
  parseEntry,
  type EntryRule,
} from '../app/setup/numberEntry';
import { commitSetup } from '../app/setup/commitSetup';
import { onePartChannels, sweptTargets } from '../app/setup/sweep';
import type { Setup } from '../app/scenario/setup';
import { STORAGE_KEY, useFourfold } from '../app/store/index';

const SIDE_RULE: EntryRule = { min: 2, max: 1024, integer: true, tooLarge: 'too many' };

function messageOf(text: string, rule: EntryRule = COUPLING_RULE): string | null {
  const entry = parseEntry(text, rule);
  return entry.ok ? null : entry.message;
}

describe('typed numbers', () => {
  test('decimal numbers, exponents and the typographic minus are accepted', () => {
    expect(parseEntry('0.25', COUPLING_RULE)).toEqual({ ok: true, value: 0.25 });
    expect(parseEntry(' −1.5 ', COUPLING_RULE)).toEqual({ ok: true, value: -1.5 });
    expect(parseEntry('1e-3', COUPLING_RULE)).toEqual({ ok: true, value: 0.001 });
    expect(parseEntry('.5', COUPLING_RULE)).toEqual({ ok: true, value: 0.5 });
    expect(parseEntry('2.', COUPLING_RULE)).toEqual({ ok: true, value: 2 });
  });

  test('empty, non-numbers, non-finite and out-of-range entries are refused with a reason', () => {
    expect(messageOf('')).toBe('enter a number');
    expect(messageOf('  ')).toBe('enter a number');
    expect(messageOf('abc')).toBe('not a number');
    expect(messageOf('-')).toBe('not a number');
    expect(messageOf('0x10')).toBe('not a number');
    expect(messageOf('1,5')).toBe('not a number');
    expect(messageOf('NaN')).toBe('must be a finite number');
    expect(messageOf('-Infinity')).toBe('must be a finite number');
    expect(messageOf('1e400')).toBe('must be a finite number');
    expect(messageOf(String(ENTRY_BOUND + 1))).toBe(`at most ${ENTRY_BOUND}`);
    expect(messageOf(String(-ENTRY_BOUND - 1))).toBe(`at least ${-ENTRY_BOUND}`);
    expect(messageOf(String(ENTRY_BOUND))).toBeNull();
    expect(messageOf('2.5', SIDE_RULE)).toBe('must be a whole number');
    expect(messageOf('1025', SIDE_RULE)).toBe('too many');
    expect(messageOf('1', SIDE_RULE)).toBe('at least 2');
  });

  test('stored values are shown without float noise or a negative zero', () => {
    expect(formatEntry(0.1 + 0.2)).toBe('0.3');
    expect(formatEntry(-0)).toBe('0');
    expect(formatEntry(-1.25)).toBe('-1.25');
    expect(formatEntry(1.2 * -1.5)).toBe('-1.8');
  });
});

describe('swept targets', () => {
  test('the demo sweeps x0 and y0 along x and z0 along y, not the fields', () => {
    const swept = sweptTargets(DEMO_SETUP);
    expect(swept.get('x0.hartree')).toBe('x');
    expect(swept.get('y0.fock')).toBe('x');
    expect(swept.get('z0.fock')).toBe('y');
    expect(swept.has('zeeman')).toBe(false);
    expect(swept.has('xx.fock')).toBe(false);
    expect(swept.size).toBe(6);
  });

  test('a target both axes set is reported as swept along both', () => {
    const setup: Setup = {
      ...DEMO_SETUP,
      x: { quantity: 'zeeman', from: 0, to: 1, hartreeRatio: 1 },
      y: {
        quantity: 'custom',
        from: 0,
        to: 1,
        hartreeRatio: 1,
        targets: { zeeman: 0.5, 'zz.fock': 1, 'xx.fock': 2 },
      },
      channels: { ...DEMO_SETUP.channels, xx: { hartree: 0.3, fock: 0.1 } },
    };
    const swept = sweptTargets(setup);
    expect(swept.get('zeeman')).toBe('x and y');
    expect(swept.get('zz.fock')).toBe('y');
    // zz is not listed: its Hartree part follows the axis (missing hartree = fock); xx is
    // listed and keeps its own.
    expect(swept.get('zz.hartree')).toBe('y');
    expect(swept.has('xx.hartree')).toBe(false);
    expect(onePartChannels(setup)).toEqual(new Set(['zz', 'xx']));
  });
});

describe('commitSetup', () => {
  test('writes a valid change, and refuses one that breaks the plane without touching the store', () => {
    useFourfold.getState().replaceSetup(DEMO_SETUP);

    expect(commitSetup({ zeeman: 1.25 })).toBeNull();
    expect(useFourfold.getState().setup.zeeman).toBe(1.25);

    const before = useFourfold.getState().setup;
    expect(commitSetup((s) => ({ x: { ...s.x, to: s.x.from } }))).toBe(
      'plane.x.to: must differ from plane.x.from',
    );
    expect(commitSetup({ resolution: [2000, 256] })).toMatch(
      /^plane\.resolution\[0\]: at most 512 in the browser/,
    );
    expect(commitSetup({ valleyZeeman: Number.POSITIVE_INFINITY })).toMatch(/^valleyZeeman:/);
    expect(useFourfold.getState().setup).toBe(before);

    // The autosave holds the last valid setup, as a scenario document.
    const stored = JSON.parse(storedItems.get(STORAGE_KEY)!) as {
      state: { setup: { zeeman: number } };
    };
    expect(stored.state.setup.zeeman).toBe(1.25);
  });
});
