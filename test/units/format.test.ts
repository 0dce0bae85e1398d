import { describe, expect, it } from 'vitest';
import {
  formatPs, formatPsShort, formatPsTenths, formatSignedPs, formatSignedTimeShort, formatTime, psNumber, psTenthsNumber,
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
