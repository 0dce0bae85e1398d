import { describe, expect, it } from 'vitest';
import { cli, design } from '../helpers.js';

const errors = (...set: string[]) => {
  const run = cli('check', design('doubler'), ...set.flatMap((s) => ['--set', s]));
  expect(run.code).toBe(2);
  return run.stderr;
};

describe('parseWith messages', () => {
  it('suggests the known key an unknown one most likely meant', () => {
    expect(errors('clock.frequncy=2MHz')).toContain('clock: unknown key "frequncy" (did you mean "frequency"?); allowed keys here are frequency, duty, dutyTolerance, transition');
    expect(errors('clock.frequncy=2MHz', 'clock.trnsition=1ps', 'clock.zzz=1'))
      .toContain('unknown keys "frequncy", "trnsition", "zzz" (did you mean "frequency" for "frequncy", "transition" for "trnsition"?)');
    expect(errors('clock.zzz=1')).not.toContain('did you mean');
  });

  it('says what a missing field allows: the choices, or the field\'s own description', () => {
    const text = errors('switches[4]={name: x}');
    expect(text).toContain('switches[4].type: is required; allowed: "nmos", "pmos", "tgate"');
    expect(text).toContain('switches[4].w: is required: Width (the n device of a tgate) (m; a number in SI units or a string like "0.18um")');
    expect(text).toContain('switches[4].gate: is required: Net that drives the gate');
    expect(text).not.toMatch(/is required\s*$/m);
  });
});
