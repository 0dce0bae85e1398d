/**
 * The quantities a deck measures, each with the model's value: both dead times and clean gaps,
 * every phase width, and every switch's turn-on and turn-off instant (its gate, or its level
 * shifter's output, crossing the device's turn-on level at each end of the signal range, as the
 * time after the clock's rising edge). Measurement windows open at the clock edge that precedes each event in the model's
 * steady-state period, so one deck needs no second pass.
 */
import { wrapTime } from '../measure/wrap-time.js';
import type { CompiledNetlist } from '../netlist/netlist.js';
import type { PhaseMeasurement } from '../measure/phases.js';
import { CycleIndex, GAP_LEVEL } from '../measure/phases.js';
import { modelEdgeShape } from '../measure/levels.js';
import type { GateTiming } from '../delay/model.js';
import type { SimulationResult } from '../sim/engine.js';
import type { CornerDevices } from '../process/device.js';
import type { SwitchPlan } from '../switches/plan.js';
import { rampCrossing } from '../switches/physics.js';
import { deviceShifter, gateWave, turnOnLevel } from '../switches/conduction.js';
import type { ShifterSizes } from '../analysis/shifter-sizes.js';
import { shifterNode } from './level-shifter.js';
import { levelAt } from '../schema/level.js';
import { spiceNumber } from './names.js';
import type { QuantityKind } from '../report/confirm-report.js';

/** One edge of a node crossing a level, with the absolute time the window opens (TD), s. */
export interface Crossing {
  readonly node: string;
  readonly level: number;
  readonly rising: boolean;
  readonly td: number;
}

/** A measured interval from one crossing to another; ngspice reports targ - trig. */
export interface Quantity {
  /** ngspice measurement name (lower case). */
  readonly name: string;
  readonly kind: QuantityKind;
  /** For people: `dead p1->p2`, `width p1`, `s_gnd off @ 0 V`. */
  readonly label: string;
  /** The model's value, s. */
  readonly model: number;
  readonly trig: Crossing;
  readonly targ: Crossing;
  /** For a switch instant: which switch and event, and the clock edge (deck time, s) it is measured from. */
  readonly event?: SwitchEvent;
}

export interface SwitchEvent {
  readonly switch: string;
  readonly event: 'on' | 'off';
  readonly anchor: number;
}

/** Where the deck's steady-state window sits on the simulator's time axis. */
export interface DeckWindow {
  /** The clock's 50 % rising edge that opens the measured period, s. */
  readonly start: number;
  readonly period: number;
  readonly duty: number;
}

/** The clock 50 % edge (rising or falling) at or before a time on the deck's axis. */
export function anchorBefore(time: number, window: DeckWindow): number {
  const rel = time - window.start;
  const k = Math.floor(rel / window.period);
  const frac = rel - k * window.period;
  return window.start + k * window.period + (frac >= window.duty * window.period ? window.duty * window.period : 0);
}

export interface QuantityContext {
  readonly netlist: CompiledNetlist;
  readonly result: SimulationResult;
  readonly measurement: PhaseMeasurement;
  readonly devices: CornerDevices;
  readonly switches: readonly SwitchPlan[];
  readonly node: (net: string) => string;
  readonly window: DeckWindow;
  /** Sizes of the switches' level shifters (shifter-sizes.ts), so the model's gate edges are the evaluator's. */
  readonly shifterSizes?: ShifterSizes;
  /** The delay model bound at this corner, so the model's gate edges have the evaluator's shape (modelEdgeShape). */
  readonly timing?: GateTiming;
}

/** Model time -> deck time: the model's reported period (from `modelWindowStart`) maps onto the deck's window. */
export function modelToDeck(window: DeckWindow, modelWindowStart: number): (t: number) => number {
  return (t) => window.start + wrapTime(t - modelWindowStart, window.period);
}

