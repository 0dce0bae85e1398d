/**
 * Charge a MOS switch puts on its terminals at its gate edges, as an instantaneous step of the
 * node voltages at the switch event. At turn-off the channel's inversion charge
 * Q_ch = W L C_ox (V_GS - V_T) is released, half to each terminal; at turn-on the same charge is
 * drawn back from them. Through its overlap capacitance W C_ov the gate swing couples onto each
 * terminal at both edges. The channel charge divides between the terminals as the gate ramp
 * lets the still-conducting channel even them out (`channelShare`). A turn-off is a step of the
 * node voltages; a turn-on draws its charge over the first substep while the switch conducts.
 *
 * The channel charge released at turn-off is affine in the source voltage, taken as the mean of
 * the two terminals, so the step is x -> J x + j and the period map keeps its fixed point. The
 * threshold's body effect is linearised, and whether the device has any overdrive decided, at the
 * source voltage of the last traced steady state (overdrive.ts iterates it).
 */
import type { DeviceParams } from '../schema/process.js';
import { INJECTION, type Branch } from './branches.js';
import type { CircuitModel } from './model.js';
import type { PeriodSolver } from './period-solver.js';
import type { SubstepMap } from './substep.js';

/**
 * Gate-oxide capacitance per area, F/m²: the card's `cox`, else the whole gate capacitance per
 * width at minimum length spread over that length (the overlap counted as channel too, erring high).
 */
export function oxidePerArea(params: Pick<DeviceParams, 'cox' | 'cgate'>, lmin: number): number {
  return params.cox ?? params.cgate / lmin;
}

function seriesCapacitance(ca: number, cb: number): number {
  if (!Number.isFinite(ca)) return cb;
  if (!Number.isFinite(cb)) return ca;
  return (ca * cb) / (ca + cb);
}

/** Steps of the channel-share integration over the gate ramp. */
const SHARE_STEPS = 64;

/**
 * Fraction of a channel's charge that ends on terminal a (capacitance ca; Infinity for a rail)
 * rather than b. While the gate ramps from its on level to the threshold, the channel gives up
 * its charge at a constant rate, half at each end, and its conductance, falling linearly to zero,
 * evens the two terminals out. With s the fraction of that ramp and e the terminals' difference
 * times their series capacitance per unit of channel charge,
 *   de/ds = (cb - ca) / (2 (ca + cb)) - kappa (1 - s) e,   share_a = 1/2 - kappa * integral (1 - s) e ds,
 * kappa = beta V_ov^2 / (U C_series), U the gate slope (the switching parameter of G. Wegmann,
 * E. A. Vittoz, F. Rahali, Charge injection in analog MOS switches, IEEE JSSC 22(6), 1987, from
 * memory). A fast edge (kappa -> 0) splits the charge equally, common practice; a slow one divides
 * it as the capacitances, a rail taking all of it.
 */
export function channelShare(kappa: number, ca: number, cb: number): number {
  if (!Number.isFinite(ca) && !Number.isFinite(cb)) return 0.5;
  const drive = !Number.isFinite(ca) ? -0.5 : !Number.isFinite(cb) ? 0.5 : (cb - ca) / (2 * (ca + cb));
  // Each step holds (1 - s) at its middle and moves e exactly; the charge moved is then the
  // drive's integral less e's change, drive - e(1).
  const h = 1 / SHARE_STEPS;
  let e = 0;
  for (let i = 0; i < SHARE_STEPS; i++) {
    const rate = kappa * (1 - (i + 0.5) * h);
    if (rate * h < 1e-9) e += h * drive;
    else {
      const steady = drive / rate;
      e = steady + (e - steady) * Math.exp(-rate * h);
    }
  }
  return 0.5 - (drive - e);
}

/** Whether the model has gate charges to step the nodes with. */
export function hasGateCharge(model: CircuitModel): boolean {
  return (model.gateCharges?.length ?? 0) > 0 && model.intervals.length > 1;
}

