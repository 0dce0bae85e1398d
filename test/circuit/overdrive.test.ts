import { describe, expect, it } from 'vitest';
import { capacitanceMatrix, invertCapacitance } from '../../src/circuit/capacitance.js';
import { onConductanceOf } from '../../src/circuit/corner-model.js';
import type { CircuitModel } from '../../src/circuit/model.js';
import { solveDriven } from '../../src/circuit/overdrive.js';
import { loadResolved } from '../../src/cli/load.js';
import { devicesAtCorner } from '../../src/process/device.js';
import { onResistanceAt } from '../../src/switches/conduction.js';
import { design, expectClose } from '../helpers.js';
import { idealDoubler } from './ideal.js';

const { resolved } = loadResolved(design('doubler-pump'), [], {}, () => {});
const tt = resolved.corners.find((c) => c.corner.name === 'tt/1.8V/27C')!.corner;
const devices = devicesAtCorner(resolved.card, tt);
const VDD = devices.vdd;
// s_gnd: an nmos whose gate swings 0..VDD, body at 0 V.
const plan = resolved.switches.find((p) => p.name === 's_gnd')!;
const LEAK = 1e-9;

/** One node x (1 pF to ground) tied by s_gnd, gate on all period, to the rail at `rail` V; rails 0 V and `rail`. */
function tied(rail: number): CircuitModel {
  const inverseCapacitance = invertCapacitance(capacitanceMatrix(1, [{ a: 0, b: 1, value: 1e-12 }]), 1)!;
  const onConductance = onConductanceOf(plan, { devices }, undefined);
  return {
    nodes: ['x'],
    rails: Float64Array.from([0, rail]),
    inverseCapacitance,
    intervals: [
      { duration: 25e-9, on: Uint8Array.of(1) },
      { duration: 25e-9, on: Uint8Array.of(1) },
    ],
    start: 0,
    // gOn, the first guess, says it conducts (100 ohm)
    switches: [{ name: 's_gnd', a: 2, b: 0, gOn: 1e-2, gOff: LEAK, onConductance }],
    channels: [],
    diodes: [],
    pairs: [],
    output: 0,
    loadCurrent: 0,
    loadConductance: 0,
  };
}

describe('solveDriven', () => {
  it('solveDriven turns off an nmos whose gate is at VDD on a node at 2 VDD: no overdrive, only its leak conducts', () => {
    const s = solveDriven(tied(2 * VDD));
    expect(s.state.method).toBe('direct');
    expect(s.rounds).toBe(2);
    for (const iv of s.solver.model.intervals) expect(iv.g![0]).toBe(0);
    // nothing else loads x: the leak holds it at the rail
    expectClose(s.trace.outputMean, 2 * VDD, 1e-9);
  });

  it("solveDriven gives the same nmos on a node at 0 V the switch physics' R_on at a 0 V source", () => {
    const s = solveDriven(tied(0));
    expect(s.state.method).toBe('direct');
    const ron = onResistanceAt(plan, devices, 0);
    expect(ron).toBeGreaterThan(10);
    expect(ron).toBeLessThan(1000);
    for (const iv of s.solver.model.intervals) expectClose(1 / iv.g![0]!, ron, 1e-12);
  });

  it('solveDriven of an ideal doubler whose switches keep 1 ohm at any voltage meets 2 VDD - I/(f C) within 1 % (slow-switching limit, Seeman & Sanders 2008)', () => {
    const f = 20e6;
    const c = 10e-12;
    const i = 100e-6;
    const base = idealDoubler({ vdd: VDD, frequency: f, c, cout: 1e-9, ron: 50 });
    const model = { ...base, loadCurrent: i, switches: base.switches.map((s) => ({ ...s, onConductance: () => 1 })) };
    const s = solveDriven(model);
    expect(s.state.method).toBe('direct');
    expect(s.rounds).toBe(2);
    expectClose(s.trace.outputMean, 2 * VDD - i / (f * c), 0.01);
  });
});
