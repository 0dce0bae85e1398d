import { describe, it, expect } from 'vitest';
import { evaluateCorner } from '../../src/analysis/evaluate.js';
import { handoverGap, handoverPath } from '../../src/checks/switch-checks.js';
import type { SwitchConduction } from '../../src/switches/conduction.js';
import { modelCrossings } from '../../src/measure/levels.js';
import { CycleIndex } from '../../src/measure/phases.js';
import { devicesAtCorner } from '../../src/process/device.js';
import { cli, design as demoDesign, expectClose, resolveYaml, TYPICAL_ONLY } from '../helpers.js';

const design = (constraints: string, guard = '0') => `
name: t
process: unused
clock: { frequency: 20MHz, transition: 200ps }
generator: { template: nand, stages: 4, stageLoad: 30fF, buffer: [2, 6, 18] }
loads: { p1: 0.5pF, p2: 0.5pF }
corners: { process: [tt], vdd: [1.8V], temperature: [27] }
requirements: { guard: ${guard} }
switches:
  - { name: a, type: nmos, w: 4um, l: 0.18um, gate: p1, signal: 0V }
  - { name: b, type: nmos, w: 4um, l: 0.18um, gate: p2, signal: 0V }
constraints:
${constraints}`;

function run(text: string) {
  const resolved = resolveYaml(text);
  return evaluateCorner(resolved, resolved.corners[0]!.corner);
}

describe('break-before-make', () => {
  it("equals the 50 % dead time minus both switches' crossing offsets (hand case)", () => {
    const resolved = resolveYaml(design('  breakBeforeMake: [{ between: [a, b] }]', '25ps'));
    const corner = resolved.corners[0]!.corner;
    const r = evaluateCorner(resolved, corner);
    const m = r.measurement;
    if (!m.ok) throw new Error(m.reason);
    // Two nmos switches passing 0 V with no body effect open and close at V_G = V_TN = 0.45 V
    // (generic180, tt/27C), 0.45/1.8 = 25 % of the swing. Each gate net's edge crosses that level
    // where the delay model's edge shape puts it (modelCrossings, the same shape the gap level's
    // crossings take), not on a linear ramp: a turns off that long after p1's 50 % fall, b turns
    // on that long before p2's 50 % rise, so margin = dead - (off offset + on offset) - guard, at
    // each handover.
    const { netlist, loads, model } = resolved;
    const timing = model.bind(netlist, loads, devicesAtCorner(resolved.card, corner));
    const index = new CycleIndex(r.simulation, netlist);
    const c1 = modelCrossings(m.cycles.p1!, index, netlist, timing, 0.45 / 1.8);
    const c2 = modelCrossings(m.cycles.p2!, index, netlist, timing, 0.45 / 1.8);
    const offsets12 = c1.fall - c2.rise;
    const offsets21 = c2.fall - c1.rise;
    const [d12, d21] = m.deadTimes;
    const expected12 = d12.t50 - offsets12 - 25e-12;
    const expected21 = d21.t50 - offsets21 - 25e-12;
    // The model's switch-instant error (3.1 % of each handover's path on generic180) comes off each
    // handover; the path is the dead time plus both crossing offsets.
    const path12 = d12.t50 + offsets12;
    const path21 = d21.t50 + offsets21;
    const [a, b] = r.switches;
    expectClose(handoverPath(a!, b!, 50e-9), path12, 1e-15, 'abs');
    expectClose(handoverPath(b!, a!, 50e-9), path21, 1e-15, 'abs');
    const bbm = r.checks.find((c) => c.kind === 'break-before-make')!;
    expectClose(bbm.margin!, Math.min(expected12 - 0.031 * path12, expected21 - 0.031 * path21), 1e-15, 'abs');
    expect(bbm.margin!).toBeLessThan(Math.min(d12.t50, d21.t50));
  });

  it("is not a pass when the handover clears its guard by less than the model's measured error, and says so", () => {
    const clear = run(design('  breakBeforeMake: [{ between: [a, b] }]'));
    const bbm0 = clear.checks.find((c) => c.kind === 'break-before-make')!;
    const raw = Math.min(...bbm0.parts!.map((p) => p.span!));
    // A guard 10 ps below the model's handover: the model alone would pass by 10 ps.
    const guard = `${((raw - 10e-12) * 1e12).toFixed(3)}ps`;
    const r = run(design(`  breakBeforeMake: [{ between: [a, b], guard: ${guard} }]`));
    const bbm = r.checks.find((c) => c.kind === 'break-before-make')!;
    expect(bbm.pass).toBe(false);
    expect(bbm.margin!).toBeLessThan(0);
    expect(bbm.detail).toContain("less than the model's measured switch-instant error");
  });

  it('fails when the guard exceeds the handover gap', () => {
    const r = run(design('  breakBeforeMake: [{ between: [a, b], guard: 5ns }]'));
    const bbm = r.checks.find((c) => c.kind === 'break-before-make')!;
    expect(bbm.pass).toBe(false);
    expect(bbm.margin!).toBeLessThan(0);
  });
});

describe('handoverGap', () => {
  const sw = (on: number, off: number): SwitchConduction => ({
    name: 's',
    type: 'nmos',
    status: 'switching',
    detail: '',
    on,
    off,
    onLatest: on,
    offEarliest: off,
    ron: 1,
  });
  it('is the wait when the second starts while the first is off, across the period boundary too', () => {
    expectClose(handoverGap(sw(0, 20e-9), sw(21e-9, 45e-9), 50e-9), 1e-9, 1e-12);
    expectClose(handoverGap(sw(21e-9, 45e-9), sw(50.5e-9, 70e-9), 50e-9), 5.5e-9, 1e-12);
  });
  it('is minus the overlap when the second starts before the first stops', () => {
    expectClose(handoverGap(sw(0, 20e-9), sw(19.7e-9, 45e-9), 50e-9), -0.3e-9, 1e-12);
  });
});

