/**
 * A single n switch sampling a rail onto a capacitor, built by hand for the circuit solver: the
 * circuit of test/spice/decks/nmos-sample.cir.
 */
import type { CircuitModel, ModelGateCharge } from '../../src/circuit/model.js';
import { PeriodSolver } from '../../src/circuit/period-solver.js';
import { tracePeriod } from '../../src/circuit/trace.js';
import { bodyThreshold } from '../../src/switches/physics.js';

/**
 * One n switch (W 10 um, L 0.18 um) from a 0.5 V rail to a 1 pF capacitor, gate 0 -> 1.8 V in 100 ps,
 * on 5 ns of a 20 ns period: test/spice/decks/nmos-sample.cir. Device values from the generic180 card
 * (fixtures/processes/generic180.yaml at tt, 27 C): vth0 0.45 V, gamma 0.45, 2phiF 0.85 V,
 * k' 194.6 uA/V^2, C_ox 8.42 fF/um^2, C_ov 0.2 fF/um.
 */
export const SAMPLE = { w: 10e-6, l: 0.18e-6, cox: 8.42e-3, cov: 2e-10, kprime: 194.6e-6, hold: 1e-12, input: 0.5, vdd: 1.8 };

export function samplingModel(): CircuitModel {
  const { w, l, cox, cov, kprime, hold, input, vdd } = SAMPLE;
  const charge: ModelGateCharge = {
    switchIndex: 0,
    sourceGuess: input,
    devices: [
      {
        polarity: 'n',
        channel: cox * w * l,
        overlap: cov * w,
        gateOn: vdd,
        gateOff: 0,
        onTransition: 100e-12,
        offTransition: 100e-12,
        beta: (kprime * w) / l,
        threshold: (source) => bodyThreshold(0.45, 0.45, 0.85, source),
      },
    ],
  };
  return {
    nodes: ['hold'],
    rails: Float64Array.from([0, input]),
    // The overlap capacitance to the gate (held at 0 V while the switch is off) loads the node too.
    inverseCapacitance: Float64Array.from([1 / (hold + cov * w)]),
    intervals: [
      { duration: 5e-9, on: Uint8Array.from([1]) },
      { duration: 15e-9, on: Uint8Array.from([0]) },
    ],
    start: 0,
    switches: [{ name: 'm1', a: 0, b: 2, gOn: 1 / 300, gOff: 0 }],
    channels: [],
    diodes: [],
    gateCharges: [charge],
    pairs: [],
    output: 0,
    loadCurrent: 0,
    loadConductance: 0,
  };
}

/** The held voltage less the input once the switch is off, from the solver's steady state, V. */
export function modelPedestal(model: CircuitModel): number {
  const solver = new PeriodSolver(model);
  const state = solver.steadyState();
  const trace = tracePeriod(solver, state.x0, state.segments);
  const k = solver.edges.findIndex((e) => e !== null);
  return trace.voltages[k + 1]! - SAMPLE.input;
}
