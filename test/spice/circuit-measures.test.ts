import { describe, expect, it } from 'vitest';
import { compareCircuit, meanSlope, settledOutput, simulatedLostCharge, simulatedPowers } from '../../src/spice/circuit-measures.js';
import type { CircuitDeck } from '../../src/spice/circuit-deck.js';
import { parseSimulatorOutput } from '../../src/spice/results.js';
import { circuitFigureCells, circuitRunText } from '../../src/report/confirm-text.js';
import { expectClose } from '../helpers.js';

const T = 50e-9;
/** The deck's output mean of each of its last eight periods, oldest first. */
const MEANS = ['vout_1', 'vout_2', 'vout_3', 'vout_4', 'vout_5', 'vout_6', 'vout_7', 'vout_8'];

/** The eight period means given, by name. */
function means(values: readonly number[]): Record<string, number> {
  return Object.fromEntries(MEANS.map((name, i) => [name, values[i]!]));
}

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
      power: { input: 214e-6, generator: 134e-6, output: 167e-6 },
    },
    supplies: [
      { source: 'vsupply', volts: 1.8, feeds: 'generator' },
      { source: 'vcr1', volts: 1.8, feeds: 'circuit' },
    ],
    load: { current: 50e-6, resistance: null },
    measures: [...MEANS, 'vout_pp', 'e_clock', 'qoff_0', 'qrev_0', 'q_vsupply', 'q_vcr1'],
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
  ...means([3.33391, 3.3339, 3.33389, 3.3339, 3.33391, 3.3339, 3.33391, 3.3339]),
  vout_pp: 0.0199,
  e_clock: 6e-15,
  qoff_0: 0.05e-12,
  qrev_0: -0.02e-12,
  q_vsupply: -3.7e-12,
  q_vcr1: -6.2e-12,
};

describe('meanSlope', () => {
  it('is the least-squares slope per step: exact on a line, a fraction of an alternating step, zero on a symmetric wobble', () => {
    expectClose(meanSlope([1, 1.5, 2, 2.5]), 0.5, 1e-12);
    // +-0.5 alternating over eight steps: sum (i - 3.5)(+-0.5) / sum (i - 3.5)^2 = 2 / 42.
    expectClose(meanSlope([1, 2, 1, 2, 1, 2, 1, 2]), 2 / 42, 1e-12);
    expect(meanSlope([2, 1, 1, 2])).toBe(0);
  });
});