/** Whether switch `s` changes state at the start of interval i: 1 turning on, -1 turning off, 0 neither. */
export function edgeAt(model: CircuitModel, interval: number, s: number): -1 | 0 | 1 {
  const count = model.intervals.length;
  const now = model.intervals[interval]!.on[s]!;
  const before = model.intervals[(interval - 1 + count) % count]!.on[s]!;
  return now === before ? 0 : now === 1 ? 1 : -1;
}

/** Charge onto terminal t, C: constant + ca V[a] + cb V[b] (a, b the switch's terminals; rails at their level). */
export interface TerminalCharge {
  readonly t: number;
  readonly a: number;
  readonly b: number;
  readonly constant: number;
  readonly ca: number;
  readonly cb: number;
}

/**
 * Charge every switch with gate charge that changes state at the start of interval i in direction
 * `direction` (1 turning on, -1 turning off) puts on its circuit-node terminals: at turn-off affine
 * in the terminal voltages just then; at turn-on a constant, the channel charge at the source
 * voltage of its turn-off. (The channel charge changes while it conducts as its terminals move,
 * fed through them; drawing at turn-on what is released at turn-off keeps that out of the sum:
 * the channel pumps no net charge over a period.)
 */
export function edgeCharges(model: CircuitModel, interval: number, direction: 1 | -1): TerminalCharge[] {
  const out: TerminalCharge[] = [];
  if (!hasGateCharge(model)) return out;
  const n = model.nodes.length;
  const cinv = model.inverseCapacitance;
  const charges = model.gateCharges!;
  for (let g = 0; g < charges.length; g++) {
    const charge = charges[g]!;
    if (edgeAt(model, interval, charge.switchIndex) !== direction) continue;
    const { a, b } = model.switches[charge.switchIndex]!;
    const source = model.chargeSources ? model.chargeSources[g]! : charge.sourceGuess;
    for (const d of charge.devices) {
      const swing = direction > 0 ? d.gateOn - d.gateOff : d.gateOff - d.gateOn;
      const coupled = d.overlap * swing;
      // Overdrive c0 + c1 V_S, V_S the terminals' mean, with the threshold's body effect
      // linearised at `source`: a source off by dV errs in the threshold only by its curvature, O(dV^2).
      const vt = d.threshold(source);
      const dvt = (d.threshold(source + SLOPE_STEP) - d.threshold(source - SLOPE_STEP)) / (2 * SLOPE_STEP);
      const nType = d.polarity === 'n';
      const c0 = (nType ? d.gateOn : -d.gateOn) - vt + dvt * source;
      const c1 = nType ? -1 - dvt : 1 - dvt;
      const overdrive = c0 + c1 * source;
      // Released at turn-off, drawn back at turn-on: an n channel holds electrons, a p channel holes.
      const total = overdrive > 0 ? (nType ? -1 : 1) * -direction * d.channel : 0;
      let shareA = 0.5;
      if (total !== 0) {
        const slope = Math.abs(d.gateOn - d.gateOff) / (direction > 0 ? d.onTransition : d.offTransition);
        const ca = a < n ? 1 / cinv[a * n + a]! : Infinity;
        const cb = b < n ? 1 / cinv[b * n + b]! : Infinity;
        shareA = channelShare((d.beta * overdrive * overdrive) / (slope * seriesCapacitance(ca, cb)), ca, cb);
      }
      for (const [t, share] of [
        [a, shareA],
        [b, 1 - shareA],
      ] as const) {
        if (t >= n) continue;
        const q = share * total;
        if (direction > 0) out.push({ t, a, b, constant: coupled + q * overdrive, ca: 0, cb: 0 });
        else out.push({ t, a, b, constant: coupled + q * c0, ca: (q * c1) / 2, cb: (q * c1) / 2 });
      }
    }
  }
  return out;
}

/**
 * The step of the node voltages where switches turn off at the start of interval i,
 * x -> E x + e (F, f zero: it takes no time); null when no switch with gate charge turns off there.
 */
