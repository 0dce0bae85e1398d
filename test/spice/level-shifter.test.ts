import { describe, expect, it } from 'vitest';
import { latchCapLines, shifterFrontLines } from '../../src/spice/level-shifter.js';

const GEOMETRY = { l: 0.18e-6, diffusion: 0, nModel: 'nch', pModel: 'pch' };
const SIZE = {
  inverterN: 1e-6,
  bufferN: 0.5e-6,
  bufferP: 2e-6,
  bufferCap: 5e-15,
  estimate: { rise: 3e-10, fall: 2.8e-10, transition: 2.5e-10 },
};
const firstFive = (line: string) => line.split(' ').slice(0, 5).join(' ');

describe('shifterFrontLines', () => {
  it('writes the sizing comment, the input copy, the complement inverter and the skewed buffer on the core supply', () => {
    const lines = shifterFrontLines('x1', 'ls', 'p1', { invert: false, delay: 3e-10 }, 'vdd', SIZE, GEOMETRY);
    expect(lines[0]).toBe("* ls: sized for 300 ps rising, 280 ps falling, 250 ps transition at the card's nominal corner");
    expect(lines[1]).toBe('ex1 x1_in 0 p1 0 1');
    expect(lines.slice(2).map(firstFive)).toEqual([
      'mx1_i1 x1_inb x1_in 0 0',
      'mx1_i2 x1_inb x1_in vdd vdd',
      'mx1_b1 x1_mid x1_in 0 0',
      'mx1_b2 x1_mid x1_in vdd vdd',
      'cx1_mid x1_mid 0 5e-15',
      'mx1_b3 x1_set x1_mid 0 0',
      'mx1_b4 x1_set x1_mid vdd vdd',
    ]);
    // the complement's p device is twice the n
    expect(lines[3]).toContain(' pch W=2e-6 ');
  });

  it('copies VDD - v for an inverting shifter, warns of a declared delay faster than the sizing, and has no buffer capacitor at 0', () => {
    const lines = shifterFrontLines('x1', 'ls', 'p1', { invert: true, delay: 2e-10 }, 'vcore', { ...SIZE, bufferCap: 0 }, GEOMETRY);
    expect(lines[0]).toContain('; the declared 200 ps is faster than it can be sized');
    expect(lines[1]).toBe('ex1 x1_in vcore 0 p1 1');
    expect(lines).toHaveLength(8);
    expect(lines.some((line) => line.startsWith('cx1_mid'))).toBe(false);
  });
});

describe('latchCapLines', () => {
  it('puts one capacitor on each latch node, none at 0 F', () => {
    expect(latchCapLines('x1', 2e-15)).toEqual(['cx1_x x1_x 0 2e-15', 'cx1_y x1_y 0 2e-15']);
    expect(latchCapLines('x1', 0)).toEqual([]);
  });
});
