/**
 * The output edge of a pull network driven by a linear input ramp, in the alpha-power model
 * (T. Sakurai, A. R. Newton, IEEE JSSC 25(2):584-594, 1990) with the n-th power law's triode
 * region (T. Sakurai, A. R. Newton, "A simple MOSFET model for circuit analysis", IEEE TED
 * 38(4):887-894, 1991):
 *   x = (V_in - Vth)/(V_DD - Vth),  I_sat = I_D0 p(x),  V_Dsat = V_D0 p(x)^(1/2),
 *   I = I_sat (2 - V/V_Dsat)(V/V_Dsat) below V_Dsat, I_sat above,  C dV/dt = -I.
 * The saturation voltage at full drive follows from the velocity-saturation model
 * (K. Y. Toh, P. K. Ko, R. G. Meyer, IEEE JSSC 23(4):950-958, 1988): with the local exponent of
 * I_sat(V_ov) matched to alpha, V_D0 = (alpha - 1)(V_DD - Vth), the square law's V_ov at alpha = 2
 * and 0 at alpha = 1. Below full drive p(x) is the square law bent by mobility degradation, with the
 * same current and log slope alpha at full drive as x^alpha (driveBend).
 *
 * The opposing network, still on while the input ramps, is taken as the pulling one's mirror image
 * scaled by the ratio of the two networks' full-drive currents, with its own threshold.
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

/**
 * A device type's current law as the edge sees it: alpha, and the drain saturation voltage at full
 * drive over the gate overdrive, V_D0 / (V_DD - Vth) (the n-th power law's V_D0; T. Sakurai,
 * A. R. Newton, IEEE TED 38(4):887-894, 1991). Where velocity saturation is what bends the current
 * below the square law, Toh, Ko and Meyer's V_D0 = (alpha - 1)(V_DD - Vth) holds (the default);
 * where mobility degradation does (no velocity saturation), the device stays in triode up to
 * nearly its full overdrive and the card states the measured ratio.
 */
export interface DriveLaw {
  readonly alpha: number;
  readonly saturation: number;
}

/** A law of this alpha, with Toh, Ko and Meyer's saturation voltage unless one is given. */
export function driveLaw(alpha: number, saturation = alpha - 1): DriveLaw {
  return { alpha, saturation };
}

/** A bare alpha stands for its law with the default saturation voltage. */
export type LawLike = number | DriveLaw;

function lawOf(law: LawLike): DriveLaw {
  return typeof law === 'number' ? driveLaw(law) : law;
}

/** A law's key in the caches of solved grids: its alpha and saturation voltage. */
export function lawKey(law: LawLike): string {
  const { alpha, saturation } = lawOf(law);
  return `${alpha}:${saturation}`;
}

/** Levels of the edge recorded, as the fraction of the swing still to go: 0.95, 0.90, ..., 0.05. */
const LEVELS = 19;
const LEVEL_STEP = 0.05;
/** Grid in v_T: 0, 0.05, ..., 0.95. */
const VT_STEP = 0.05;
const VT_POINTS = 20;
/** Grid in s: (k * Q_STEP)^2 for k = 0 .. S_POINTS - 1, up to s = 64. */
const Q_STEP = 0.25;
const S_POINTS = 33;
/**
 * Per grid point: delay, full-swing transition, the time of each level from the 50 % point; then
 * the same three per unit of channel share, per unit of the opposing device's channel share and
 * per unit of kickback share (see solveEdge).
 */
const FIELDS = 2 + LEVELS;
const STRIDE = 4 * FIELDS;
const FIRST_LEVEL = 2;
/** Offset of a field's channel-share term. */
export const CHANNEL = FIELDS;
/** Offset of a field's opposing-channel term. */
export const OPPOSED = 2 * FIELDS;
/** Offset of a field's kickback term. */
export const KICK = 3 * FIELDS;

/** Input transition on the grid, in tau. */
export function gridTransition(k: number): number {
  return k * Q_STEP * (k * Q_STEP);
}

/**
 * Current of a pull network of `depth` devices in series, sized `depth` times wide (logical
 * effort), the switching one at gate drive x and the others fully on, in units of the network's
 * full-drive current: the switching device alone gives depth * p(x) (driveBend), the others alone 1 +
 * 1/(depth - 1) times the network's; in series, their harmonic combination (exact at x -> 0 and at
 * x = 1 for long-channel devices, where the stack equals one device depth times as long).
 */
export function stackFactor(sat: number, depth: number): number {
  if (depth === 1) return sat;
  return 1 / (1 / (depth * sat) + (depth - 1) / depth);
}

