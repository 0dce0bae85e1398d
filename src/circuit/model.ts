/**
 * A switched-capacitor network at one corner, ready to solve: capacitors between circuit nodes,
 * rails at fixed voltages, switches that are a conductance while their gate is on and a leak
 * while it is off, piecewise-linear channels (an off device conducting backwards when a
 * terminal passes its gate level by a threshold) and piecewise-linear diodes, and a load.
 * Node indices: 0..n-1 are the circuit nodes the solver finds, n + k is rail k (rail 0 is ground).
 */

export interface ModelSwitch {
  readonly name: string;
  readonly a: number;
  readonly b: number;
  /** Conductance while the gate is on, 1/R_on, S; 0 when the device never turns on. */
  readonly gOn: number;
  /** Conductance while the gate is off (leakage), S. */
  readonly gOff: number;
  /**
   * On-conductance from the node voltages, S (0 without overdrive): the devices' triode
   * conductance with an n device's source at `nSource` and a p device's at `pSource`. Absent
   * for a switch whose conductance is fixed at gOn.
   */
  readonly onConductance?: (nSource: number, pSource: number) => number;
}

/**
 * An off device that conducts when one terminal passes its gate's off level by a threshold: an
 * n device whose lower terminal falls below V_G - V_T, a p device whose higher terminal rises
 * above V_G + V_T. Linearised as I = g (V_S - V_G - V_T) for p and g (V_G - V_T - V_S) for n,
 * flowing between source and drain: zero at the onset, so the node clamps smoothly.
 */
export interface ModelChannel {
  /** Index of the switch it belongs to: it applies only while that switch's gate is off. */
  readonly switchIndex: number;
  readonly a: number;
  readonly b: number;
  readonly polarity: 'n' | 'p';
  /** Gate voltage while off, V. */
  readonly gate: number;
  /** Threshold magnitude at the onset, V. */
  readonly vt: number;
  /** Transconductance of the linearised channel, S. */
  readonly g: number;
}

/** Piecewise-linear diode: I = (V_AK - drop) gOn above the drop, V_AK gOff below. */
export interface ModelDiode {
  readonly name: string;
  readonly a: number;
  readonly b: number;
  readonly drop: number;
  readonly gOn: number;
  readonly gOff: number;
}

/** One device of a switch as the charge its gate edges put on the switch's terminals (injection.ts). */
export interface ModelEdgeDevice {
  readonly polarity: 'n' | 'p';
  /** Channel capacitance W L C_ox, F. */
  readonly channel: number;
  /** Gate-overlap capacitance to each terminal, W C_ov, F. */
  readonly overlap: number;
  /** Gate level while the device conducts and while it is off, V. */
  readonly gateOn: number;
  readonly gateOff: number;
  /** Full-swing transition of the gate edge that turns it on and of the one that turns it off, s. */
  readonly onTransition: number;
  readonly offTransition: number;
  /** Triode conductance per volt of overdrive, k' W / L, S/V. */
  readonly beta: number;
  /** Threshold magnitude with its source at a voltage, V. */
  readonly threshold: (source: number) => number;
}

/** A switching switch's devices, whose charge steps the nodes at its turn-on and turn-off. */
export interface ModelGateCharge {
  readonly switchIndex: number;
  readonly devices: readonly ModelEdgeDevice[];
  /** Source voltage to take the thresholds at before a traced steady state gives one, V. */
  readonly sourceGuess: number;
}

/** A stretch of the period in which every switch gate keeps its state. */
export interface ModelInterval {
  /** Duration, s. */
  readonly duration: number;
  /** Gate on (1) or off (0) per switch. */
  readonly on: Uint8Array;
  /** On-conductance per switch in this interval, S, in place of gOn (0: no overdrive, only the leak conducts). */
  readonly g?: Float64Array;
}

export interface CircuitModel {
  /** Names of the circuit nodes, in index order. */
  readonly nodes: readonly string[];
  /** Rail voltages, V (index n + k). */
  readonly rails: Float64Array;
  /** Inverse of the n x n nodal capacitance matrix, 1/F, row-major. */
  readonly inverseCapacitance: Float64Array;
  /** Intervals in order; their durations add up to the period. */
  readonly intervals: readonly ModelInterval[];
  /** Start of the first interval within the period, s. */
  readonly start: number;
  readonly switches: readonly ModelSwitch[];
  readonly channels: readonly ModelChannel[];
  readonly diodes: readonly ModelDiode[];
  /** Channel charge and gate coupling of the switches at their edges; absent: none. */
  readonly gateCharges?: readonly ModelGateCharge[];
  /**
   * Source voltage of each gate charge at its turn-off, where its thresholds are taken at both
   * edges, V; absent: each entry's sourceGuess.
   */
  readonly chargeSources?: Float64Array;
  /** Switch index pairs that must not conduct together (their overlap is shoot-through). */
  readonly pairs: readonly (readonly [number, number])[];
  readonly output: number;
  /** Load current from the output to ground, A (negative: into the output). */
  readonly loadCurrent: number;
  /** Load conductance from the output to ground, S. */
  readonly loadConductance: number;
}

export function periodOf(model: CircuitModel): number {
  let sum = 0;
  for (const i of model.intervals) sum += i.duration;
  return sum;
}
