/**
 * The output edge of a pull network driven by a linear input ramp, in the alpha-power model
 * (T. Sakurai, A. R. Newton, IEEE JSSC 25(2):584-594, 1990) with the n-th power law's triode
 * region (T. Sakurai, A. R. Newton, "A simple MOSFET model for circuit analysis", IEEE TED
 * 38(4):887-894, 1991):
 *   x = (V_in - Vth)/(V_DD - Vth),  I_sat = I_D0 x^alpha,  V_Dsat = V_D0 x^(alpha/2),
 *   I = I_sat (2 - V/V_Dsat)(V/V_Dsat) below V_Dsat, I_sat above,  C dV/dt = -I.
 * The saturation voltage at full drive follows from the velocity-saturation model
 * (K. Y. Toh, P. K. Ko, R. G. Meyer, IEEE JSSC 23(4):950-958, 1988): with the local exponent of
 * I_sat(V_ov) matched to alpha, V_D0 = (alpha - 1)(V_DD - Vth), the square law's V_ov at alpha = 2
 * and 0 at alpha = 1.
 *
 * The opposing network, still on while the input ramps, is taken as the pulling one's mirror image.
 *
 * In units of tau = C V_DD / I_D0 the edge depends only on alpha, v_T = Vth/V_DD and the input
 * transition s = t_in / tau. The paper's closed forms are the limits of this one equation: a step
 * input, or a fast one with the output still saturated at 50 % and the opposing current left out,
 * gives their delay (1/2 - (1 - v_T)/(1 + alpha)) s + 1/2; what they leave out is the triode tail
 * (which lengthens the output transition 30-80 % at alpha = 2) and a slow input still rising
 * when the output crosses, against the opposing network.
 * So the equation is solved once per alpha on a grid of (v_T, s) and interpolated: delay and the
 * time of every 5 % level of the output edge from its 50 % point.
 */

/** Levels of the edge recorded, as the fraction of the swing still to go: 0.95, 0.90, ..., 0.05. */
const LEVELS = 19;
const LEVEL_STEP = 0.05;
/** Grid in v_T: 0, 0.05, ..., 0.95. */
const VT_STEP = 0.05;
const VT_POINTS = 20;
/** Grid in s: (k * Q_STEP)^2 for k = 0 .. S_POINTS - 1, up to s = 64. */
const Q_STEP = 0.25;
const S_POINTS = 33;
/** Per grid point: delay, full-swing transition, then the time of each level from the 50 % point. */
const STRIDE = 2 + LEVELS;
const FIRST_LEVEL = 2;

/** Input transition on the grid, in tau. */
export function gridTransition(k: number): number {
  return k * Q_STEP * (k * Q_STEP);
}

/**
 * Current of a pull network of `depth` devices in series, sized `depth` times wide (logical
 * effort), the switching one at gate drive x and the others fully on, in units of the network's
 * full-drive current: the switching device alone gives depth * x^alpha, the others alone 1 +
 * 1/(depth - 1) times the network's; in series, their harmonic combination (exact at x -> 0 and at
 * x = 1 for long-channel devices, where the stack equals one device depth times as long).
 */
export function stackFactor(sat: number, depth: number): number {
  if (depth === 1) return sat;
  return 1 / (1 / (depth * sat) + (depth - 1) / depth);
}

/** Normalised falling output (from 1) under a ramp of s tau; crossing times of 0.95 ... 0.05, and of 0.5, in tau. */
export function solveEdge(alpha: number, vT: number, s: number, depth = 1): { delay: number; crossings: Float64Array } {
  const d0 = (alpha - 1) * (1 - vT);
  const pull = (gate: number, v: number, series: number): number => {
    if (gate <= vT) return 0;
    const x = (gate - vT) / (1 - vT);
    const sat = stackFactor(alpha === 2 ? x * x : x ** alpha, series);
    const vdsat = d0 * Math.sqrt(sat);
    if (v >= vdsat) return sat;
    const r = v / vdsat;
    return sat * (2 - r) * r;
  };
  // The opposing network is the mirror image of the pulling one (a balanced gate, as logical-effort
  // sizing intends): it holds the output while a slow input is still near its start.
  const current = (t: number, v: number): number => {
    const vin = s > 0 ? Math.min(t / s, 1) : 1;
    return pull(vin, v, depth) - pull(1 - vin, 1 - v, 1);
  };
  const crossings = new Float64Array(LEVELS);
  // RK4 is stable for h * |dI/dV| < 2.78; below V_Dsat |dI/dV| <= 2 / d0, and below d0 = 0.03 the
  // edge is past its last recorded level.
  const h = Math.min(0.004 * (1 + s), 0.8 * Math.max(d0, 0.03));
  const end = s + 1000;
  // The output cannot move before the input passes the threshold.
  let t = s > 0 ? vT * s : 0;
  let v = 1;
  let next = 0;
  let t50 = NaN;
  while ((next < LEVELS || Number.isNaN(t50)) && t < end) {
    const k1 = current(t, v);
    const k2 = current(t + h / 2, v - (h / 2) * k1);
    const k3 = current(t + h / 2, v - (h / 2) * k2);
    const k4 = current(t + h, v - h * k3);
    const nv = v - (h / 6) * (k1 + 2 * k2 + 2 * k3 + k4);
    while (next < LEVELS && nv <= 1 - (next + 1) * LEVEL_STEP) {
      const level = 1 - (next + 1) * LEVEL_STEP;
      crossings[next++] = t + (h * (v - level)) / (v - nv);
    }
    if (Number.isNaN(t50) && nv <= 0.5) t50 = t + (h * (v - 0.5)) / (v - nv);
    v = nv;
    t += h;
  }
  // Only reached if the output stalled (it cannot at a stable step): the levels not crossed count as now.
  if (Number.isNaN(t50)) t50 = t;
  for (; next < LEVELS; next++) crossings[next] = t;
  for (let i = 0; i < LEVELS; i++) crossings[i]! -= t50;
  return { delay: t50 - s / 2, crossings };
}

