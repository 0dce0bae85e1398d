/**
 * Switch physics at one operating point: threshold with body effect, the instant a linear gate
 * ramp crosses a level, and the triode on-resistance.
 */

/**
 * Threshold magnitude with body effect, V_T = V_T0 + gamma * (sqrt(2phiF + V_SB) - sqrt(2phiF))
 * (common practice; the long-channel body-effect law). A forward bias is clamped at V_SB = 0.
 */
export function bodyThreshold(vt0: number, gamma: number, phi2f: number, vsb: number): number {
  return vt0 + gamma * (Math.sqrt(phi2f + Math.max(0, vsb)) - Math.sqrt(phi2f));
}

/** A linear gate ramp between two levels. */
export interface GateRamp {
  /** 50 % time, s. */
  readonly t50: number;
  /** Full-swing transition time, s. */
  readonly transition: number;
  /** Swing, V. */
  readonly low: number;
  readonly high: number;
  readonly rising: boolean;
}

/**
 * When the ramp passes `level`, s. On a rising ramp that is t50 + tT * ((V - low)/(high - low) - 1/2);
 * on a falling ramp t50 + tT * ((high - V)/(high - low) - 1/2) (derived from the linear ramp;
 * for an nmos opening on a V_DD -> 0 ramp this is (1/2 - (V_S + V_TN)/V_DD) * t_f after 50 %).
 * Only valid for low < level < high.
 */
export function rampCrossing(ramp: GateRamp, level: number): number {
  const fraction = (level - ramp.low) / (ramp.high - ramp.low);
  return ramp.t50 + ramp.transition * ((ramp.rising ? fraction : 1 - fraction) - 0.5);
}

/** Deep-triode on-resistance, R = 1 / (k' * (W/L) * (V_GS - V_T)), ohm; Infinity when not on (common practice). */
export function triodeResistance(kprime: number, w: number, l: number, overdrive: number): number {
  return overdrive > 0 ? 1 / (kprime * (w / l) * overdrive) : Infinity;
}

/** Time constants to settle to error epsilon, ln(1/epsilon). */
export function settlingTimeConstants(epsilon: number): number {
  return Math.log(1 / epsilon);
}

/** Settling error for N bits at half an LSB, 2^-(N+1). */
export function bitsToError(bits: number): number {
  return Math.pow(2, -(bits + 1));
}
