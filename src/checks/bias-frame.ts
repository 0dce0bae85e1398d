/**
 * The switch bias checks of one corner, prepared once so that every Monte Carlo die of that
 * corner only recomputes the thresholds: each off-state and on-state case reduced to its
 * source-to-body bias and gate drive, and the stress check (no threshold in it) kept whole.
 */
import type { CornerDevices, DeviceAtCorner } from '../process/device.js';
import { bulkAt, deviceOn, gateLevel, terminalSpan } from '../switches/bias.js';
import type { StateIndex } from '../switches/nodes.js';
import { bodyThreshold } from '../switches/physics.js';
import type { SwitchPlan } from '../switches/plan.js';
import {
  STATES,
  allowanceFor,
  biasCheck,
  neverCheck,
  offDetail,
  offSource,
  offStateWorst,
  onDetail,
  onStateWorst,
  spanPoint,
  spanPointCount,
  stressCheck,
  switchOffIn,
  type BiasCheckNames,
  type BiasSettings,
} from './bias-checks.js';
import type { Check } from './check.js';

/** One way a device could fail: margin = sign * (V_T(vsb) + dvth-shifted) + offset. */
interface Case {
  readonly device: number;
  readonly state: StateIndex;
  readonly d: DeviceAtCorner;
  /** Source-to-body reverse bias for the body effect, V. */
  readonly vsb: number;
  /** Gate drive from the source (V_GS for n, V_SG for p), V. */
  readonly drive: number;
  /** Off-state sub-threshold allowance, V (0 for on-state cases). */
  readonly allowance: number;
}

/** On-state: at each point, the best device's overdrive counts; the least point counts. */
interface OnPoint {
  readonly state: StateIndex;
  readonly cases: readonly Case[];
}

interface SwitchFrame {
  readonly plan: SwitchPlan;
  readonly k: number;
  readonly names: BiasCheckNames;
  readonly off: readonly Case[];
  readonly on: readonly OnPoint[];
  readonly stress: Check;
}

function vt(c: Case, dvth: ArrayLike<number> | undefined): number {
  return bodyThreshold(c.d.switchVth + (dvth ? dvth[c.device]! : 0), c.d.gamma, c.d.phi2f, c.vsb);
}

function frameOf(plan: SwitchPlan, k: number, names: BiasCheckNames, devices: CornerDevices, settings: BiasSettings): SwitchFrame {
  const vdd = devices.vdd;
  const off: Case[] = [];
  const on: OnPoint[] = [];
  for (const state of STATES) {
    if (switchOffIn(plan, state)) {
      plan.devices.forEach((device, i) => {
        const n = device.kind === 'n';
        const d = n ? devices.n : devices.p;
        const { source } = offSource(plan, n, state, vdd);
        const gate = gateLevel(plan, device, state, vdd);
        const bulk = bulkAt(plan, device.kind, state, vdd);
        off.push({
          device: i,
          state,
          d,
          vsb: n ? source - bulk : bulk - source,
          drive: n ? gate - source : source - gate,
          allowance: allowanceFor(d, devices.corner.temperature, settings),
        });
      });
      continue;
    }
    const span = terminalSpan(plan, state, vdd);
    const points = spanPointCount(plan, span);
    for (let p = 0; p < points; p++) {
      const v = spanPoint(plan, span, p, points);
      const cases: Case[] = [];
      plan.devices.forEach((device, i) => {
        if (!deviceOn(device, state)) return;
        const n = device.kind === 'n';
        const gate = gateLevel(plan, device, state, vdd);
        const bulk = bulkAt(plan, device.kind, state, vdd);
        cases.push({
          device: i,
          state,
          d: n ? devices.n : devices.p,
          vsb: n ? v - bulk : bulk - v,
          drive: n ? gate - v : v - gate,
          allowance: 0,
        });
      });
      on.push({ state, cases });
    }
  }
  return { plan, k, names, off, on, stress: stressCheck(plan, names, devices, settings) };
}

/**
 * Evaluates the bias checks corner by corner; the per-corner preparation is reused while the
 * same CornerDevices object comes back (every die of one corner in Monte Carlo).
 */
export class BiasChecker {
  private devices: CornerDevices | null = null;
  private frames: SwitchFrame[] = [];

  constructor(
    private readonly plans: readonly SwitchPlan[],
    private readonly settings: BiasSettings,
    private readonly names: ReadonlyArray<BiasCheckNames | null>,
  ) {}

  /** Appends every switch's off-state, on-state and stress check to `checks` (which is returned). */
  run(devices: CornerDevices, mismatch: readonly ArrayLike<number>[] | undefined, checks: Check[]): Check[] {
    if (devices !== this.devices) {
      this.frames = [];
      this.plans.forEach((plan, k) => {
        const names = this.names[k];
        if (names) this.frames.push(frameOf(plan, k, names, devices, this.settings));
      });
      this.devices = devices;
    }
    const labels = this.settings.stateLabels;
    for (const f of this.frames) {
      const dvth = mismatch?.[f.k];
      const { plan, names } = f;
      if (f.off.length === 0) checks.push(neverCheck('off-state', names, plan));
      else {
        let least = Infinity;
        let state: StateIndex = 0;
        for (const c of f.off) {
          // The same operations, in the same order, as offStateMargin: the same bits.
          const m = vt(c, dvth) - c.allowance - c.drive;
          if (m < least) {
            least = m;
            state = c.state;
          }
        }
        const check = biasCheck('off-state', names, plan, least, labels[state]);
        checks.push(
          check.pass
            ? check
            : { ...check, detail: offDetail(plan, offStateWorst(plan, devices, dvth, this.settings)!, devices.vdd, this.settings) },
        );
      }
      if (f.on.length === 0) checks.push(neverCheck('on-state', names, plan));
      else {
        let least = Infinity;
        let state: StateIndex = 0;
        for (const p of f.on) {
          let best = -Infinity;
          for (const c of p.cases) {
            const od = c.drive - vt(c, dvth);
            if (od > best) best = od;
          }
          if (best < least) {
            least = best;
            state = p.state;
          }
        }
        const check = biasCheck('on-state', names, plan, least, labels[state]);
        checks.push(
          check.pass ? check : { ...check, detail: onDetail(plan, onStateWorst(plan, devices, dvth)!, devices.vdd, this.settings) },
        );
      }
      checks.push(f.stress);
    }
    return checks;
  }
}
