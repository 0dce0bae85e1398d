/**
 * The transistor sizes of every cross-coupled level shifter of a design, as the deck builds them
 * (src/switches/shifter-sizing.ts): each is sized at the card's nominal corner for its switch
 * gate's load and its net's transition there. The model's per-edge shifter timing
 * (src/switches/shifter-edges.ts) needs the same sizes at every corner, so they are made once per
 * resolved design, from one run of the generator at the nominal corner.
 */
import { devicesAtCorner } from '../process/device.js';
import { Simulator } from '../sim/engine.js';
import { CycleIndex } from '../measure/phases.js';
import { switchGateCapacitance } from '../switches/plan.js';
import { latchShifter, nominalCorner, sizeShifter, type ShifterSizing } from '../switches/shifter-sizing.js';
import type { ResolvedDesign } from './resolve.js';

/** Per switch, per device: its shifter's sizes, or null (no shifter, or not the cross-coupled up-shifter). */
export type ShifterSizes = ReadonlyArray<ReadonlyArray<ShifterSizing | null>>;

const sizes = new WeakMap<ResolvedDesign, ShifterSizes>();
const inputs = new WeakMap<ResolvedDesign, ((net: string) => number) | null>();

/**
 * Full-swing transition of each gate net at the card's nominal corner (mean of both edges), s:
 * the input ramp its shifter is sized for; 0 for a net that does not switch once each way. Null
 * when the generator finds no steady state there.
 */
export function nominalGateTransitions(resolved: ResolvedDesign): ((net: string) => number) | null {
  if (inputs.has(resolved)) return inputs.get(resolved)!;
  const { design, card, netlist, loads, model } = resolved;
  const corner = nominalCorner(card, 0.5);
  const timing = model.bind(netlist, loads, devicesAtCorner(card, corner));
  const simulation = new Simulator(netlist).run(timing, {
    period: 1 / design.clock.frequency,
    duty: corner.duty,
    transition: design.clock.transition,
  });
  let answer: ((net: string) => number) | null = null;
  if (simulation.status === 'settled') {
    const cycles = new CycleIndex(simulation, netlist);
    const memo = new Map<string, number>();
    answer = (net) => {
      let t = memo.get(net);
      if (t === undefined) {
        const cycle = cycles.cycle(net);
        t = typeof cycle === 'string' ? 0 : (cycle.riseTransition + cycle.fallTransition) / 2;
        memo.set(net, t);
      }
      return t;
    };
  }
  inputs.set(resolved, answer);
  return answer;
}

/** The sizes of every shifter the deck builds from transistors up from the core supply, made once per design. */
export function shifterSizes(resolved: ResolvedDesign): ShifterSizes {
  let out = sizes.get(resolved);
  if (out === undefined) {
    const { card, design } = resolved;
    const vdd = card.vddNominal;
    const needed = resolved.switches.some((plan) => plan.levelShifter && latchShifter(plan.levelShifter, vdd));
    const transitions = needed ? nominalGateTransitions(resolved) : null;
    out = resolved.switches.map((plan) =>
      plan.devices.map((device) => {
        const ls = plan.levelShifter;
        if (!ls || !latchShifter(ls, vdd)) return null;
        const load = switchGateCapacitance(card, device.kind, device.w, device.l);
        return sizeShifter(ls, card, load, transitions?.(device.net) ?? design.clock.transition);
      }),
    );
    sizes.set(resolved, out);
  }
  return out;
}
