import { describe, expect, it } from 'vitest';
import { agrees, differences, flatten, goldenNumbers, goldenText, TOLERANCE, type GoldenNumbers } from './numbers.js';

const check = JSON.stringify({
  corners: [
    {
      name: 'tt/1.8V/27C',
      verdict: 'pass',
      checks: [
        { kind: 'dead-time-min', name: 'dead p1->p2 >= 500 ps', margin: 4e-10 },
        { kind: 'off-state', name: 's1 holds off', margin: 0.3, phase: 'phase p2' },
        { kind: 'off-state', name: 's1 holds off', margin: 0.2, phase: 'phase p2' },
      ],
      deadTimes: [{ from: 'p1', to: 'p2', t50: 9e-10, gap: null }],
      widths: { p1: 2.4e-8 },
      overlap: 0,
      circuit: { method: 'direct', output: 2.98, startupCycles: 25, nested: { a: 1 } },
    },
  ],
});

describe('goldenNumbers', () => {
  it('keys dead times, widths, overlap, each check margin (numbered when a name repeats) and the flat circuit figures', () => {
    const g = goldenNumbers('d', check, JSON.stringify({ fmax: 2.5e7 }));
    expect(g).toEqual({
      design: 'd',
      fmax: 2.5e7,
      corners: {
        'tt/1.8V/27C': {
          verdict: 'pass',
          'dead p1->p2 t50': 9e-10,
          'width p1': 2.4e-8,
          overlap: 0,
          'margin dead-time-min: dead p1->p2 >= 500 ps': 4e-10,
          'margin off-state: s1 holds off (phase p2)': 0.3,
          'margin off-state: s1 holds off (phase p2) #2': 0.2,
          'circuit method': 'direct',
          'circuit output': 2.98,
          'circuit startupCycles': 25,
        },
      },
    });
    expect(flatten(g).get('tt/1.8V/27C / width p1')).toBe(2.4e-8);
    expect(goldenText(g).endsWith('}\n')).toBe(true);
  });
});

describe('agrees', () => {
  it('accepts a change within relative 1e-9 plus 1e-18 absolute and refuses one just beyond', () => {
    expect(TOLERANCE).toEqual({ relative: 1e-9, absolute: 1e-18 });
    expect(agrees(1 + 0.9e-9, 1)).toBe(true);
    expect(agrees(1 + 1.1e-9, 1)).toBe(false);
    expect(agrees(5e-19, 0)).toBe(true);
    expect(agrees(2e-18, 0)).toBe(false);
    expect(agrees('pass', 'pass')).toBe(true);
    expect(agrees('fail', 'pass')).toBe(false);
    expect(agrees(undefined, 1)).toBe(false);
  });
});

describe('differences', () => {
  it('lists moved, new and vanished values with the relative change, and nothing for equal numbers', () => {
    const golden: GoldenNumbers = { design: 'd', fmax: 2e7, corners: { c: { a: 1, gone: 2 } } };
    const now: GoldenNumbers = { design: 'd', fmax: 2.1e7, corners: { c: { a: 1, added: 'x' } } };
    expect(differences(now, golden)).toEqual(['fmax: 20000000 -> 21000000 (5.00 %)', 'c / gone: 2 -> (none)', 'c / added: (none) -> x']);
    expect(differences(golden, golden)).toEqual([]);
  });
});