/**
 * A gate's input edge, rising from 0 to 1, in units of its full-swing transition (the 10-90 %
 * time over 0.8) from its start: u[i] at x = start + i * step, 50 % at x = 1/2. `null` stands for
 * the linear ramp (a clock source's edge).
 */
export interface InputEdge {
  readonly start: number;
  readonly step: number;
  readonly u: Float64Array;
}

/** The input's value at x transitions from the ramp's start. */
function inputAt(edge: InputEdge | null, x: number): number {
  if (!edge) return Math.min(Math.max(x, 0), 1);
  const p = (x - edge.start) / edge.step;
  if (p <= 0) return 0;
  const i = p | 0;
  if (i >= edge.u.length - 1) return 1;
  const u = edge.u;
  return u[i]! + (p - i) * (u[i + 1]! - u[i]!);
}

/**
 * Meyer's gate-drain capacitance of a device in its linear region, in units of its channel
 * capacitance C_ox W L, at r = V_DS / V_DSAT: (2/3)(1 - 1/(2 - r)^2), 1/2 at r = 0 and 0 from
 * saturation on (J. E. Meyer, "MOS models and circuit simulation", RCA Review 32:42-63, 1971).
 */
export function meyerDrain(r: number): number {
  if (r >= 1) return 0;
  const q = 2 - r;
  return (2 / 3) * (1 - 1 / (q * q));
}

/**
 * Normalised falling output (from 1) under an input edge of s tau; crossing times of 0.95 ...
 * 0.05, and of 0.5, in tau.
 *
 * Once the pulling device leaves saturation its channel charge hangs on the output through its
 * gate-drain capacitance (meyerDrain): the output carries C_L (1 + m g) and the rising gate feeds
 * m g C_L dV_in/dt back, m = C_ox W L / C_L. To first order in m each crossing comes later by m
 * times the integral of g (1 + u'/I) over the edge so far (u' the input's slope, I the current),
 * returned per level (`channel`) and for the delay (`channelDelay`), so one solution serves any m.
 *
 * The opposing device, turning off, starts in its linear region with its drain on the still
 * output: Meyer's C_gd, up to half its channel, couples the moving input to the output (a Miller
 * capacitance) until it saturates or turns off. With m_o its channel over C_L, the output obeys
 * dV/dt = -I + m_o g_o (u' + I) to first order in m_o; the perturbation w of V per unit m_o follows
 * dw/dt = -(dI/dV) w + g_o (u' + I), so the opposing device also drains what the input kicks onto
 * the output while it is still on, and each crossing comes later by m_o w / I (`opposed`,
 * `opposedDelay`).
 *
 * A driven input is another gate's output, not a source: once the pulling device is in its
 * triode region its C_gd draws g (u' + I) C_L on the input net too (the kickback), which that
 * net's driver makes up at the rate it restores its own output, k = u'/(1 - u) (exact in the
 * driver's linear tail). Per unit m_k, the pulling device's channel over the input net's
 * capacitance, the input lags by y, dy/dt = -k y - g (u' + I), and the output by z, dz/dt =
 * -(dI/dV) z - (dI/du) y; each crossing comes later by m_k z / I (`kick`, `kickDelay`). A ramp
 * (a clock source) has none.
 */
