import { describe, expect, it } from 'vitest';
import { CornerEvaluator } from '../../src/analysis/evaluate.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { loadDesign } from '../../src/cli/load.js';
import { cornerModel } from '../../src/circuit/corner-model.js';
import { loadSign, scaleCapacitance, withLoad } from '../../src/circuit/figures.js';
import { buildNetwork } from '../../src/circuit/network.js';
import { fixedConductances, solveDriven } from '../../src/circuit/overdrive.js';
import { PeriodSolver } from '../../src/circuit/period-solver.js';
import { CycleIndex } from '../../src/measure/phases.js';
import { devicesAtCorner } from '../../src/process/device.js';
import { design } from '../helpers.js';

/** The diode pump's loaded model at ss/1.8V/27C, where its fast-switching model from rest runs thousands of periods. */
function dicksonAtSlowCorner() {
  const { design: d, card } = loadDesign(design('dickson-pump'));
  const resolved = resolveDesign(d, card);
  const { corner } = resolved.corners.find(({ corner }) => corner.name === 'ss/1.8V/27C')!;
  const r = new CornerEvaluator(resolved, { borrowScratch: false, warmStart: false, circuit: 'none' }).evaluate(corner);
  const network = buildNetwork(resolved.design, resolved.switches, resolved.card);
  const cycles = new CycleIndex(r.simulation, resolved.netlist);
  const model = cornerModel(network, resolved.switches, r.switches, cycles, devicesAtCorner(card, corner), 1 / d.clock.frequency);
  const half = { current: network.load.current / 2, conductance: network.load.conductance / 2 };
  return { model, load: network.load, half, sign: loadSign(model, network.load) };
}

describe('PeriodSolver.steadyState', () => {
  const { model, load, half, sign } = dicksonAtSlowCorner();
  const loaded = solveDriven(withLoad(model, load, sign));
  // The fast-switching limit's model: every capacitor a thousand times larger (figures.ts).
  const fast = withLoad(scaleCapacitance(fixedConductances(loaded.solver.model), 1e3), half, sign);

  it('near the loaded steady state solves the fast-switching model directly, without running a period, to a period-invariant state', () => {
    const solver = new PeriodSolver(fast);
    let periods = 0;
    const run = solver.runPeriod.bind(solver);
    solver.runPeriod = (x, segments) => {
      periods++;
      run(x, segments);
    };
    const near = solver.steadyState({ near: loaded.state });
    expect(loaded.state.method).toBe('direct');
    expect(near.method).toBe('direct');
    expect(periods).toBe(0);
    // From rest the same model takes over 10,000 periods here (measured) to reach this state.
    const x = Float64Array.from(near.x0);
    run(
      x,
      near.segments.map((s) => Uint8Array.from(s)),
    );
    for (let i = 0; i < x.length; i++) expect(Math.abs(x[i]! - near.x0[i]!)).toBeLessThan(1e-9);
  });

  it('near a steady state of another substep count falls back to the search from rest', () => {
    const heavy = withLoad(model, load, sign);
    const fromRest = new PeriodSolver(heavy).steadyState();
    const other = { x0: loaded.state.x0, segments: loaded.state.segments.slice(1) };
    const near = new PeriodSolver(heavy).steadyState({ near: other });
    expect(near.method).toBe('direct');
    expect(Array.from(near.x0)).toEqual(Array.from(fromRest.x0));
    expect(near.rounds).toBe(fromRest.rounds);
  });
});
