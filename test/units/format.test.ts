import { describe, expect, it } from 'vitest';
import {
  SI_PREFIXES,
  formatNs,
  formatPercent,
  formatSignedTime,
  formatStated,
  nsNumber,
  percentDecimals,
  prefixedUnits,
  unitFor,
} from '../../src/units/format.js';
import { formatMargin } from '../../src/report/margin-format.js';
import {
  formatPs,
  formatPsShort,
  formatPsTenths,
  formatSignedPs,
  formatSignedTimeShort,
  formatTime,
  psNumber,
  psTenthsNumber,
} from '../../src/units/format.js';

describe('picosecond formats', () => {
  it('psNumber and formatPs round to whole picoseconds', () => {
    expect(psNumber(812.4e-12)).toBe('812');
    expect(psNumber(812.5e-12)).toBe('813');
    expect(formatPs(1.2345e-9)).toBe('1235 ps');
  });

  it('formatSignedPs always shows the sign, and a value that rounds to zero is +0 ps', () => {
    expect(formatSignedPs(12.4e-12)).toBe('+12 ps');
    expect(formatSignedPs(-3e-12)).toBe('-3 ps');
    expect(formatSignedPs(-0.4e-12)).toBe('+0 ps');
  });

  it('psTenthsNumber and formatPsTenths keep one decimal and print - for a value that is not finite', () => {
    expect(psTenthsNumber(812.44e-12)).toBe('812.4');
    expect(formatPsTenths(5e-12)).toBe('5.0 ps');
    expect(psTenthsNumber(NaN)).toBe('-');
    expect(formatPsTenths(Infinity)).toBe('-');
  });

  it('formatPsShort rounds to 0.1 ps and drops a trailing .0', () => {
    expect(formatPsShort(12e-12)).toBe('12 ps');
    expect(formatPsShort(12.46e-12)).toBe('12.5 ps');
  });

  it('formatSignedTimeShort switches from ps to ns at 1 ns and to us at 1 us', () => {
    expect(formatSignedTimeShort(850e-12)).toBe('+850 ps');
    expect(formatSignedTimeShort(-1.25e-9)).toBe('-1.25 ns');
    expect(formatSignedTimeShort(12.34e-9)).toBe('+12.3 ns');
    expect(formatSignedTimeShort(1.5e-6)).toBe('+1.50 us');
  });

  it('formatTime picks the prefix for the magnitude', () => {
    expect(formatTime(812e-12)).toBe('812 ps');
    expect(formatTime(1.234e-9)).toBe('1.23 ns');
  });
});

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

describe('formatPs from 10 ns', () => {
  it.each([
    [972e-12, '972 ps'],
    [9.9994e-9, '9999 ps'],
    [14.099e-9, '14.10 ns'],
    [25e-9, '25.00 ns'],
  ])('%d s -> %s', (s, text) => {
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

describe('SI_PREFIXES and prefixedUnits', () => {
  it('holds giga to femto, largest first, micro written u', () => {
    expect(SI_PREFIXES.map(([, p]) => p).join('')).toBe('GMkmunpf');
    expect(SI_PREFIXES.map(([s]) => s)).toEqual([1e9, 1e6, 1e3, 1, 1e-3, 1e-6, 1e-9, 1e-12, 1e-15]);
  });

  it('prefixedUnits gives the unit at each prefix in the range, both ends included', () => {
    expect(prefixedUnits('s', 1, 1e-15)).toEqual([
      [1, 's'],
      [1e-3, 'ms'],
      [1e-6, 'us'],
      [1e-9, 'ns'],
      [1e-12, 'ps'],
      [1e-15, 'fs'],
    ]);
    expect(prefixedUnits('C', 1e-9, 1e-15)).toEqual([
      [1e-9, 'nC'],
      [1e-12, 'pC'],
      [1e-15, 'fC'],
    ]);
  });

  it('unitFor picks the largest unit the magnitude reaches, else the smallest (also for 0 and NaN)', () => {
    const units = prefixedUnits('s', 1e-6, 1e-12);
    expect(unitFor(2e-6, units)).toEqual([1e-6, 'us']);
    expect(unitFor(1e-9, units)).toEqual([1e-9, 'ns']);
    expect(unitFor(999e-12, units)).toEqual([1e-12, 'ps']);
    expect(unitFor(0, units)).toEqual([1e-12, 'ps']);
    expect(unitFor(Number.NaN, units)).toEqual([1e-12, 'ps']);
  });
});

describe('formatNs and nsNumber', () => {
  it('write nanoseconds with two decimals, with and without the unit', () => {
    expect(nsNumber(14.104e-9)).toBe('14.10');
    expect(formatNs(14.104e-9)).toBe('14.10 ns');
    expect(formatNs(-2.5e-9)).toBe('-2.50 ns');
  });
});

describe('formatStated', () => {
  it('names a stated value in as few figures from 3 to 6 as give it back, never rounding it', () => {
    expect(formatStated(500e-12, 's')).toBe('500 ps');
    expect(formatStated(50e-12, 's')).toBe('50.0 ps');
    expect(formatStated(979.5e-12, 's')).toBe('979.5 ps');
    expect(formatStated(12.25e-12, 's')).toBe('12.25 ps');
    expect(formatStated(1.05e-9, 's')).toBe('1.05 ns');
    expect(formatStated(2.88, 'V')).toBe('2.88 V');
    expect(formatStated(3.2425, 'V')).toBe('3.2425 V');
    // More than six figures: six.
    expect(formatStated(1.23456789e-9, 's')).toBe('1.23457 ns');
  });
});