export function solveEdge(
  law: LawLike,
  vT: number,
  s: number,
  depth = 1,
  input: InputEdge | null = null,
  opposing = 1,
  record?: (t: number, v: number) => void,
  opposingShift = 0,
): {
  delay: number;
  crossings: Float64Array;
  channel: Float64Array;
  channelDelay: number;
  opposed: Float64Array;
  opposedDelay: number;
  kick: Float64Array;
  kickDelay: number;
} {
  const { alpha, saturation } = lawOf(law);
  const d0 = saturation * (1 - vT);
  const vTo = Math.min(Math.max(vT + opposingShift, 0), 0.99);
  const d0o = saturation * (1 - vTo);
  const pulling = new GateDrive(alpha, saturation, depth, vT);
  const holding = new GateDrive(alpha, saturation, 1, vTo);
  const pull = (net: GateDrive, gate: number, v: number): number => {
    if (gate <= net.th) return 0;
    net.set(gate);
    const sat = net.sat;
    const vdsat = net.vdsat;
    if (v >= vdsat) return sat;
    const r = v / vdsat;
    return sat * (2 - r) * r;
  };
  // The opposing network is the pulling one's mirror image scaled by `opposing`, the ratio of the
  // two networks' full-drive currents, with its own v_T (`opposingShift` above the pulling one's):
  // it holds the output while a slow input is still near its start.
  const vinAt = (t: number): number => (s > 0 ? inputAt(input, t / s) : 1);
  const currentOf = (vin: number, v: number): number => pull(pulling, vin, v) - opposing * pull(holding, 1 - vin, 1 - v);
  // Derivatives of pull() in its drain voltage (slopeV) and its gate (slopeG), set by pullSlopes:
  // I = sat (2 - r) r below V_Dsat = d sqrt(sat), so dI/dV = sat (2 - 2 r) / V_Dsat and, at fixed
  // V, dI/dsat = r (1 in saturation); sat = stackFactor(p(x)), x = (gate - th) / (1 - th).
  let slopeV = 0;
  let slopeG = 0;
  const pullSlopes = (net: GateDrive, gate: number, v: number): void => {
    slopeV = 0;
    slopeG = 0;
    const th = net.th;
    if (gate <= th) return;
    net.set(gate);
    const { p, dp, sat, vdsat } = net;
    const series = net.series;
    const dSat = (series === 1 ? 1 : (sat * sat) / (series * p * p)) * (dp / (1 - th));
    if (v >= vdsat) {
      slopeG = dSat;
      return;
    }
    slopeV = (sat * (2 - (2 * v) / vdsat)) / vdsat;
    slopeG = (v / vdsat) * dSat;
  };
  /** dI/dV of the output node (what drains a perturbation of it) and dI/du (how it follows the input). */
  let conductance = 0;
  let gain = 0;
  const slopes = (vin: number, v: number): void => {
    pullSlopes(pulling, vin, v);
    conductance = slopeV;
    gain = slopeG;
    pullSlopes(holding, 1 - vin, 1 - v);
    conductance += opposing * slopeV;
    gain += opposing * slopeG;
  };
  const current = (t: number, v: number): number => currentOf(vinAt(t), v);
  /** The pulling device's drain share at output v and input vin (0 while saturated or off). */
  const share = (vin: number, v: number): number => {
    if (vin <= vT) return 0;
    const vdsat = d0 * ((vin - vT) / (1 - vT));
    return v >= vdsat ? 0 : meyerDrain(v / vdsat);
  };
  /** Perturbation of the output per unit of the opposing device's channel share (see above). */
  let w = 0;
  /** The opposing device's drain share at output v and input vin (0 while saturated or off). */
  const opposedShare = (vin: number, v: number): number => {
    const gate = 1 - vin;
    if (gate <= vTo) return 0;
    const vdsat = d0o * ((gate - vTo) / (1 - vTo));
    return 1 - v >= vdsat ? 0 : meyerDrain((1 - v) / vdsat);
  };
  const crossings = new Float64Array(LEVELS);
  const channel = new Float64Array(LEVELS);
  const opposed = new Float64Array(LEVELS);
  const kick = new Float64Array(LEVELS);
  let y = 0;
  let z = 0;
  let z50 = NaN;
  let restore = 0;
  let g = 0;
  let g50 = NaN;
  let w50 = NaN;
  // RK4 is stable for h * |dI/dV| < 2.78; below V_Dsat |dI/dV| <= 2 / d0, and below d0 = 0.03 the
  // edge is past its last recorded level.
  const h = Math.min(0.004 * (1 + s), 0.8 * Math.max(d0, 0.03));
  // The output cannot move before the input passes the threshold.
  let t = s > 0 ? s * inputStart(input, vT) : 0;
  // But the opposing device's C_gd already carries the input's rise onto the still output, which
  // that device, fully on, drains again: w over the input's start, the output at 1.
  if (s > 0) {
    const from = s * Math.min(0, input ? input.start : 0);
    const steps = 64;
    const dt = (t - from) / steps;
    for (let k = 0; k < steps && dt > 0; k++) {
      const tm = from + (k + 0.5) * dt;
      const slope = (vinAt(tm + dt / 2) - vinAt(tm - dt / 2)) / dt;
      slopes(vinAt(tm), 1);
      const decay = conductance;
      const drive = opposedShare(vinAt(tm), 1) * (slope + current(tm, 1));
      const e = Math.exp(-decay * dt);
      w = w * e + drive * (decay * dt > 1e-9 ? (1 - e) / decay : dt);
    }
  }
  const end = t + s + 1000;
  let v = 1;
  let next = 0;
  let t50 = NaN;
  while ((next < LEVELS || Number.isNaN(t50) || (record && v > 1e-3)) && t < end) {
    const k1 = current(t, v);
    const k2 = current(t + h / 2, v - (h / 2) * k1);
    const k3 = current(t + h / 2, v - (h / 2) * k2);
    const k4 = current(t + h, v - h * k3);
    const nv = v - (h / 6) * (k1 + 2 * k2 + 2 * k3 + k4);
    const vin = vinAt(t + h / 2);
    const slope = s > 0 ? (vinAt(t + h) - vinAt(t)) / h : 0;
    const i = (k2 + k3) / 2;
    const ng = g + (i > 1e-9 ? h * share(vin, (v + nv) / 2) * (1 + slope / i) : 0);
    // The opposing term over the step, exactly for a constant decay rate dI/dV (always stable).
    const vm = (v + nv) / 2;
    slopes(vin, vm);
    const decay = conductance;
    const drive = opposedShare(vin, vm) * (slope + i);
    const e = Math.exp(-decay * h);
    const held = decay * h > 1e-9 ? (1 - e) / decay : h;
    const nw = w * e + drive * held;
    let nz = z;
    if (input) {
      if (slope > 0 && 1 - vin > 1e-6) restore = slope / (1 - vin);
      const pushed = -share(vin, vm) * (slope + i);
      if (pushed !== 0 || y !== 0) {
        const ey = Math.exp(-restore * h);
        const ny = y * ey + pushed * (restore * h > 1e-9 ? (1 - ey) / restore : h);
        nz = z * e - gain * ((y + ny) / 2) * held;
        y = ny;
      } else nz = z * e;
    }
    while (next < LEVELS && nv <= 1 - (next + 1) * LEVEL_STEP) {
      const level = 1 - (next + 1) * LEVEL_STEP;
      const f = (v - level) / (v - nv);
      crossings[next] = t + h * f;
      channel[next] = g + f * (ng - g);
      opposed[next] = (w + f * (nw - w)) / Math.max(i, 1e-9);
      kick[next++] = (z + f * (nz - z)) / Math.max(i, 1e-9);
    }
    if (Number.isNaN(t50) && nv <= 0.5) {
      const f = (v - 0.5) / (v - nv);
      t50 = t + h * f;
      g50 = g + f * (ng - g);
      w50 = (w + f * (nw - w)) / Math.max(i, 1e-9);
      z50 = (z + f * (nz - z)) / Math.max(i, 1e-9);
    }
    g = ng;
    w = nw;
    z = nz;
    record?.(t, v);
    v = nv;
    t += h;
  }
  // Only reached if the output stalled (it cannot at a stable step): the levels not crossed count as now.
  if (Number.isNaN(t50)) {
    t50 = t;
    g50 = g;
    w50 = 0;
    z50 = 0;
  }
  for (; next < LEVELS; next++) {
    crossings[next] = t;
    channel[next] = g;
    opposed[next] = w50;
    kick[next] = z50;
  }
  for (let i = 0; i < LEVELS; i++) {
    crossings[i]! -= t50;
    channel[i]! -= g50;
    opposed[i]! -= w50;
    kick[i]! -= z50;
  }
  return { delay: t50 - s / 2, crossings, channel, channelDelay: g50, opposed, opposedDelay: w50, kick, kickDelay: z50 };
}

