/**
 * A delay model with one fixed delay per gate and output edge (and a fixed transition time): what
 * a Verilog gate primitive with #(rise, fall) does, so the engine and an exported model can be
 * compared edge for edge.
 */
import type { DelayModel, GateTiming } from '../delay/model.js';

export interface FixedDelays {
  /** Output rising and falling delay of each gate, s. */
  readonly rise: ArrayLike<number>;
  readonly fall: ArrayLike<number>;
}

export function fixedDelayModel(delays: FixedDelays, transition = 1e-12): DelayModel {
  const timing: GateTiming = {
    delay: (gate, _pin, rising) => (rising ? delays.rise[gate]! : delays.fall[gate]!),
    transition: () => transition,
  };
  return { name: 'fixed', bind: () => timing };
}
