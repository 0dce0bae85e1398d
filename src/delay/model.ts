/**
 * The delay-model interface. The engine asks only for the delay (input 50 % to output 50 %) and
 * the output transition time of a gate's output edge; it never knows which model answers.
 */
import type { CornerDevices } from '../process/device.js';
import type { CompiledNetlist } from '../netlist/netlist.js';

/** Timing of every gate of one netlist at one corner (and one mismatch sample, if any). */
export interface GateTiming {
  /** Delay of gate g's output edge caused by its input pin switching, s. */
  delay(gate: number, pin: number, outputRising: boolean, inputTransition: number): number;
  /** Full-swing transition time of that output edge, s. */
  transition(gate: number, pin: number, outputRising: boolean, inputTransition: number): number;
  /**
   * Time from that output edge's 50 % point to where it crosses `level` (fraction of the supply
   * above ground), s; negative before the 50 % point. A model without it leaves the edge a
   * linear ramp of its transition time.
   */
  crossing?(gate: number, pin: number, outputRising: boolean, inputTransition: number, level: number): number;
}

/** Per-gate threshold shifts from local mismatch, V, added to the corner's threshold magnitude. */
export interface Mismatch {
  readonly dvthN: Float64Array;
  readonly dvthP: Float64Array;
}

export interface DelayModel {
  readonly name: string;
  /** Characterized switch on-resistance per corner, when the model carries it (the table model). */
  readonly ron?: ReadonlyArray<{
    readonly process: string;
    readonly vdd: number;
    readonly temperature: number;
    readonly ron: { readonly n: number; readonly p: number };
  }>;
  /**
   * Binds the model to a netlist, its net loads (F) and a corner. Throws an InputError if the
   * corner is outside what the model can answer for. `reuse`, a timing this model bound earlier
   * for the same netlist, may be overwritten and returned instead of allocating (tight loops).
   */
  bind(netlist: CompiledNetlist, loads: Float64Array, devices: CornerDevices, mismatch?: Mismatch, reuse?: GateTiming): GateTiming;
}