/**
 * How the saturation current falls below full drive: x = (V_GS - Vth)/(V_DD - Vth), in units of the
 * full-drive current,
 *   p(x) = (1 + m) x^2 / (1 + m x),  m = (2 - alpha)/(alpha - 1),
 * the square law bent by a factor 1/(1 + theta V_ov): SPICE level 3's mobility degradation (the
 * ngspice manual's MOS3 THETA), and the same form as the common first-order velocity-saturation
 * current, V_ov^2/(1 + V_ov/(E_c L)) (common practice). m, which stands for theta (V_DD - Vth), is
 * set from alpha so that the log slope of p at full drive is alpha: the card's alpha-power fit
 * (near full drive) and this law give the same current and slope at V_DD. x^alpha itself holds that slope down to threshold, which
 * overstates the current below full drive: on generic180's level-3 models in ngspice-39 (27 C,
 * V_DS = 1.8 V) x^alpha is 6 % high at x = 0.47, 13 % at 0.33, 28 % at 0.2 and 85 % at 0.07, where
 * this law is 0.6, 1.1, 1.5 and 1.8 % low; a stage driven by another's edge ran about 1 % fast.
 * alpha = 2 is the square law (m = 0).
 */
export function driveBend(alpha: number): number {
  return (2 - alpha) / (alpha - 1);
}

/** p(x) of driveBend's law with bend m: the saturation current at drive x over the full-drive one. */
export function bentDrive(m: number, x: number): number {
  return ((1 + m) * x * x) / (1 + m * x);
}

