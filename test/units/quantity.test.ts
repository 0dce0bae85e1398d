import { describe, it, expect } from 'vitest';
import { parseQuantity, parseTemperature } from '../../src/units/quantity.js';
import { expectClose } from '../helpers.js';

describe('parseQuantity', () => {
  it.each([
    ['20MHz', 'Hz', 20e6],
    ['85ps', 's', 85e-12],
    ['4.7pF', 'F', 4.7e-12],
    ['0.18um', 'm', 0.18e-6],
    ['1.8V', 'V', 1.8],
    ['60mV', 'V', 0.06],
    ['1e-9', 's', 1e-9],
    [' 2 ns ', 's', 2e-9],
  ] as const)('reads %s as %d in SI', (text, unit, value) => {
    const r = parseQuantity(text, unit);
    expect(r.ok).toBe(true);
    if (r.ok) expectClose(r.value, value, 1e-12);
  });

  it.each([
    ['20 MHzz', 'Hz'],
    ['20M', 'Hz'],
    ['fast', 's'],
    ['4.7pH', 'F'],
  ] as const)('rejects %s with the unit named', (text, unit) => {
    const r = parseQuantity(text, unit);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.allowed).toContain(unit);
  });

  it('passes plain numbers through and refuses NaN', () => {
    expect(parseQuantity(3.3, 'V')).toEqual({ ok: true, value: 3.3 });
    expect(parseQuantity(Number.NaN, 'V').ok).toBe(false);
  });
});

describe('parseTemperature', () => {
  it.each([
    [125, 125],
    ['-40C', -40],
    ['27 °C', 27],
    ['85degC', 85],
  ] as const)('reads %s', (input, celsius) => {
    expect(parseTemperature(input)).toEqual({ ok: true, value: celsius });
  });
  it('rejects a kelvin value', () => expect(parseTemperature('300K').ok).toBe(false));
});
