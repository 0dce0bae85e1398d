import { describe, it, expect } from 'vitest';
import { finite } from '../../src/units/finite.js';
import { InputError } from '../../src/errors.js';

describe('finite', () => {
  it('returns a finite number unchanged, zero and negatives included', () => {
    expect(finite(1.5e-12, ['x'])).toBe(1.5e-12);
    expect(finite(0, ['x'])).toBe(0);
    expect(finite(-3, ['x'])).toBe(-3);
  });

  it.each([Infinity, -Infinity, NaN])('turns %s into an InputError naming what was being written', (value) => {
    let caught: unknown;
    try {
      finite(value, ['Verilog delay'], 'gate u1 at tt/1.8V/27C');
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(InputError);
    const issue = (caught as InputError).issues[0]!;
    expect(issue.code).toBe('value.not-finite');
    expect(issue.path).toEqual(['Verilog delay']);
    expect(issue.value).toBe(String(value));
    expect(issue.expected).toBe('is not a finite number and cannot be written: gate u1 at tt/1.8V/27C');
  });
});
