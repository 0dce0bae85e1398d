import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { parse } from 'yaml';
import { designSchema } from '../../src/schema/design.js';
import { parseWith } from '../../src/schema/validate.js';
import { InputError, type InputIssue } from '../../src/errors.js';
import { design } from '../helpers.js';

// biome-ignore lint/suspicious/noExplicitAny: the tests edit arbitrary parsed YAML by path
const base = () => parse(readFileSync(design('doubler-pump'), 'utf8')) as Record<string, any>;

function issues(raw: unknown): InputIssue[] {
  try {
    parseWith(designSchema, raw);
  } catch (e) {
    if (e instanceof InputError) return [...e.issues];
    throw e;
  }
  return [];
}

describe('circuitSchema', () => {
  it('parseWith accepts the demo pump and reads its load range and requirements', () => {
    const d = parseWith(designSchema, base());
    const load = d.circuit!.load as { current: { min: number; max: number } };
    expect(load.current.min).toBeCloseTo(10e-6, 12);
    expect(load.current.max).toBeCloseTo(50e-6, 12);
    expect(d.circuit!.capacitors[0]!.bottomPlate).toBe(0.05);
    expect(d.circuit!.requirements.lostCharge!.max).toBeCloseTo(1e-12, 20);
  });

  it('parseWith names an unknown capacitor terminal with its path and the allowed nodes', () => {
    const raw = base();
    raw.circuit.capacitors[0].between[1] = 'botom';
    const [issue] = issues(raw);
    expect(issue!.code).toBe('reference.unknown');
    expect(issue!.path).toEqual(['circuit', 'capacitors', 0, 'between', 1]);
    expect(issue!.value).toBe('"botom"');
    expect(issue!.expected).toMatch(/bottom, top, out/);
  });

  it('parseWith refuses an output that is a rail', () => {
    const raw = base();
    raw.circuit.output = 'vdd';
    expect(issues(raw).map((i) => i.path)).toEqual([['circuit', 'output']]);
  });

  it('parseWith refuses a charge without its unit, naming the form allowed', () => {
    const raw = base();
    raw.circuit.requirements.lostCharge.max = '1p';
    const [issue] = issues(raw);
    expect(issue!.path).toEqual(['circuit', 'requirements', 'lostCharge', 'max']);
    expect(issue!.expected).toMatch(/"20pC"/);
  });

  it('parseWith requires terminals on every switch when there is a circuit', () => {
    const raw = base();
    delete raw.switches[0].terminals;
    expect(issues(raw).map((i) => [i.code, i.path])).toContainEqual(['field.required', ['switches', 0, 'terminals']]);
  });

  it('parseWith refuses a capacitor name used twice as value.duplicate at the second', () => {
    const raw = base();
    raw.circuit.capacitors[1].name = 'c_fly';
    expect(issues(raw).map((i) => [i.code, i.path, i.value])).toEqual([
      ['value.duplicate', ['circuit', 'capacitors', 1, 'name'], '"c_fly"'],
    ]);
  });
});