describe('settledOutput', () => {
  // 1.98 V: the band is a tenth of 2 % of VDD, the floor 1e-5 VDD per period; a 12.8 mV ripple.
  const limits = { band: 0.1 * 0.02 * 1.98, floor: 1.98e-5, ripple: 12.8e-3 };
  const periodic = (wobble: (k: number) => number) => Array.from({ length: 8 }, (_, k) => -1.727 + wobble(k));

  it('takes a slope below the floor as settled whatever its trend', () => {
    expect(settledOutput([1, 1 + 1e-6, 1 + 2e-6, 1 + 3e-6], { band: 1e-9, floor: 1e-5, ripple: 0 })).toBe(true);
  });
  it('takes a waveform periodic within its wobble (a few uV to 0.2 mV per period, no trend) as settled, whatever the last two periods do', () => {
    // Measured (ngspice 39, negative-pump.yaml at ff/1.98V/-40C, periods 49..56 of 69 from the solver's state): the last
    // three means rise 16 then 41 uV, so the change grows and a three-period extrapolation never converges.
    expect(settledOutput([-1.726953, -1.726937, -1.726911, -1.726908, -1.726869, -1.726852, -1.726836, -1.726795], limits)).toBe(true);
    // A slow +-0.2 mV swing of 25 periods at every phase, and an alternating +-0.2 mV step.
    for (let phase = 0; phase < 25; phase++) {
      expect(
        settledOutput(
          periodic((k) => 2e-4 * Math.sin((2 * Math.PI * (k + phase)) / 25)),
          limits,
        ),
        `phase ${phase}`,
      ).toBe(true);
    }
    expect(
      settledOutput(
        periodic((k) => (k % 2 === 0 ? 2e-4 : -2e-4)),
        limits,
      ),
    ).toBe(true);
  });
  it('takes an output still rising by 2 % of its ripple a period (time constant 20 periods, 5 mV to come) as unsettled', () => {
    const rho = Math.exp(-1 / 20);
    const rising = Array.from({ length: 8 }, (_, k) => -1.727 - 5.1e-3 * rho ** (k - 7));
    expect(Math.abs(rising[7]! - rising[6]!)).toBeGreaterThan(0.02 * limits.ripple);
    expect(settledOutput(rising, limits)).toBe(false);
  });
  it('takes a steady fall, a growing change, or a creep within 1 % of a large ripple that leaves the band, as unsettled', () => {
    expect(settledOutput([1.4, 1.375, 1.35, 1.325, 1.3, 1.275, 1.25, 1.225], limits)).toBe(false);
    expect(settledOutput([1, 1.001, 1.003, 1.006], limits)).toBe(false);
    // 5 mV a period is 0.5 % of a 1 V ripple, but 35 mV over the window.
    expect(settledOutput([0, 5e-3, 10e-3, 15e-3, 20e-3, 25e-3, 30e-3, 35e-3], { ...limits, ripple: 1 })).toBe(false);
  });
  it('extrapolates a fast geometric approach (Aitken): settled when the change still to come fits the band', () => {
    // d1 = 1 mV, d2 = 0.5 mV: 0.5 mV more to come, 1 mV in all.
    expect(settledOutput([1, 1.001, 1.0015], { band: 1.01e-3, floor: 1e-6, ripple: 0 })).toBe(true);
    expect(settledOutput([1, 1.001, 1.0015], { band: 0.99e-3, floor: 1e-6, ripple: 0 })).toBe(false);
    // Measured (ngspice 39, doubler-unboosted-pump.yaml at tt/1.62V/-40C, the last 8 of 300 periods): the collapsed
    // output closing on 2.42 V, its change shrinking by 0.56 a period: 3.0 mV to come from the last 1.3 mV, band 3.24 mV.
    const collapse = [2.352223, 2.375122, 2.392218, 2.403582, 2.410566, 2.414664, 2.417002, 2.418318];
    expect(settledOutput(collapse, { band: 0.1 * 0.02 * 1.62, floor: 1.62e-5, ripple: 13.8e-3 })).toBe(true);
  });
  it('needs three means', () => {
    expect(settledOutput([1, 1], limits)).toBe(false);
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
    const c = compareCircuit(deck(), output({ ...settled, ...means(Array(8).fill(3.3072)), vout_pp: 0.0199 / 1.11 }));
    const f = Object.fromEntries(c.figures.map((x) => [x.figure, x]));
    expect(f.output!.pass).toBe(false);
    expect(f.ripple!.pass).toBe(false);
    expect(c.pass).toBe(false);
  });
  it('fails an output that has not settled even when its last mean is close', () => {
    const c = compareCircuit(deck(), output({ ...settled, ...means([3.55, 3.52, 3.49, 3.46, 3.43, 3.4, 3.37, 3.34]) }));
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
  it('fails every judged figure of a model that reached no steady state, with no model figure or power to show', () => {
    const unsettled = deck({ model: { output: null, ripple: null, efficiency: null, lostCharge: null, power: null } });
    const c = compareCircuit(unsettled, output(settled));
    for (const f of c.figures) expect(f.model).toBeNull();
    expect(c.figures.filter((f) => f.tolerance !== null).every((f) => !f.pass && f.difference === null)).toBe(true);
    expect(c.power.model).toBeNull();
    expect(c.pass).toBe(false);
    expect(circuitFigureCells('tt/1.8V/27C', c.figures[0]!)).toEqual(['tt/1.8V/27C', 'output', '-', '3.33 V', '-']);
    expect(circuitRunText(c, 'ngspice-39')).toMatch(/; model no periodic steady state; ngspice-39 rails /);
  });
});
