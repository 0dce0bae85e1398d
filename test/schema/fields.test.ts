import { describe, it, expect } from 'vitest';
import type * as z from 'zod';
import { PLAUSIBLE, TEMPERATURE_RANGE, quantity, ratio, temperature } from '../../src/schema/fields.js';
import { parseQuantity, parseTemperature } from '../../src/units/quantity.js';

const messages = (schema: z.ZodType, input: unknown): string[] => {
  const r = schema.safeParse(input);
  if (r.success) return [];
  return r.error.issues.flatMap((i) => (i.code === 'invalid_union' ? i.errors.flat().map((e) => e.message) : [i.message]));
};

describe('parseQuantity and parseTemperature', () => {
  it.each(['1e400', '1e400Hz', '-1e309', '1e300GHz'])('refuse %s, which reads as Infinity', (text) => {
    const r = parseQuantity(text, 'Hz');
    expect(r.ok).toBe(false);
    expect(r.ok ? '' : r.allowed).toContain('is not a finite number');
  });

  it('refuses numeric Infinity and NaN, and a temperature beyond the double range', () => {
    expect(parseQuantity(Infinity, 's').ok).toBe(false);
    expect(parseQuantity(NaN, 's').ok).toBe(false);
    expect(parseTemperature('1e400C').ok).toBe(false);
    expect(parseTemperature(-Infinity).ok).toBe(false);
  });
});

describe('quantity', () => {
  it('refuses a number beyond the double range in words, as a string and as a YAML number', () => {
    const f = quantity('Hz', 'f', { above: 0 });
    expect(messages(f, '1e400')).toEqual(['is not a finite number; a quantity must lie within about ±1.8e308 in SI units']);
    expect(messages(f, Infinity)[0]).toContain('is not a finite number');
  });

  it("adds the unit's plausible ceiling where the field sets none, and a floor to signed fields", () => {
    const c = quantity('F', 'c', { atLeast: 0 });
    expect(c.parse('1mF')).toBeCloseTo(1e-3, 15);
    expect(messages(c, '2mF')).toEqual(['is out of range; it must be at least 0 F and at most 0.001 F']);
    const v = quantity('V', 'shift');
    expect(v.parse(-999)).toBe(-999);
    expect(messages(v, -1001)).toEqual(['is out of range; it must be at least -1000 V and at most 1000 V']);
    expect(PLAUSIBLE.m).toBe(1);
  });

  it("keeps a field's own upper bound and writes large bounds with an SI prefix", () => {
    const f = quantity('Hz', 'f', { atLeast: 1, atMost: 100e9 });
    expect(messages(f, '101GHz')).toEqual(['is out of range; it must be at least 1 Hz and at most 100 GHz']);
    expect(f.parse('100GHz')).toBe(100e9);
  });
});

describe('temperature', () => {
  const t = temperature('T');
  it('accepts the ends of the range and refuses what lies outside', () => {
    expect(t.parse(TEMPERATURE_RANGE.min)).toBe(-60);
    expect(t.parse('200C')).toBe(200);
    for (const bad of [-60.5, '-273C', 201, '1e400']) expect(messages(t, bad)).toHaveLength(1);
    expect(messages(t, -273)).toEqual(['is outside the temperatures the device models cover; write degrees Celsius from -60 to 200']);
  });
});

describe('ratio', () => {
  it('refuses Infinity and NaN as well as values out of range', () => {
    const r = ratio('duty', { above: 0, below: 1 });
    expect(r.parse(0.5)).toBe(0.5);
    expect(r.safeParse(Infinity).success).toBe(false);
    expect(r.safeParse(NaN).success).toBe(false);
    expect(messages(r, 1)).toEqual(['is out of range; it must be greater than 0 and less than 1']);
  });
});
