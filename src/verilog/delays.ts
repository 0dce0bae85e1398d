/**
 * Fixed rise/fall delays of every gate at one corner, as the model gives them in the periodic
 * steady state: the simulation is run once with a recording wrapper around the model, and the
 * last delay asked of each gate and edge (from the final, settled period) is kept. A gate that
 * never switches gets its delay for the clock's transition.
 */
import type { ResolvedDesign } from '../analysis/resolve.js';
import type { Corner } from '../process/corner.js';
import { devicesAtCorner } from '../process/device.js';
import type { GateTiming } from '../delay/model.js';
import { Simulator } from '../sim/engine.js';
import { inputError } from '../errors.js';
import { finite } from '../units/finite.js';
import type { FixedDelays } from './fixed.js';

export function steadyStateDelays(resolved: ResolvedDesign, corner: Corner): FixedDelays {
  const { design, netlist, loads, model, card } = resolved;
  const timing = model.bind(netlist, loads, devicesAtCorner(card, corner));
  const count = netlist.gateCount;
  const rise = new Float64Array(count).fill(NaN);
  const fall = new Float64Array(count).fill(NaN);
  const recording: GateTiming = {
    delay(gate, pin, rising, inputTransition) {
      const d = timing.delay(gate, pin, rising, inputTransition);
      (rising ? rise : fall)[gate] = d;
      return d;
    },
    transition: (gate, pin, rising, inputTransition) => timing.transition(gate, pin, rising, inputTransition),
  };
  const result = new Simulator(netlist).run(recording, {
    period: 1 / design.clock.frequency,
    duty: corner.duty,
    transition: design.clock.transition,
  });
  if (result.status !== 'settled') {
    throw inputError(
      'physics.no-steady-state',
      ['corners'],
      corner.name,
      `has no periodic steady state in the model (${result.reason}); its delays cannot be exported`,
    );
  }
  for (let g = 0; g < count; g++) {
    if (Number.isNaN(rise[g]!)) rise[g] = timing.delay(g, 0, true, design.clock.transition);
    if (Number.isNaN(fall[g]!)) fall[g] = timing.delay(g, 0, false, design.clock.transition);
    const why = `the model gives gate ${netlist.source.gates[g]?.name ?? g} no finite delay at ${corner.name}`;
    finite(rise[g]!, ['corners'], why);
    finite(fall[g]!, ['corners'], why);
  }
  return { rise, fall };
}
