import { describe, expect, it } from 'vitest';
import { circuitDeck, deckSupplies, settlePeriods, stateAt, MAX_PERIODS, MIN_PERIODS } from '../../src/spice/circuit-deck.js';
import { evaluateCorner } from '../../src/analysis/evaluate.js';
import { deckWindow } from '../../src/spice/deck.js';
import { loadResolved } from '../../src/cli/load.js';
import { design, expectClose } from '../helpers.js';

const resolve = (name: string) => loadResolved(design(name), [], {}, () => {}).resolved;
const at = (name: string, corner: string) => {
  const resolved = resolve(name);
  const c = resolved.corners.map((x) => x.corner).find((x) => x.name === corner)!;
  return { resolved, corner: c, deck: circuitDeck(resolved, c, { modelPath: 'models.lib' }) };
};

describe('deckSupplies', () => {
  it('lists DC sources to ground with a nonzero level, not sense sources or pulses', () => {
    const text = [
      'vsupply vdd 0 DC 1.8',
      'vbias1 bias1 0 DC 3.6',
      'vqs0 top qs0 DC 0',
      'vzero z 0 DC 0',
      'vclock clk 0 PULSE(0 1.8 1n 1n 1n 10n 20n)',
      'vcr1 cr1 0 DC -1.8 $ negative rail',
    ].join('\n');
    expect(deckSupplies(text)).toEqual([
      { source: 'vsupply', node: 'vdd', volts: 1.8 },
      { source: 'vbias1', node: 'bias1', volts: 3.6 },
      { source: 'vcr1', node: 'cr1', volts: -1.8 },
    ]);
  });
});

describe('stateAt', () => {
  const times = [0, 1, 3];
  const voltages = [0, 10, 2, 20, 6, 40];
  it('interpolates every node linearly between boundaries', () => {
    expect(stateAt(times, voltages, 2, 0.5)).toEqual([1, 15]);
    expect(stateAt(times, voltages, 2, 2)).toEqual([4, 30]);
  });
  it('returns the boundaries exactly at their times and clamps past the end', () => {
    expect(stateAt(times, voltages, 2, 0)).toEqual([0, 10]);
    expect(stateAt(times, voltages, 2, 3)).toEqual([6, 40]);
    expect(stateAt(times, voltages, 2, 5)).toEqual([6, 40]);
  });
});

describe('settlePeriods', () => {
  it('runs three start-up periods, within the bounds', () => {
    expect(settlePeriods(25)).toBe(75);
    expect(settlePeriods(1)).toBe(MIN_PERIODS);
    expect(settlePeriods(1000)).toBe(MAX_PERIODS);
    expect(settlePeriods(null)).toBe(MAX_PERIODS);
  });
});

describe('circuitDeck', () => {
  it('wires the doubler pump: switches on the circuit nodes behind sense sources, capacitors with the bottom plate, the load, a rail', () => {
    const { deck } = at('doubler-pump', 'tt/1.8V/27C');
    const lines = deck.text.split('\n');
    expect(lines).toContain('c_c_fly cn_top cn_bottom 1e-11 $ c_fly');
    expect(lines).toContain('c_c_fly_bp cn_bottom 0 5e-13 $ c_fly: bottom plate');
    expect(lines).toContain('c_c_out cn_out 0 1e-10 $ c_out');
    expect(lines).toContain('vcr1 cr1 0 DC 1.8');
    expect(lines).toContain('vqs3 cn_top qs3 DC 0 $ s_out: current sense');
    expect(lines.some((l) => /^msw3_0 qs3 ls3_0 cn_out bias1 pch /.test(l))).toBe(true);
    expect(lines).toContain('iload cn_out 0 DC 5e-5');
    expectClose(deck.load.current, 50e-6, 1e-12);
    expect(deck.load.resistance).toBeNull();
    expect(deck.supplies.map((s) => [s.source, s.feeds])).toEqual([
      ['vsupply', 'generator'],
      ['vbias1', 'generator'],
      ['vcr1', 'circuit'],
    ]);
    // No timing measurements or R_on benches: the generator's own deck confirms those.
    expect(deck.text).not.toMatch(/\.meas tran (dead|gap|width|sw|i_ron)/);
  });

  it("starts every circuit node at the solver's steady state and measures the last eight periods of 3x the start-up", () => {
    const { resolved, corner, deck } = at('doubler-pump', 'tt/1.8V/27C');
    const circuit = evaluateCorner(resolved, corner).circuit!;
    expect(deck.periods).toBe(3 * circuit.startupCycles!);
    const T = deck.period;
    expectClose(deck.to, deckWindow(T, corner.duty).start + deck.periods * T, 1e-12);
    expectClose(deck.from, deck.to - T, 1e-12);
    const ic = new Map([...deck.text.matchAll(/^\.ic v\((\w+)\)=(\S+)$/gm)].map((m) => [m[1]!, Number(m[2])]));
    expect([...ic.keys()].sort()).toEqual(['cn_bottom', 'cn_out', 'cn_top']);
    // The output starts at the solver's level within its ripple; the bottom plate at a rail.
    expect(Math.abs(ic.get('cn_out')! - circuit.output)).toBeLessThan(circuit.ripple);
    expect([0, 1.8].some((v) => Math.abs(ic.get('cn_bottom')! - v) < 0.01)).toBe(true);
    // The output mean of each of the last eight periods, the last one from deck.from.
    expect(deck.measures.slice(0, 9)).toEqual(['vout_1', 'vout_2', 'vout_3', 'vout_4', 'vout_5', 'vout_6', 'vout_7', 'vout_8', 'vout_pp']);
    expect(deck.text).toContain(
      `.meas tran vout_8 AVG v(cn_out) FROM=${Number(deck.from.toPrecision(6)).toExponential().replace('e+', 'e')}`,
    );
    expect(deck.model.output).toBe(circuit.output);
    expect(deck.model.efficiency).toBe(circuit.efficiency);
  });

  it("writes diodes as the solver's piecewise-linear law behind a sense source and measures their reverse charge", () => {
    const { deck } = at('doubler-diode-pump', 'tt/1.8V/27C');
    expect(deck.text).toContain('vqd0 cr1 qd0 DC 0 $ d_chg: current sense');
    expect(deck.text).toContain('bd0 qd0 cn_top I=1e-12*v(qd0,cn_top)+0.005*max(v(qd0,cn_top)-0.6,0) $ d_chg: piecewise linear');
    expect(deck.measures).toEqual(expect.arrayContaining(['qrev_0', 'qrev_1', 'qoff_0', 'qoff_1']));
  });

  it('refuses a design without a circuit section, naming it', () => {
    const resolved = resolve('doubler');
    expect(() => circuitDeck(resolved, resolved.corners[0]!.corner, { modelPath: 'm.lib' })).toThrow(/circuit/);
  });
});
