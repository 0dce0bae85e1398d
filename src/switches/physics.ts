/**
 * Switch physics at one operating point: threshold with body effect, the instant a linear gate
 * ramp crosses a level, and the triode on-resistance.
 */
import { thermalVoltage } from '../process/thermal.js';

/**
 * Threshold magnitude with body effect, V_T = V_T0 + gamma * (sqrt(2phiF + V_SB) - sqrt(2phiF))
 * (the long-channel body-effect law: A. S. Sedra, K. C. Smith, Microelectronic Circuits, section on
 * the body effect; B. Razavi, Design of Analog CMOS Integrated Circuits, ch. 2). `vsb` is the
 * source-to-body reverse bias (V_SB for n, V_BS for p); a forward bias is clamped at 0.
 */
export function bodyThreshold(vt0: number, gamma: number, phi2f: number, vsb: number): number {
  return vt0 + gamma * (Math.sqrt(phi2f + Math.max(0, vsb)) - Math.sqrt(phi2f));
}

/** A gate ramp between two levels: linear, unless it carries the shape of its edge. */
export interface GateRamp {
  /** 50 % time, s. */
  readonly t50: number;
  /** Full-swing transition time, s. */
  readonly transition: number;
  /** Swing, V. */
  readonly low: number;
  readonly high: number;
  readonly rising: boolean;
  /**
   * Time from t50 to where the edge crosses a fraction of its swing, s, as the delay model shapes
   * the edge (a phase edge's slow triode tail and quicker start); null, or no shape, for the
   * linear ramp.
   */
  readonly shape?: (fraction: number) => number | null;
}

/**
 * When the ramp passes `level`, s. On a rising ramp that is t50 + tT * ((V - low)/(high - low) - 1/2);
 * on a falling ramp t50 + tT * ((high - V)/(high - low) - 1/2) (derived from the linear ramp;
 * for an nmos opening on a V_DD -> 0 ramp this is (1/2 - (V_S + V_TN)/V_DD) * t_f after 50 %).
 * A ramp with a shape takes the shape's time where it gives one. Only valid for low < level < high.
 */
export function rampCrossing(ramp: GateRamp, level: number): number {
  const fraction = (level - ramp.low) / (ramp.high - ramp.low);
  const shaped = ramp.shape ? ramp.shape(fraction) : null;
  if (shaped !== null) return ramp.t50 + shaped;
  return ramp.t50 + ramp.transition * ((ramp.rising ? fraction : 1 - fraction) - 0.5);
}

/**
 * Deep-triode on-resistance with mobility degradation, ohm; Infinity when not on:
 * R = (1 + theta V_ov) / (k' (W/L) V_ov), the small-V_DS limit of the SPICE level 3 drain current
 * with mu_eff = mu0 / (1 + theta V_ov) (A. Vladimirescu, S. Liu, UCB/ERL M80/7, 1980, from memory).
 * Velocity saturation drops out at small V_DS: its factor 1 + V_DS / (E_sat L) (C. G. Sodini,
 * P.-K. Ko, J. L. Moll, IEEE Trans. Electron Devices 31(10):1386-1393, 1984) tends to 1, so a card
 * without theta gets one that folds velocity saturation in (`derivedTheta`), erring high.
 */
export function triodeResistance(kprime: number, w: number, l: number, overdrive: number, theta = 0): number {
  return overdrive > 0 ? (1 + theta * overdrive) / (kprime * (w / l) * overdrive) : Infinity;
}

/** Time constants to settle to error epsilon, ln(1/epsilon). */
export function settlingTimeConstants(epsilon: number): number {
  return Math.log(1 / epsilon);
}

/** Settling error for N bits at half an LSB, 2^-(N+1). */
export function bitsToError(bits: number): number {
  return 2 ** -(bits + 1);
}

/**
 * Sub-threshold swing, V per decade of drain current: S = n * (kT/q) * ln 10, about n * 60 mV/dec
 * at 300 K (common textbook fact; e.g. S. M. Sze, K. K. Ng, Physics of Semiconductor Devices, the
 * subthreshold region of the MOSFET chapter).
 */
export function subthresholdSwing(n: number, celsius: number): number {
  return n * thermalVoltage(celsius) * Math.LN10;
}

/**
 * Gate voltage an off switch must keep below its threshold so that its current stays `decades`
 * decades under the current at threshold, V: decades * S.
 */
export function offStateAllowance(decades: number, n: number, celsius: number): number {
  return decades * subthresholdSwing(n, celsius);
}