describe('order', () => {
  it('measures the early phase switch opening before the main one (bottom-plate sampling)', () => {
    const text = design('  order: [{ first: { switch: e, event: off }, then: { switch: a, event: off }, min: 10ps }]')
      .replace('buffer: [2, 6, 18] }', 'buffer: [2, 6, 18], earlyTap: 2 }')
      .replace('switches:\n', 'switches:\n  - { name: e, type: nmos, w: 4um, l: 0.18um, gate: p1e, signal: 0V }\n');
    const r = run(text);
    const order = r.checks.find((c) => c.kind === 'order')!;
    const e = r.switches.find((s) => s.name === 'e')!;
    const a = r.switches.find((s) => s.name === 'a')!;
    expectClose(order.margin!, a.offEarliest - e.off - 10e-12, 1e-15, 'abs');
    expect(order.pass).toBe(true);
  });
});

describe('settle', () => {
  it('requires ln(1/eps) * R_on * C of on-window and fails when the capacitance is too big', () => {
    const small = run(design('  settle: [{ name: p, switches: [a], capacitance: 1pF, bits: 10 }]'));
    const big = run(design('  settle: [{ name: p, switches: [a], capacitance: 2nF, bits: 10 }]'));
    const a = small.switches[0]!;
    const window = a.offEarliest - a.onLatest;
    const need = Math.log(2 ** 11) * a.ron * 1e-12;
    expectClose(small.checks.find((c) => c.kind === 'settle')!.margin!, window - need, 1e-15, 'abs');
    expect(big.checks.find((c) => c.kind === 'settle')!.pass).toBe(false);
  });
});

describe('settle with an on-window longer than half a period', () => {
  it('follows the phase width one for one as the duty grows past 0.5', () => {
    const at = (duty: number) => {
      const r = JSON.parse(cli('check', demoDesign('doubler'), '--json', '--set', `corners.duty=[${duty}]`, ...TYPICAL_ONLY).stdout) as {
        corners: Array<{ widths: Record<string, number>; checks: Array<{ kind: string; margin: number }> }>;
      };
      const c = r.corners[0]!;
      return { width: c.widths.p1!, settle: c.checks.find((k) => k.kind === 'settle')!.margin };
    };
    const half = at(0.5);
    const long = at(0.58);
    expect(long.width).toBeGreaterThan(25e-9);
    expect(long.settle).toBeGreaterThan(half.settle);
    expectClose(long.settle - half.settle, long.width - half.width, 1e-13, 'abs');
  });
});

describe('switchChecks: subjects and parts', () => {
  it('gives a break-before-make check both handovers, each with its own span from the turn-off and margin', () => {
    const resolved = resolveYaml(design('  breakBeforeMake: [{ between: [a, b] }]', '25ps'));
    const r = evaluateCorner(resolved, resolved.corners[0]!.corner);
    const bbm = r.checks.find((c) => c.kind === 'break-before-make')!;
    const [a, b] = ['a', 'b'].map((n) => r.switches.find((s) => s.name === n)!) as [SwitchConduction, SwitchConduction];
    const period = 1 / 20e6;
    expect(bbm.subject).toBe(resolved.switchCheckLabels.subjects[0]);
    expect(bbm.subject).toMatchObject({
      type: 'switch-events',
      constraint: 'break-before-make',
      min: 25e-12,
      label: 'a/b',
      named: false,
      handovers: [
        { first: { switch: 'a', event: 'off' }, then: { switch: 'b', event: 'on' } },
        { first: { switch: 'b', event: 'off' }, then: { switch: 'a', event: 'on' } },
      ],
    });
    // Each part needs the guard plus the model's switch-instant error on its path (3.1 % on generic180).
    const errAb = 0.031 * handoverPath(a, b, period);
    const errBa = 0.031 * handoverPath(b, a, period);
    expect(bbm.parts).toEqual([
      { margin: handoverGap(a, b, period) - errAb - 25e-12, start: a.off, span: handoverGap(a, b, period), need: 25e-12 + errAb },
      { margin: handoverGap(b, a, period) - errBa - 25e-12, start: b.off, span: handoverGap(b, a, period), need: 25e-12 + errBa },
    ]);
    expect(bbm.margin).toBe(Math.min(bbm.parts![0]!.margin, bbm.parts![1]!.margin));
  });

  it('gives an order check one part from the first event, its minimum as need', () => {
    const resolved = resolveYaml(design('  order: [{ first: { switch: a, event: off }, then: { switch: b, event: on }, min: 10ps }]'));
    const r = evaluateCorner(resolved, resolved.corners[0]!.corner);
    const order = r.checks.find((c) => c.kind === 'order')!;
    const a = r.switches.find((s) => s.name === 'a')!;
    expect(order.subject).toMatchObject({ type: 'switch-events', constraint: 'order', min: 10e-12, label: 'order 1' });
    expect(order.parts).toHaveLength(1);
    const part = order.parts![0]!;
    expect(part.start).toBe(a.off);
    expect(part.need).toBe(10e-12);
    expect(part.margin).toBe(order.margin);
    expect(part.span! - 10e-12).toBe(order.margin);
  });
});