/**
 * The drive of a pull network at one gate voltage, x = (gate - th)/(1 - th): p(x) (driveBend)
 * through the stack (sat), its slope and V_Dsat. They depend on the gate alone, and an RK4 step
 * asks for its midpoint's gate three times and ends on the next step's first: the last two gates
 * are kept, so a step computes two instead of five, with the same arithmetic.
 */
class GateDrive {
  x = 0;
  p = 0;
  /** dp / dx. */
  dp = 0;
  private lastDp = 0;
  sat = 0;
  vdsat = 0;
  private lastGate = Number.NaN;
  private lastX = 0;
  private lastP = 0;
  private lastSat = 0;
  private lastVdsat = 0;
  private gate = Number.NaN;

  private readonly bend: number;

  constructor(
    alpha: number,
    private readonly saturation: number,
    readonly series: number,
    readonly th: number,
  ) {
    this.bend = driveBend(alpha);
  }

  /** Sets x, p, sat and vdsat for a gate above th. */
  set(gate: number): void {
    if (gate === this.gate) return;
    const th = this.th;
    if (gate === this.lastGate) {
      this.lastGate = this.gate;
      this.gate = gate;
      const { x, p, dp, sat, vdsat } = this;
      this.x = this.lastX;
      this.p = this.lastP;
      this.dp = this.lastDp;
      this.lastDp = dp;
      this.sat = this.lastSat;
      this.vdsat = this.lastVdsat;
      this.lastX = x;
      this.lastP = p;
      this.lastSat = sat;
      this.lastVdsat = vdsat;
      return;
    }
    this.lastGate = this.gate;
    this.lastX = this.x;
    this.lastP = this.p;
    this.lastDp = this.dp;
    this.lastSat = this.sat;
    this.lastVdsat = this.vdsat;
    this.gate = gate;
    const x = (gate - th) / (1 - th);
    const m = this.bend;
    const p = bentDrive(m, x);
    const q = 1 / (1 + m * x);
    this.dp = (1 + m) * x * (2 + m * x) * q * q;
    const sat = stackFactor(p, this.series);
    this.x = x;
    this.p = p;
    this.sat = sat;
    this.vdsat = this.saturation * (1 - th) * Math.sqrt(sat);
  }
}

/** Where the input first passes v_T, in transitions. */
function inputStart(edge: InputEdge | null, vT: number): number {
  if (!edge) return vT;
  let i = 0;
  while (i < edge.u.length - 1 && edge.u[i + 1]! <= vT) i++;
  return edge.start + i * edge.step;
}

/**
 * Input transitions of the driving gate, in its own tau, at which its edge is solved (drivenEdge):
 * from a step (the edge all triode tail past its saturated start) to a slow input (nearly a ramp).
 * A driven edge's shape is placed between them by the driving gate's own output transition over
 * its tau (driverPosition), so the shape follows the driver's alpha and load rather than a constant.
 */
export const DRIVER_INPUTS: readonly number[] = [0, 1, 2.5, 5, 10];

/** Samples per transition of a recorded input edge. */
const EDGE_STEP = 0.005;

/**
 * The edge a gate of this alpha and v_T drives when its own input is a ramp of `s` tau (the
 * solved output, inverted to rise), as an input edge: what the next gate sees in place of a ramp.
 * It carries the output's triode tail, which a ramp of the same 10-90 % time does not.
 */
export function drivenEdge(
  law: LawLike,
  vT: number,
  s: number,
  input: InputEdge | null = null,
  opposing = 1,
  opposingShift = 0,
): InputEdge {
  const ts: number[] = [];
  const vs: number[] = [];
  const record = (t: number, v: number): void => {
    ts.push(t);
    vs.push(v);
  };
  const { crossings } = solveEdge(law, vT, s, 1, input, opposing, record, opposingShift);
  const full = (crossings[17]! - crossings[1]!) / 0.8;
  let k = 0;
  while (vs[k + 1]! > 0.5) k++;
  const t50 = ts[k]! + ((ts[k + 1]! - ts[k]!) * (vs[k]! - 0.5)) / (vs[k]! - vs[k + 1]!);
  const start = (ts[0]! - t50) / full + 0.5;
  const count = Math.ceil(((ts.at(-1)! - t50) / full + 0.5 - start) / EDGE_STEP) + 1;
  const u = new Float64Array(count);
  let j = 0;
  for (let i = 0; i < count; i++) {
    const t = t50 + (start + i * EDGE_STEP - 0.5) * full;
    while (j < ts.length - 2 && ts[j + 1]! < t) j++;
    const w = Math.min(Math.max((t - ts[j]!) / (ts[j + 1]! - ts[j]!), 0), 1);
    u[i] = 1 - (vs[j]! + w * (vs[j + 1]! - vs[j]!));
  }
  return { start, step: EDGE_STEP, u };
}

