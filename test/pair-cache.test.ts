import { describe, expect, it } from 'vitest';
import { PairCache } from '../src/pair-cache.js';

describe('PairCache', () => {
  it('makes a value once per pair of keys and keeps pairs apart', () => {
    const cache = new PairCache<object, object, number>();
    const [a, b, c] = [{}, {}, {}];
    let made = 0;
    const make = (v: number) => () => {
      made++;
      return v;
    };
    expect(cache.get(a, b, make(1))).toBe(1);
    expect(cache.get(a, b, make(2))).toBe(1);
    expect(cache.get(a, c, make(3))).toBe(3);
    expect(cache.get(b, a, make(4))).toBe(4);
    expect(made).toBe(3);
  });
});
