/**
 * Local threshold mismatch (M. Pelgrom, A. Duinmaijer, A. Welbers, "Matching properties of MOS
 * transistors", IEEE JSSC 24(5):1433-1439, 1989). Pelgrom's A_VT is the coefficient of the
 * difference of a matched pair, sigma(Vth1 - Vth2) = A_VT / sqrt(W * L); the two devices vary
 * independently, so one device has sigma(dVth) = A_VT / sqrt(2 * W * L). A card whose avt is
 * already per device says `avtConvention: device`.
 *
 * Each sample is one die: every device of every instance gets an independent draw, the same at
 * every corner. A cell's pull network takes the mean of its devices' shifts where they are in
 * series (so its sigma is the device's over sqrt(k)) and one device's shift where they are in
 * parallel (the switching device); this is what the delay model, which sees one threshold per
 * network, can use.
 */
import { randomLcg, randomNormal } from 'd3-random';
import { CELLS, cellWidths } from '../cells/library.js';
import type { CompiledNetlist } from '../netlist/netlist.js';
import type { ProcessCard } from '../schema/process.js';
import type { SwitchPlan } from '../switches/plan.js';
import type { Mismatch } from '../delay/model.js';

/** Local mismatch of one sample: per-gate shifts for the delay model, per switch device shifts, V. */
export interface SampleMismatch extends Mismatch {
  /** switches[k][i] shifts device i of switch k. */
  readonly switches: readonly Float64Array[];
  /** shifters[k] shifts the pull-down threshold of switch k's level shifter (0 without one). */
  readonly shifters?: Float64Array;
}

export type AvtConvention = 'pair' | 'device';

/** Pelgrom's law: sigma of one device's threshold, V, for A_VT given per pair (default) or per device. */
export function pelgromSigma(avt: number, w: number, l: number, convention: AvtConvention = 'pair'): number {
  return avt / Math.sqrt((convention === 'pair' ? 2 : 1) * w * l);
}

export interface MismatchSigmas {
  /** Sigma of each gate's pull-down and pull-up threshold shift, V. */
  readonly gateN: Float64Array;
  readonly gateP: Float64Array;
  /** Sigma of each device of each switch, V. */
  readonly switches: readonly Float64Array[];
  /** Sigma of each switch's level-shifter pull-down threshold, V (0 without a shifter). */
  readonly shifters: Float64Array;
}

/** Width of a level shifter's pull-down n device when the design gives none: 4 unit n widths. */
export const SHIFTER_PULL_DOWN_UNITS = 4;

export function mismatchSigmas(netlist: CompiledNetlist, card: ProcessCard, switches: readonly SwitchPlan[]): MismatchSigmas {
  const unit = { wn: card.unit.wn, wp: card.unit.wp };
  const gateN = new Float64Array(netlist.gateCount);
  const gateP = new Float64Array(netlist.gateCount);
  for (let g = 0; g < netlist.gateCount; g++) {
    const cell = netlist.gateCell[g]!;
    const shape = CELLS[cell];
    const w = cellWidths(cell, netlist.gateSize[g]!, unit);
    gateN[g] = pelgromSigma(card.n.avt, w.wn, card.lmin, card.avtConvention) / Math.sqrt(shape.nSeries);
    gateP[g] = pelgromSigma(card.p.avt, w.wp, card.lmin, card.avtConvention) / Math.sqrt(shape.pSeries);
  }
  const sw = switches.map((plan) => Float64Array.from(plan.devices, (d) => pelgromSigma(card[d.kind].avt, d.w, d.l, card.avtConvention)));
  const shifters = Float64Array.from(switches, (plan) =>
    plan.levelShifter
      ? pelgromSigma(card.n.avt, plan.levelShifter.w ?? SHIFTER_PULL_DOWN_UNITS * card.unit.wn, card.lmin, card.avtConvention)
      : 0,
  );
  return { gateN, gateP, switches: sw, shifters };
}

/** A 32-bit mix of the run's seed and the sample index (a splitmix-style finaliser). */
export function sampleSeed(seed: number, sample: number): number {
  let h = (Math.imul(seed | 0, 0x9e3779b1) ^ Math.imul(sample + 1, 0x85ebca6b)) >>> 0;
  h = Math.imul(h ^ (h >>> 16), 0x7feb352d) >>> 0;
  h = Math.imul(h ^ (h >>> 15), 0x846ca68b) >>> 0;
  h = (h ^ (h >>> 16)) >>> 0;
  return h / 4294967296;
}

/** Fresh, zeroed mismatch buffers shaped for the design. */
export function mismatchBuffers(sigmas: MismatchSigmas): SampleMismatch {
  return {
    dvthN: new Float64Array(sigmas.gateN.length),
    dvthP: new Float64Array(sigmas.gateP.length),
    switches: sigmas.switches.map((s) => new Float64Array(s.length)),
    shifters: new Float64Array(sigmas.shifters.length),
  };
}

/**
 * Draws die `sample` of a run into `out` (overwritten): the same (seed, sample) gives the same
 * numbers on any machine and in any thread.
 */
export function drawMismatch(sigmas: MismatchSigmas, seed: number, sample: number, out: SampleMismatch): SampleMismatch {
  const normal = randomNormal.source(randomLcg(sampleSeed(seed, sample)))(0, 1);
  const n = out.dvthN as Float64Array;
  const p = out.dvthP as Float64Array;
  for (let g = 0; g < sigmas.gateN.length; g++) {
    n[g] = sigmas.gateN[g]! * normal();
    p[g] = sigmas.gateP[g]! * normal();
  }
  for (let k = 0; k < sigmas.switches.length; k++) {
    const s = sigmas.switches[k]!;
    const target = out.switches[k] as Float64Array;
    for (let i = 0; i < s.length; i++) target[i] = s[i]! * normal();
  }
  // Drawn after everything else, so adding a shifter leaves the other draws of a die unchanged.
  const shifters = out.shifters;
  if (shifters)
    for (let k = 0; k < sigmas.shifters.length; k++) shifters[k] = sigmas.shifters[k]! === 0 ? 0 : sigmas.shifters[k]! * normal();
  return out;
}
