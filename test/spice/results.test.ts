import { describe, expect, it } from 'vitest';
import { parseSimulatorOutput } from '../../src/spice/results.js';

// Lines as ngspice-39 prints them in batch mode (captured from runs of generated decks, one with
// a measurement made impossible).
const OUTPUT = `
Circuit: * phasegap testbench

dead_1              =  1.746601e-09 targ=  8.508189e-08 trig=  8.333529e-08
width_1             =  2.318937e-08 targ=  8.333529e-08 trig=  6.014592e-08
q3                  =  -5.25829e-15 from=  0.00000e+00 to=  2.20000e-09
dead_2 = failed
Error: measure  gap_1  trig(TRIG) : out of interval
 .meas tran gap_1 trig v(p1) val=5 fall=1 td=8e-8 targ v(p2) val=0.9 rise=1 td=8e-8 failed!
`;

describe('parseSimulatorOutput', () => {
  it('reads values, negative values and failures by name; a failed measurement is not a deck error', () => {
    const r = parseSimulatorOutput(OUTPUT, ['dead_1', 'width_1', 'q3', 'dead_2', 'gap_1', 'sw_1']);
    expect(r.values.get('dead_1')).toBe(1.746601e-9);
    expect(r.values.get('width_1')).toBe(2.318937e-8);
    expect(r.values.get('q3')).toBe(-5.25829e-15);
    expect(r.values.get('dead_2')).toBeNull();
    expect(r.values.get('gap_1')).toBeNull();
    expect(r.values.get('sw_1')).toBeNull();
    expect(r.errors).toEqual([]);
  });

  it('keeps error lines other than failed measurements', () => {
    const r = parseSimulatorOutput('Error: unknown subckt: x1 a b nand9\ndead_1 = 1e-9 targ= 2 trig= 1', ['dead_1']);
    expect(r.errors).toEqual(['Error: unknown subckt: x1 a b nand9']);
    expect(r.values.get('dead_1')).toBe(1e-9);
  });
});
