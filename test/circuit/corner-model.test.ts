import { describe, expect, it } from 'vitest';
import { CornerEvaluator } from '../../src/analysis/evaluate.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { shifterSizes } from '../../src/analysis/shifter-sizes.js';
import { loadDesign } from '../../src/cli/load.js';
import { cornerModel } from '../../src/circuit/corner-model.js';
import { buildNetwork } from '../../src/circuit/network.js';
import { CycleIndex } from '../../src/measure/phases.js';
import { devicesAtCorner } from '../../src/process/device.js';
import { shifterGateTiming } from '../../src/switches/shifter-timing.js';
import { design } from '../helpers.js';

/** doubler-pump's circuit model at a corner, from the evaluator's own switch instants. */
function doublerPumpAt(name: string) {
  const { design: d, card } = loadDesign(design('doubler-pump'));
  const resolved = resolveDesign(d, card);
  const { corner } = resolved.corners.find(({ corner }) => corner.name === name)!;
  const r = new CornerEvaluator(resolved, { borrowScratch: false, warmStart: false, circuit: 'none' }).evaluate(corner);
  const network = buildNetwork(resolved.design, resolved.switches, resolved.card);
  const cycles = new CycleIndex(r.simulation, resolved.netlist);
  const devices = devicesAtCorner(card, corner);
  const sizes = shifterSizes(resolved);
  const model = cornerModel(network, resolved.switches, r.switches, cycles, devices, 1 / d.clock.frequency, {
    devices,
    shifterSizes: sizes,
  });
  return { resolved, model, cycles, devices, sizes };
}

describe('cornerModel', () => {
  it("takes a level-shifted switch's gate edges from its sized shifter at the corner, as the switch instants do, not the declared 250 ps", () => {
    for (const corner of ['ss/1.62V/125C', 'ff/1.98V/-40C']) {
      const { resolved, model, cycles, devices, sizes } = doublerPumpAt(corner);
      for (const name of ['s_chg', 's_out']) {
        const k = resolved.switches.findIndex((s) => s.name === name);
        const plan = resolved.switches[k]!;
        const cycle = cycles.cycle(plan.devices[0]!.net);
        if (typeof cycle === 'string') throw new Error(cycle);
        const timing = shifterGateTiming(plan.levelShifter!, devices, cycle, sizes[k]![0]!, 0);
        const edge = model.gateCharges!.find((g) => g.switchIndex === k)!.devices[0]!;
        // Both are n or p devices on their shifter's output: the n turns on at the rising gate, the p at the falling one.
        const [on, off] =
          plan.devices[0]!.kind === 'n' ? [timing.riseTransition, timing.fallTransition] : [timing.fallTransition, timing.riseTransition];
        expect(edge.onTransition, `${name} ${corner}`).toBe(on);
        expect(edge.offTransition, `${name} ${corner}`).toBe(off);
        // The sized shifter's edges move with the corner; the declared transition is the nominal corner's only.
        expect(Math.abs(edge.onTransition - 250e-12) / 250e-12, `${name} ${corner}`).toBeGreaterThan(0.1);
      }
    }
  });
});
