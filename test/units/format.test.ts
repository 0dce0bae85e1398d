import { describe, expect, it } from 'vitest';
import { formatPercent, formatPs, formatSignedTime, percentDecimals } from '../../src/units/format.js';
import { formatMargin } from '../../src/report/margin-format.js';

describe('formatSignedTime', () => {
  it.each([
    [528e-15, '+0.53 ps'],
    [-4e-15, '-0.00 ps'],
    [-999e-15, '-1.00 ps'],
    [316e-12, '+316 ps'],
    [-1.2e-9, '-1.20 ns'],
  ])('never prints a margin in fs: %d s -> %s', (s, text) => {
    expect(formatSignedTime(s)).toBe(text);
    expect(formatMargin(s, 'dead-time-min')).toBe(text);
    expect(text).not.toContain('fs');
  });
});

describe('formatPs', () => {
  it.each([[972e-12, '972 ps'], [9.9994e-9, '9999 ps'], [14.099e-9, '14.10 ns'], [25e-9, '25.00 ns']])('%d s -> %s', (s, text) => {
    expect(formatPs(s)).toBe(text);
  });
});

describe('percentDecimals and formatPercent', () => {
  it('keeps one precision for a table, fine enough that 99.96 % does not read as 100 %', () => {
    expect(percentDecimals([1, 0.958, 0])).toBe(1);
    expect(percentDecimals([1, 0.9996, 0.958])).toBe(2);
    expect(percentDecimals([0.99999])).toBe(3);
    expect(percentDecimals([0.999999])).toBe(4);
    const d = percentDecimals([1, 0.9996]);
    expect([1, 0.9996].map((x) => formatPercent(x, d))).toEqual(['100.00 %', '99.96 %']);
  });
});