export function deckQuantities(ctx: QuantityContext): Quantity[] {
  const { measurement: m, window, devices } = ctx;
  const vdd = devices.vdd;
  const T = window.period;
  const toDeck = modelToDeck(window, ctx.result.windowStart);
  const crossing = (net: string, level: number, rising: boolean, deckTime: number): Crossing => ({
    node: ctx.node(net),
    level,
    rising,
    td: Math.max(0, anchorBefore(deckTime, window)),
  });
  const out: Quantity[] = [];
  m.deadTimes.forEach((d, i) => {
    const from = m.cycles[d.from]!;
    const start = toDeck(from.fall);
    for (const [kind, level, value] of [
      ['dead', 0.5, d.t50],
      ['gap', GAP_LEVEL, d.gap],
    ] as const) {
      out.push({
        name: `${kind}_${i + 1}`,
        kind,
        label: `${kind} ${d.from}->${d.to}`,
        model: value,
        trig: crossing(d.from, level * vdd, false, start),
        targ: crossing(d.to, level * vdd, true, start + d.t50),
      });
    }
  });
  Object.entries(m.widths).forEach(([net, width], i) => {
    const rise = toDeck(m.cycles[net]!.rise);
    out.push({
      name: `width_${i + 1}`,
      kind: 'width',
      label: `width ${net}`,
      model: width,
      trig: crossing(net, 0.5 * vdd, true, rise),
      targ: crossing(net, 0.5 * vdd, false, rise + width),
    });
  });
  let k = 0;
  const cycles = new CycleIndex(ctx.result, ctx.netlist);
  const shape = ctx.timing ? modelEdgeShape(cycles, ctx.netlist, ctx.timing) : undefined;
  ctx.switches.forEach((plan, i) => {
    const sigMin = levelAt(plan.signal.min, vdd);
    const sigMax = levelAt(plan.signal.max, vdd);
    const ends = sigMin === sigMax ? [sigMin] : [sigMin, sigMax];
    plan.devices.forEach((device, j) => {
      const wave = gateWave(
        plan,
        device,
        cycles,
        vdd,
        deviceShifter(plan, j, cycles, devices, { sizes: ctx.shifterSizes?.[i], shape }),
        shape,
      );
      if (typeof wave === 'string') return;
      // A level-shifted gate is the shifter's output.
      const gate = plan.levelShifter ? shifterNode(i, j) : ctx.node(device.net);
      const d = device.kind === 'n' ? devices.n : devices.p;
      const { low, high } = wave.rise;
      for (const vs of ends) {
        const level = turnOnLevel(plan, device, d, vs, vdd, 0);
        if (!(level > low && level < high)) continue;
        const rise = rampCrossing(wave.rise, level);
        const fall = rampCrossing(wave.fall, level);
        const events: Array<['on' | 'off', number, boolean]> =
          device.kind === 'n'
            ? [
                ['on', rise, true],
                ['off', fall, false],
              ]
            : [
                ['on', fall, false],
                ['off', rise, true],
              ];
        for (const [event, time, rising] of events) {
          const at = toDeck(time);
          const clockEdge = at - wrapTime(at - window.start, T);
          k++;
          out.push({
            name: `sw_${k}`,
            kind: 'switch',
            label: `${plan.name}${plan.devices.length > 1 ? `.${device.kind}` : ''} ${event} @ ${Number(vs.toFixed(3))} V`,
            model: at - clockEdge,
            trig: {
              node: ctx.node(ctx.netlist.netNames[ctx.netlist.clock]!),
              level: 0.5 * vdd,
              rising: true,
              td: Math.max(0, clockEdge - 0.25 * window.duty * T),
            },
            targ: { node: gate, level, rising, td: Math.max(0, anchorBefore(at, window)) },
            event: { switch: plan.name, event, anchor: clockEdge },
          });
        }
      }
    });
  });
  return out;
}

function side(c: Crossing): string {
  return `v(${c.node}) VAL=${spiceNumber(c.level)} ${c.rising ? 'RISE' : 'FALL'}=1 TD=${spiceNumber(c.td)}`;
}

export function measureLine(q: Quantity): string {
  return `.meas tran ${q.name} TRIG ${side(q.trig)} TARG ${side(q.targ)}`;
}
