import { describe, expect, it } from 'vitest';
import { wrapTime } from '../../src/measure/wrap-time.js';
import { expectClose } from '../helpers.js';

const T = 10e-9;

describe('wrapTime', () => {
  it('wraps negative and large times into [0, m)', () => {
    expectClose(wrapTime(-1e-9, T), 9e-9, 1e-12);
    expectClose(wrapTime(23e-9, T), 3e-9, 1e-12);
  });

  it('keeps a time already inside the period bit for bit', () => {
    for (const t of [0, 1e-30, 3.3e-9, T - 1e-24]) expect(wrapTime(t, T)).toBe(t);
  });
});
