import { expect, test } from 'vitest';
import { formatFixed, groupThousands } from '../app/format';

test('integers are grouped by three digits as en-US writes them', () => {
  for (const n of [0, 7, 999, 1000, 4096, 65536, 262144, 1000000, 4194304]) {
    expect(groupThousands(n)).toBe(n.toLocaleString('en-US'));
  }
  expect(groupThousands(65536)).toBe('65,536');
});

test('fixed decimals never show a negative zero', () => {
  expect(formatFixed(-0.00001, 4)).toBe('0');
  expect(formatFixed(1.23456, 2)).toBe('1.23');
});
