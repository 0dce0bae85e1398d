import { describe, expect, it } from 'vitest';
import { bareNumberProblem } from '../../src/units/bare-number.js';
import { cli, design } from '../helpers.js';

describe('bareNumberProblem', () => {
  it.each([
    [200, 200, 's', 'reads as 200 s'],
    ['1e-6', 1e-6, 's', 'reads as 1e-6 s'],
    [-3, -3, 's', 'reads as -3 s'],
    [20, 20, 'Hz', 'reads as 20 Hz'],
    ['999', 999, 'Hz', 'reads as 999 Hz'],
  ] as const)('refuses the unit-less %j as %s, naming the likely unit', (raw, value, unit, words) => {
    const problem = bareNumberProblem(raw, value, unit)!;
    expect(problem).toContain(words);
    expect(problem).toContain(unit === 's' ? `"${String(raw)}ps"` : `"${String(raw)}MHz"`);
  });

  it.each([
    [2e-10, 2e-10, 's'],
    [9.99e-7, 9.99e-7, 's'],
    ['2us', 2e-6, 's'],
    [1000, 1000, 'Hz'],
    ['20Hz', 20, 'Hz'],
    [20e6, 20e6, 'Hz'],
    [200, 200, 'V'],
    [200, 200, 'm'],
  ] as const)('accepts %j for a field in %s', (raw, value, unit) => {
    expect(bareNumberProblem(raw, value, unit)).toBeUndefined();
  });
});

describe('phasegap check --set with a unit-less number', () => {
  it.each([
    [
      'clock.transition=200',
      'clock.transition: 200 is out of range; it must be greater than 0 s and at most 1 s; it has no unit, so it reads as 200 s',
    ],
    ['clock.frequency=20', 'clock.frequency: 20 has no unit, so it reads as 20 Hz'],
  ])('refuses %s with exit 2 and the likely unit', (set, message) => {
    const run = cli('check', design('doubler'), '--set', set);
    expect(run.code).toBe(2);
    expect(run.stderr).toContain(message);
    expect(run.stdout).toBe('');
  });

  it('runs 20 Hz when the unit is written', () => {
    const run = cli('check', design('doubler'), '--set', 'clock.frequency=20Hz');
    expect(run.stdout).toContain('clock 20.0 Hz');
  });
});