/**
 * The driver's own input: in a chain of gates it too is another gate's edge, taken as that of a
 * like gate under a ramp of the same transition (one stage back; a second stage back moves the
 * references' dead times by under 0.1 %).
 */
function driverInput(law: LawLike, vT: number, s: number): InputEdge {
  // Keyed by grid row, not by the float: a*0.05 + shift lands on a row under more than one spelling.
  const row = Math.round(vT / VT_STEP);
  const key = `${lawKey(law)}/${row}/${s}`;
  let edge = driverInputs.get(key);
  if (!edge) {
    edge = drivenEdge(law, row * VT_STEP, s);
    driverInputs.set(key, edge);
  }
  return edge;
}

/** driverInput's edges, by law, grid row of threshold and DRIVER_INPUTS transition (read-only). */
const driverInputs = new Map<string, InputEdge>();

/** Ratios of the opposing network's full-drive current to the pulling one's on the grid: 2^(r - 2). */
export const OPPOSING_POINTS = 5;

/** Position of an opposing ratio on its grid points (0 ... OPPOSING_POINTS - 1), clamped. */
export function opposingPosition(ratio: number): number {
  const p = Math.log2(ratio) + 2;
  return Math.min(Math.max(p, 0), OPPOSING_POINTS - 1 - 1e-9);
}

/**
 * Full-swing output transitions, in tau, of a driver by alpha, opposing grid point and opposing
 * threshold grid point: per v_T row, one per DRIVER_INPUTS, then their channel-share terms, then
 * their opposing-channel terms.
 */
const driverTransitions = new Map<string, Array<Float64Array | undefined>>();

/** A law's driver transitions, one slot per opposing and threshold grid point (o * SHIFT_POINTS + d). */
function driverSet(law: LawLike): Array<Float64Array | undefined> {
  const key = lawKey(law);
  let set = driverTransitions.get(key);
  if (!set) {
    set = new Array<Float64Array | undefined>(OPPOSING_POINTS * SHIFT_POINTS);
    driverTransitions.set(key, set);
  }
  return set;
}

/**
 * The driver's transitions at v_T row `row`, opposing grid point `o` and opposing threshold grid
 * point `d`: DRIVER_INPUTS.length values, then their channel and opposing-channel terms.
 */
function driverRow(law: LawLike, set: Array<Float64Array | undefined>, o: number, d: number, row: number): Float64Array {
  const n = DRIVER_INPUTS.length;
  let rows = set[o * SHIFT_POINTS + d];
  if (!rows) {
    rows = new Float64Array(3 * VT_POINTS * n).fill(NaN);
    set[o * SHIFT_POINTS + d] = rows;
  }
  if (Number.isNaN(rows[3 * row * n]!)) {
    for (let j = 0; j < n; j++) {
      const sd = DRIVER_INPUTS[j]!;
      const { crossings, channel, opposed } = solveEdge(
        law,
        row * VT_STEP,
        sd,
        1,
        driverInput(law, row * VT_STEP, sd),
        2 ** (o - 2),
        undefined,
        (d - SHIFT_CENTRE) * SHIFT_STEP,
      );
      rows[3 * row * n + j] = (crossings[17]! - crossings[1]!) / 0.8;
      rows[(3 * row + 1) * n + j] = (channel[17]! - channel[1]!) / 0.8;
      rows[(3 * row + 2) * n + j] = (opposed[17]! - opposed[1]!) / 0.8;
    }
  }
  return rows.subarray(3 * row * n, 3 * (row + 1) * n);
}

/**
 * The driver's full-swing output transition, in its own tau, at each of DRIVER_INPUTS, written to
 * out[offset ... offset + DRIVER_INPUTS.length - 1]: for a driver of law `law` at its own v_T
 * position `vtPos`, with channel share `share`, opposing position `opposing` (opposingPosition),
 * opposing channel share `opposedShare` and opposing threshold position `shift` (shiftPosition),
 * as the driver's own edge was computed. Interpolated in v_T, opposing ratio and threshold.
 */
