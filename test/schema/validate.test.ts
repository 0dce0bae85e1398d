import { describe, expect, it } from 'vitest';
import * as z from 'zod';
import { parseWith } from '../../src/schema/validate.js';
import { cli, design, inputIssues, resolveYaml } from '../helpers.js';

const errors = (...set: string[]) => {
  const run = cli('check', design('doubler'), ...set.flatMap((s) => ['--set', s]));
  expect(run.code).toBe(2);
  return run.stderr;
};

describe('parseWith messages', () => {
  it('suggests the known key an unknown one most likely meant', () => {
    expect(errors('clock.frequncy=2MHz')).toContain(
      'clock: unknown key "frequncy" (did you mean "frequency"?); allowed keys here are frequency, duty, dutyTolerance, transition',
    );
    expect(errors('clock.frequncy=2MHz', 'clock.trnsition=1ps', 'clock.zzz=1')).toContain(
      'unknown keys "frequncy", "trnsition", "zzz" (did you mean "frequency" for "frequncy", "transition" for "trnsition"?)',
    );
    expect(errors('clock.zzz=1')).not.toContain('did you mean');
  });

  it("says what a missing field allows: the choices, or the field's own description", () => {
    const text = errors('switches[4]={name: x}');
    expect(text).toContain('switches[4].type: is required; allowed: "nmos", "pmos", "tgate"');
    expect(text).toContain(
      'switches[4].w: is required: Width (the n device of a tgate) (m; a number in SI units or a string like "0.18um")',
    );
    expect(text).toContain('switches[4].gate: is required: Net that drives the gate');
    expect(text).not.toMatch(/is required\s*$/m);
  });
});

describe('parseWith issue codes', () => {
  const schema = z
    .object({ a: z.number().min(0), kind: z.enum(['x', 'y']).optional(), list: z.array(z.number()).max(2).optional() })
    .strict();
  const codes = (raw: unknown) => inputIssues(() => parseWith(schema, raw, ['top'])).map((i) => [i.code, i.path]);

  it('gives each kind of schema problem its code and the field path', () => {
    expect(codes({ a: -1 })).toEqual([['value.out-of-range', ['top', 'a']]]);
    expect(codes({ a: 'one' })).toEqual([['value.wrong-type', ['top', 'a']]]);
    expect(codes({})).toEqual([['field.required', ['top', 'a']]]);
    expect(codes({ a: 1, b: 2 })).toEqual([['field.unknown', ['top']]]);
    expect(codes({ a: 1, kind: 'z' })).toEqual([['value.not-allowed', ['top', 'kind']]]);
    expect(codes({ a: 1, list: [1, 2, 3] })).toEqual([['value.too-many', ['top', 'list']]]);
  });
});

describe('physics issue codes', () => {
  it("gives a supply below a device threshold physics.device-off at that corner's vdd", () => {
    const issues = inputIssues(() =>
      resolveYaml(`
name: t
process: unused
clock: { frequency: 20MHz, transition: 200ps }
generator: { template: nand, stages: 4, stageLoad: 30fF, buffer: [2, 6, 18] }
corners: { process: [tt], vdd: [1.8V, 0.3V], temperature: [27] }
`),
    );
    expect(issues.map((i) => [i.code, i.path])).toEqual([['physics.device-off', ['corners', 'vdd', 1]]]);
  });
});
