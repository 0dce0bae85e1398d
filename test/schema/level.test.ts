import { describe, expect, it } from 'vitest';
import { parseLevel } from '../../src/schema/level.js';

describe('parseLevel', () => {
  it.each([
    ['vdd', { scale: 1, offset: 0 }],
    ['2vdd', { scale: 2, offset: 0 }],
    ['-vdd', { scale: -1, offset: 0 }],
    ['-0.8vdd', { scale: -0.8, offset: 0 }],
    ['-0.5*vdd', { scale: -0.5, offset: 0 }],
    ['- 2 vdd + 100mV', { scale: -2, offset: 0.1 }],
    ['-1.8V', { scale: 0, offset: -1.8 }],
  ])('parseLevel(%j) reads a level below ground as a negative multiple of the supply', (text, level) => {
    const parsed = parseLevel(text)!;
    expect(parsed.scale).toBeCloseTo(level.scale, 12);
    expect(parsed.offset).toBeCloseTo(level.offset, 12);
  });

  it.each(['--vdd', '-', 'vdd-', '-x vdd'])('parseLevel(%j) is not a level', (text) => {
    expect(parseLevel(text)).toBeNull();
  });
});