export function driverCurve(
  law: LawLike,
  vtPos: number,
  share: number,
  opposing: number,
  opposedShare: number,
  shift: number,
  out: Float64Array,
  offset: number,
): void {
  const n = DRIVER_INPUTS.length;
  const a = vtPos | 0;
  const wa = vtPos - a;
  const o = opposing | 0;
  const wo = opposing - o;
  const d = shift | 0;
  const wd = shift - d;
  const set = driverSet(law);
  const o1 = wo === 0 ? o : o + 1;
  const d1 = wd === 0 ? d : d + 1;
  // The eight rows around the point: v_T a and a + 1, opposing o and o1, threshold d and d1.
  const rows = [
    driverRow(law, set, o, d, a),
    driverRow(law, set, o, d, a + 1),
    driverRow(law, set, o1, d, a),
    driverRow(law, set, o1, d, a + 1),
    driverRow(law, set, o, d1, a),
    driverRow(law, set, o, d1, a + 1),
    driverRow(law, set, o1, d1, a),
    driverRow(law, set, o1, d1, a + 1),
  ];
  const value = (k: number, j: number): number => {
    const r = rows[k]!;
    return r[j]! + share * r[n + j]! + opposedShare * r[2 * n + j]!;
  };
  const pair = (k: number, j: number): number => value(k, j) + wa * (value(k + 1, j) - value(k, j));
  const plane = (k: number, j: number): number => pair(k, j) + wo * (pair(k + 2, j) - pair(k, j));
  for (let j = 0; j < n; j++) out[offset + j] = plane(0, j) + wd * (plane(4, j) - plane(0, j));
}

/**
 * Position of a driving edge on DRIVER_INPUTS (0 ... DRIVER_INPUTS.length - 1, clamped) from the
 * driver's full-swing output transition `ratio` in its own tau, on its curve (driverCurve) at
 * curve[offset ...]: the driver's input transition that gives that output transition.
 */
export function curvePosition(curve: Float64Array, offset: number, ratio: number): number {
  const n = DRIVER_INPUTS.length;
  let lo = curve[offset]!;
  if (!(ratio > lo)) return 0;
  for (let j = 1; j < n; j++) {
    const hi = curve[offset + j]!;
    if (ratio < hi) return j - 1 + (ratio - lo) / (hi - lo);
    lo = hi;
  }
  return n - 1 - 1e-9;
}

/** driverCurve and curvePosition in one call. */
export function driverPosition(
  law: LawLike,
  vtPos: number,
  ratio: number,
  share = 0,
  opposing = 2,
  opposedShare = 0,
  shift = SHIFT_CENTRE,
): number {
  const curve = new Float64Array(DRIVER_INPUTS.length);
  driverCurve(law, vtPos, share, opposing, opposedShare, shift, curve, 0);
  return curvePosition(curve, 0, ratio);
}

/**
 * The opposing device's own v_T less the pulling one's on the grid: (j - SHIFT_CENTRE) * SHIFT_STEP.
 * A skewed corner moves the two thresholds apart (fs: the p-device's up, the n-device's down), and
 * the opposing device's threshold sets how long it holds the output against a slow input.
 */
export const SHIFT_POINTS = 7;
const SHIFT_CENTRE = 3;
const SHIFT_STEP = 0.05;

/** Position of a v_T difference (opposing less pulling) on its grid points (0 ... SHIFT_POINTS - 1), clamped. */
export function shiftPosition(shift: number): number {
  const p = shift / SHIFT_STEP + SHIFT_CENTRE;
  return Math.min(Math.max(p, 0), SHIFT_POINTS - 1 - 1e-9);
}

/**
 * The solved grid of one drive law, depth, input edge (a ramp, or a driver of law `driver` at input
 * transition DRIVER_INPUTS[shape]), opposing ratio and opposing threshold; v_T rows are solved
 * when first asked for.
 */
export class RampResponse {
  private constructor(
    readonly law: DriveLaw,
    readonly depth: number,
    readonly driver: LawLike | null,
    readonly shape: number,
    readonly opposing: number,
    readonly shift: number,
    private readonly grid: Float64Array,
  ) {}

  private static readonly cache = new Map<string, RampResponse>();
  private readonly solved = new Uint8Array(VT_POINTS);

  /**
   * The grid of devices of drive law `law` (or a bare alpha) switching in a series stack of `depth`
   * (1 = a single device), driven by a linear ramp (`driver` null) or by the edge of a gate of law `driver`
   * whose own input transition is DRIVER_INPUTS[shape] (drivenEdge), against an opposing network
   * of grid point `opposing` (2^(opposing - 2) times the pulling one's current) whose threshold
   * sits at grid point `shift` (shiftPosition) from the pulling one's.
   */
  static of(law: LawLike, depth = 1, driver: LawLike | null = null, shape = 0, opposing = 2, shift = SHIFT_CENTRE): RampResponse {
    const key = `${lawKey(law)}/${depth}/${driver === null ? null : lawKey(driver)}/${driver === null ? 0 : shape}/${opposing}/${shift}`;
    let table = RampResponse.cache.get(key);
    if (!table) {
      table = new RampResponse(lawOf(law), depth, driver, shape, opposing, shift, new Float64Array(VT_POINTS * S_POINTS * STRIDE));
      RampResponse.cache.set(key, table);
    }
    return table;
  }