export function edgeMap(model: CircuitModel, interval: number): SubstepMap | null {
  const charges = edgeCharges(model, interval, -1);
  if (charges.length === 0) return null;
  const n = model.nodes.length;
  const k = new Float64Array(n * n);
  const q = new Float64Array(n);
  for (const c of charges) {
    q[c.t]! += c.constant;
    for (const [j, coefficient] of [
      [c.a, c.ca],
      [c.b, c.cb],
    ] as const) {
      if (j < n) k[c.t * n + j]! += coefficient;
      else q[c.t]! += coefficient * model.rails[j - n]!;
    }
  }
  const cinv = model.inverseCapacitance;
  const E = new Float64Array(n * n);
  const e = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    E[i * n + i] = 1;
    let sum = 0;
    for (let l = 0; l < n; l++) sum += cinv[i * n + l]! * q[l]!;
    e[i] = sum;
    for (let j = 0; j < n; j++) {
      let kij = 0;
      for (let l = 0; l < n; l++) kij += cinv[i * n + l]! * k[l * n + j]!;
      E[i * n + j]! += kij;
    }
  }
  return { h: 0, branches: [], E, e, F: new Float64Array(n * n), f: new Float64Array(n) };
}

/**
 * Where switches turn on at the start of interval i, their charge as currents from ground over the
 * interval's first substep (length h), so that the channel draws it while it already conducts (a
 * step before the conduction would dip a node by the whole charge for an instant; a current that
 * followed the node voltages would load a small node like a resistor); empty when none turns on.
 */
export function drawBranches(model: CircuitModel, interval: number, h: number): Branch[] {
  const ground = model.nodes.length;
  return edgeCharges(model, interval, 1).map((c) => ({
    f: ground,
    t: c.t,
    j1: c.a,
    c1: c.ca / h,
    j2: c.b,
    c2: c.cb / h,
    k: c.constant / h,
    tag: INJECTION,
    part: c.t,
    segment: 0,
  }));
}

/** Step of the source voltage for the threshold's slope, V. */
const SLOPE_STEP = 1e-3;

/**
 * Change of a gate charge's source voltage, V, within which two solves agree on its thresholds:
 * the threshold is linear in the source around it, so 50 mV errs by under a millivolt of
 * threshold (body-effect curvature gamma / (8 (2 phi_F + V_SB)^1.5) dV^2, about 0.2 V^-1).
 */
export const SOURCE_TOLERANCE = 0.05;

/** Whether the model's source voltages (its guesses, when it has none yet) are all within SOURCE_TOLERANCE of `after`. */
export function sourcesAgree(model: CircuitModel, after: ArrayLike<number>): boolean {
  const charges = model.gateCharges ?? [];
  for (let i = 0; i < after.length; i++) {
    const before = model.chargeSources ? model.chargeSources[i]! : charges[i]!.sourceGuess;
    if (!(Math.abs(after[i]! - before) < SOURCE_TOLERANCE)) return false;
  }
  return true;
}

/**
 * Source voltage of each gate charge at its turn-off along a traced period, V: the mean of the
 * switch's terminals just before it (`voltages`, a row per substep boundary).
 */
export function edgeSources(solver: PeriodSolver, voltages: Float64Array): Float64Array {
  const { model, n } = solver;
  const charges = model.gateCharges ?? [];
  const out = Float64Array.from(charges, (c) => c.sourceGuess);
  const at = (row: number, j: number) => (j < n ? voltages[row * n + j]! : model.rails[j - n]!);
  for (let k = 0; k < solver.substeps; k++) {
    if (!solver.edges[k]) continue;
    const interval = solver.substepInterval[k]!;
    charges.forEach((c, g) => {
      if (edgeAt(model, interval, c.switchIndex) !== -1) return;
      const s = model.switches[c.switchIndex]!;
      out[g] = (at(k, s.a) + at(k, s.b)) / 2;
    });
  }
  return out;
}
