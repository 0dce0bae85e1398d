import { describe, expect, it } from 'vitest';
import { optionalWholeNumber, wholeNumber } from '../../src/cli/options.js';
import { inputErrorMessage, inputIssues } from '../helpers.js';

describe('wholeNumber', () => {
  const range = { min: 1, max: 1000 };
  it.each([
    ['1', 1],
    ['1000', 1000],
    ['007', 7],
  ])('reads %s as %d', (text, value) => {
    expect(wholeNumber('--top', text, range)).toBe(value);
  });
  it.each(['0', '1001', '1e3', '1e12', '2.5', '2.0', '-3', '+3', '0x10', ' 4', '', 'ten', '99999999999999999999'])(
    'refuses %j as option.invalid at the option, with the value',
    (text) => {
      expect(inputIssues(() => wholeNumber('--top', text, range))).toEqual([
        expect.objectContaining({ code: 'option.invalid', path: ['--top'], value: JSON.stringify(text) }),
      ]);
    },
  );
  it('names the option, the value and the range in words', () => {
    expect(inputErrorMessage(() => wholeNumber('--top', '1001', range))).toBe(
      '--top: "1001" must be a whole number of at least 1 and at most 1000',
    );
  });
  it('names what is counted when told', () => {
    expect(inputErrorMessage(() => wholeNumber('--periods', '0', { min: 1, max: 1000, noun: 'clock periods' }))).toBe(
      '--periods: "0" must be a whole number of clock periods from 1 to 1000',
    );
  });
  it('gives the fallback only when the option is absent', () => {
    expect(optionalWholeNumber('--seed', undefined, { min: 0, max: 9 }, 4)).toBe(4);
    expect(optionalWholeNumber('--seed', '0', { min: 0, max: 9 }, 4)).toBe(0);
  });
});