  /** Solves the two v_T rows around `vtPos` if not yet done; returns vtPos. */
  prepare(vtPos: number): number {
    const a = vtPos | 0;
    if (!this.solved[a]) this.solveRow(a);
    if (!this.solved[a + 1]) this.solveRow(a + 1);
    return vtPos;
  }

  private solveRow(a: number): void {
    const sd = DRIVER_INPUTS[this.shape]!;
    const ratio = 2 ** (this.opposing - 2);
    const shift = (this.shift - SHIFT_CENTRE) * SHIFT_STEP;
    // The driving gate's pulling device is of this gate's opposing type: its threshold is this
    // gate's opposing one, and its own opposing network is this gate's pulling one (1 / ratio,
    // exact for cells sized as logical effort sizes them, whose networks all pull like the unit
    // inverter's).
    const driverVt = Math.min(Math.max(a * VT_STEP + shift, 0), (VT_POINTS - 1) * VT_STEP);
    const input =
      this.driver === null ? null : drivenEdge(this.driver, driverVt, sd, driverInput(this.driver, driverVt, sd), 1 / ratio, -shift);
    const grid = this.grid;
    for (let k = 0; k < S_POINTS; k++) {
      const { delay, crossings, channel, channelDelay, opposed, opposedDelay, kick, kickDelay } = solveEdge(
        this.law,
        a * VT_STEP,
        gridTransition(k),
        this.depth,
        input,
        ratio,
        undefined,
        (this.shift - SHIFT_CENTRE) * SHIFT_STEP,
      );
      const i = (a * S_POINTS + k) * STRIDE;
      grid[i] = delay;
      grid[i + 1] = (crossings[17]! - crossings[1]!) / 0.8;
      grid.set(crossings, i + FIRST_LEVEL);
      grid[i + CHANNEL] = channelDelay;
      grid[i + CHANNEL + 1] = (channel[17]! - channel[1]!) / 0.8;
      grid.set(channel, i + CHANNEL + FIRST_LEVEL);
      grid[i + OPPOSED] = opposedDelay;
      grid[i + OPPOSED + 1] = (opposed[17]! - opposed[1]!) / 0.8;
      grid.set(opposed, i + OPPOSED + FIRST_LEVEL);
      grid[i + KICK] = kickDelay;
      grid[i + KICK + 1] = (kick[17]! - kick[1]!) / 0.8;
      grid.set(kick, i + KICK + FIRST_LEVEL);
    }
    this.solved[a] = 1;
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
  delay(vtPos: number, s: number, share = 0, opposedShare = 0): number {
    this.prepare(vtPos);
    const sPos = RampResponse.sPosition(s);
    return this.at(vtPos, sPos, 0) + share * this.at(vtPos, sPos, CHANNEL) + opposedShare * this.at(vtPos, sPos, OPPOSED);
  }

  /** Full-swing transition time extrapolated from the 10-90 % time, tau. */
  transition(vtPos: number, s: number, share = 0, opposedShare = 0): number {
    this.prepare(vtPos);
    const sPos = RampResponse.sPosition(s);
    return this.at(vtPos, sPos, 1) + share * this.at(vtPos, sPos, CHANNEL + 1) + opposedShare * this.at(vtPos, sPos, OPPOSED + 1);
  }

  /**
   * Time from the output's 50 % point to the point where a fraction `remaining` of the swing is
   * still to go (0.1 = 90 % of the way), tau; negative before the 50 % point. Linear between the
   * recorded 5 % levels, clamped to 0.05 ... 0.95.
   */
  crossing(vtPos: number, s: number, remaining: number, share = 0, opposedShare = 0, kickShare = 0): number {
    this.prepare(vtPos);
    const sPos = RampResponse.sPosition(s);
    const p = Math.min(Math.max((1 - remaining) / LEVEL_STEP - 1, 0), LEVELS - 1);
    const i = Math.min(p | 0, LEVELS - 2);
    const w = p - i;
    const level = (field: number): number =>
      this.at(vtPos, sPos, field) +
      share * this.at(vtPos, sPos, CHANNEL + field) +
      opposedShare * this.at(vtPos, sPos, OPPOSED + field) +
      kickShare * this.at(vtPos, sPos, KICK + field);
    const lo = level(FIRST_LEVEL + i);
    return lo + w * (level(FIRST_LEVEL + 1 + i) - lo);
  }
}