/** The solved grid of one alpha. */
export class RampResponse {
  private constructor(
    readonly alpha: number,
    readonly depth: number,
    private readonly grid: Float64Array,
  ) {}

  private static readonly cache = new Map<string, RampResponse>();

  /** The grid of devices of index alpha switching in a series stack of `depth` (1 = a single device). */
  static of(alpha: number, depth = 1): RampResponse {
    const key = `${alpha}/${depth}`;
    let table = RampResponse.cache.get(key);
    if (!table) {
      const grid = new Float64Array(VT_POINTS * S_POINTS * STRIDE);
      for (let a = 0; a < VT_POINTS; a++) {
        for (let k = 0; k < S_POINTS; k++) {
          const { delay, crossings } = solveEdge(alpha, a * VT_STEP, gridTransition(k), depth);
          const i = (a * S_POINTS + k) * STRIDE;
          grid[i] = delay;
          grid[i + 1] = (crossings[17]! - crossings[1]!) / 0.8;
          grid.set(crossings, i + FIRST_LEVEL);
        }
      }
      table = new RampResponse(alpha, depth, grid);
      RampResponse.cache.set(key, table);
    }
    return table;
  }

  /** Row of v_T: the lower grid index in its integer part, the weight of the upper one in its fraction. */
  static vtPosition(vT: number): number {
    const p = Math.min(Math.max(vT, 0), (VT_POINTS - 1) * VT_STEP) / VT_STEP;
    return Math.min(p, VT_POINTS - 1 - 1e-9);
  }

  /** Position of input transition s (in tau) on the grid: index of the segment plus the weight of its end (above 1 past the grid). */
  static sPosition(s: number): number {
    // biome-ignore lint/complexity/useMathMinMax: a NaN transition maps to 0 here, where Math.max would keep it
    const q = Math.sqrt(s > 0 ? s : 0) / Q_STEP;
    const k = q >= S_POINTS - 1 ? S_POINTS - 2 : q | 0;
    const s0 = gridTransition(k);
    return k + (s - s0) / (gridTransition(k + 1) - s0);
  }

  /**
   * Entry `field` at v_T position `vtPos` (vtPosition) and transition position `sPos` (sPosition),
   * in tau: bilinear, linear in s past the grid.
   */
  at(vtPos: number, sPos: number, field: number): number {
    const a = vtPos | 0;
    const wa = vtPos - a;
    const k = Math.min(sPos | 0, S_POINTS - 2);
    const ws = sPos - k;
    const g = this.grid;
    const i0 = (a * S_POINTS + k) * STRIDE + field;
    const i1 = i0 + S_POINTS * STRIDE;
    const lo = g[i0]! + ws * (g[i0 + STRIDE]! - g[i0]!);
    const hi = g[i1]! + ws * (g[i1 + STRIDE]! - g[i1]!);
    return lo + wa * (hi - lo);
  }

  /** Delay from input 50 % to output 50 %, tau. */
  delay(vtPos: number, s: number): number {
    return this.at(vtPos, RampResponse.sPosition(s), 0);
  }

  /** Full-swing transition time extrapolated from the 10-90 % time, tau. */
  transition(vtPos: number, s: number): number {
    return this.at(vtPos, RampResponse.sPosition(s), 1);
  }

  /**
   * Time from the output's 50 % point to the point where a fraction `remaining` of the swing is
   * still to go (0.1 = 90 % of the way), tau; negative before the 50 % point. Linear between the
   * recorded 5 % levels, clamped to 0.05 ... 0.95.
   */
  crossing(vtPos: number, s: number, remaining: number): number {
    const sPos = RampResponse.sPosition(s);
    const p = Math.min(Math.max((1 - remaining) / LEVEL_STEP - 1, 0), LEVELS - 1);
    const i = Math.min(p | 0, LEVELS - 2);
    const w = p - i;
    const lo = this.at(vtPos, sPos, FIRST_LEVEL + i);
    return lo + w * (this.at(vtPos, sPos, FIRST_LEVEL + 1 + i) - lo);
  }
}
