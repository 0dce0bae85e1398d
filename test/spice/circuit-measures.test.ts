import { describe, expect, it } from 'vitest';
import { compareCircuit, settledOutput, simulatedLostCharge, simulatedPowers } from '../../src/spice/circuit-measures.js';
import type { CircuitDeck } from '../../src/spice/circuit-deck.js';
import { parseSimulatorOutput } from '../../src/spice/results.js';
import { expectClose } from '../helpers.js';

const T = 50e-9;

/** A deck as data: 1.8 V, one circuit rail, the generator supply, a 50 uA load. */
function deck(over: Partial<CircuitDeck> = {}): CircuitDeck {
  return {
    text: '',
    corner: { name: 'tt/1.8V/27C', process: 'tt', vdd: 1.8, temperature: 27, duty: 0.5 },
    vdd: 1.8,
    period: T,
    periods: 75,
    from: 0,
    to: T,
    model: {
      output: 3.345,
      ripple: 0.0199,
      efficiency: 0.48,
      lostCharge: 0,
      inputPower: 214e-6,
      generatorPower: 134e-6,
      outputPower: 167e-6,
    },
    supplies: [
      { source: 'vsupply', volts: 1.8, feeds: 'generator' },
      { source: 'vcr1', volts: 1.8, feeds: 'circuit' },
    ],
    load: { current: 50e-6, resistance: null },
    measures: ['vout_1', 'vout_2', 'vout_3', 'vout_pp', 'e_clock', 'qoff_0', 'qrev_0', 'q_vsupply', 'q_vcr1'],
    ...over,
  };
}

/** ngspice's batch output for the measurements (the format results.ts reads). */
function output(values: Record<string, number | 'failed'>) {
  const text = Object.entries(values)
    .map(([k, v]) => (v === 'failed' ? `${k} = failed` : `${k}                  =  ${v.toExponential(6)} from=  0 to=  5e-8`))
    .join('\n');
  return parseSimulatorOutput(text, deck().measures);
}

const settled = {
  vout_1: 3.3339,
  vout_2: 3.33391,
  vout_3: 3.3339,
  vout_pp: 0.0199,
  e_clock: 6e-15,
  qoff_0: 0.05e-12,
  qrev_0: -0.02e-12,
  q_vsupply: -3.7e-12,
  q_vcr1: -6.2e-12,
};

describe('settledOutput', () => {
  it('takes a change below the floor as settled whatever its trend', () => {
    expect(settledOutput([1, 1 + 2e-6, 1 + 3e-6], 1e-3, 1e-5)).toBe(true);
  });
  it('extrapolates a geometric approach (Aitken): settled when the change still to come fits the band', () => {
    // d1 = 1 mV, d2 = 0.5 mV: 0.5 mV more to come, 1 mV in all.
    expect(settledOutput([1, 1.001, 1.0015], 1.01e-3, 1e-6)).toBe(true);
    expect(settledOutput([1, 1.001, 1.0015], 0.99e-3, 1e-6)).toBe(false);
  });
  it('takes a steady fall or a growing change as unsettled', () => {
    expect(settledOutput([1.4, 1.375, 1.35], 1, 1e-6)).toBe(false);
    expect(settledOutput([1, 1.001, 1.003], 1, 1e-6)).toBe(false);
  });
});

describe('simulatedPowers', () => {
  it("adds volts times delivered charge per source (the level shifters' rails among them) and the clock energy", () => {
    const v = output(settled).values;
    const p = simulatedPowers(deck(), (n) => v.get(n) ?? null)!;
    expectClose(p.input, (1.8 * 6.2e-12) / T, 1e-9);
    expectClose(p.generator, (1.8 * 3.7e-12 + 6e-15) / T, 1e-9);
    expectClose(p.output, 50e-6 * 3.3339, 1e-9);
  });
  it("takes a resistive load's power from the rms of the output", () => {
    const d = deck({ load: { current: 0, resistance: 20e3 }, measures: [...deck().measures, 'vout_rms'] });
    const v = parseSimulatorOutput(
      `vout_rms = 3.3 from= 0 to= 5e-8\n${Object.entries(settled)
        .map(([k, x]) => `${k} = ${x}`)
        .join('\n')}`,
      d.measures,
    ).values;
    expectClose(simulatedPowers(d, (n) => v.get(n) ?? null)!.output, (3.3 * 3.3) / 20e3, 1e-9);
  });
  it('is null when a supply was not measured', () => {
    const v = output({ ...settled, q_vcr1: 'failed' }).values;
    expect(simulatedPowers(deck(), (n) => v.get(n) ?? null)).toBeNull();
  });
});

describe('simulatedLostCharge', () => {
  it('adds the magnitudes of the off-switch and reverse-diode charges', () => {
    const v = output(settled).values;
    expectClose(simulatedLostCharge(deck(), (n) => v.get(n) ?? null)!, 0.07e-12, 1e-9);
  });
});

describe('compareCircuit', () => {
  it('passes figures within tolerance: output against 2 % of VDD, ripple and efficiency relative to the simulator', () => {
    const c = compareCircuit(deck(), output(settled));
    expect(c.settled).toBe(true);
    const f = Object.fromEntries(c.figures.map((x) => [x.figure, x]));
    expectClose(f.output!.difference!, (3.345 - 3.3339) / 1.8, 1e-6);
    expectClose(f.ripple!.difference!, 0, 1e-9, 'abs');
    const eff = (50e-6 * 3.3339) / ((1.8 * 6.2e-12 + 1.8 * 3.7e-12 + 6e-15) / T);
    expectClose(f.efficiency!.simulator!, eff, 1e-9);
    expectClose(f.efficiency!.difference!, (0.48 - eff) / eff, 1e-9);
    expect(f['lost charge']!.tolerance).toBeNull();
    expect(c.pass).toBe(true);
  });
  it('fails an output 2.1 % of VDD away, and a ripple 11 % away', () => {
    const c = compareCircuit(deck(), output({ ...settled, vout_1: 3.3072, vout_2: 3.3072, vout_3: 3.3072, vout_pp: 0.0199 / 1.11 }));
    const f = Object.fromEntries(c.figures.map((x) => [x.figure, x]));
    expect(f.output!.pass).toBe(false);
    expect(f.ripple!.pass).toBe(false);
    expect(c.pass).toBe(false);
  });
  it('fails an output that has not settled even when its last mean is close', () => {
    const c = compareCircuit(deck(), output({ ...settled, vout_1: 3.4, vout_2: 3.37, vout_3: 3.34 }));
    expect(c.settled).toBe(false);
    expectClose(c.drift!, -0.03, 1e-9);
    expect(c.figures.find((x) => x.figure === 'output')!.pass).toBe(false);
    expect(c.pass).toBe(false);
  });
  it('reports a figure ngspice could not measure as not measured and failing', () => {
    const c = compareCircuit(deck(), output({ ...settled, vout_pp: 'failed' }));
    const ripple = c.figures.find((x) => x.figure === 'ripple')!;
    expect(ripple.simulator).toBeNull();
    expect(ripple.pass).toBe(false);
  });
});
