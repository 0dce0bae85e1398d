import { describe, it, expect } from 'vitest';
import { evaluateAll } from '../../src/analysis/evaluate.js';
import type { Check } from '../../src/checks/check.js';
import { switchFaultAdvice, switchFaults } from '../../src/checks/bias-checks.js';
import { InputError } from '../../src/errors.js';
import { expectClose, resolveYaml } from '../helpers.js';

/** A small pump on generic180 at one or more corners, with the given nodes and switches. */
function pump(nodes: string, switches: string, corners = '{ process: tt, vdd: 1.8V, temperature: 27 }'): string {
  return `
name: t
process: ignored
clock: { frequency: 20MHz, transition: 200ps }
generator: { template: nand, stages: 4, stageLoad: 20fF }
corners: { list: [${corners}] }
nodes:
${nodes}
switches:
${switches}
`;
}

const PLATES = `  bottom: { phase1: 0V, phase2: vdd }
  top: { phase1: vdd, phase2: { min: 1.6vdd, max: 2vdd } }`;

function checksOf(yaml: string): Check[] {
  return evaluateAll(resolveYaml(yaml))[0]!.checks.filter((c) => c.kind === 'off-state' || c.kind === 'on-state' || c.kind === 'stress');
}

const find = (checks: Check[], kind: string, sw: string) => checks.find((c) => c.kind === kind && c.switch === sw)!;

/** 2 decades at n = 1.5 and 27 °C: 2 * 1.5 * kT/q * ln 10 = 0.178669 V (k/q from CODATA 2018). */
const ALLOWANCE_27C = 0.178669;

describe('biasChecks: off-state', () => {
  it('fails a p charge switch with a 0..VDD gate in phase 2 and names the reverse conduction', () => {
    const checks = checksOf(
      pump(
        PLATES,
        `  - { name: s_chg, type: pmos, w: 30um, l: 0.18um, gate: p1, driver: [{ cell: INV }], terminals: [vdd, top], bulk: vdd }`,
      ),
    );
    const off = find(checks, 'off-state', 's_chg');
    expect(off.pass).toBe(false);
    expect(off.phase).toBe('phase p2');
    // |V_T| 0.45 V (body 1.8 V below the 3.6 V source: no body effect) - 0.178669 V - V_SG 1.8 V.
    expectClose(off.margin!, 0.45 - ALLOWANCE_27C - 1.8, 1e-5, 'abs');
    expect(off.detail).toMatch(/phase p2/);
    expect(off.detail).toMatch(/top at 3\.600 V acts as source/);
    expect(off.detail).toMatch(/reverse conduction/);
  });

  it('holds an n charge switch off in phase 2 with its gate at VDD and body at VDD: margin V_T - allowance', () => {
    const checks = checksOf(
      pump(
        PLATES,
        `  - { name: s_chg, type: nmos, w: 10um, l: 0.18um, gate: p1, levelShifter: { delay: 300ps, low: vdd, high: 2vdd }, terminals: [vdd, top], bulk: vdd }`,
      ),
    );
    const off = find(checks, 'off-state', 's_chg');
    expect(off.pass).toBe(true);
    expectClose(off.margin!, 0.45 - ALLOWANCE_27C, 1e-5, 'abs');
  });

  it('uses offMargin instead of the decades rule when given, and offDecades when given', () => {
    const sw = `  - { name: s_gnd, type: nmos, w: 10um, l: 0.18um, gate: p1, terminals: [bottom, 0V] }`;
    const withMargin = `${pump(PLATES, sw)}requirements: { offMargin: 100mV }\n`;
    expectClose(find(checksOf(withMargin), 'off-state', 's_gnd').margin!, 0.45 - 0.1, 1e-9, 'abs');
    const withDecades = `${pump(PLATES, sw)}requirements: { offDecades: 3 }\n`;
    expectClose(find(checksOf(withDecades), 'off-state', 's_gnd').margin!, 0.45 - 1.5 * ALLOWANCE_27C, 1e-5, 'abs');
  });

  it('checks a tgate only where both devices are off, each against the terminal that would turn it on', () => {
    const yaml = pump(
      '  vin: { min: 0.3V, max: 1.3V }\n  cs: { min: 0.3V, max: 1.3V }',
      '  - { name: s1, type: tgate, w: 12um, wp: 36um, l: 0.18um, gate: p1, gateBar: p1b, terminals: [vin, cs] }',
    ).replace('stageLoad: 20fF', 'stageLoad: 20fF, complementary: true');
    const off = find(checksOf(yaml), 'off-state', 's1');
    // n device: gate 0 V, the 0.3 V terminal as source over a 0 V body: V_T(0.3 V) = 0.45 + 0.45
    // (sqrt(1.0) - sqrt(0.7)) = 0.523502 V (body-effect law, 2 phi_F = 0.7 V at 27 C), margin
    // 0.523502 - 0.178669 + 0.3 = 0.644833 V. The p device (gate 1.8 V, source 1.3 V, body 1.8 V:
    // |V_T| = 0.45 + 0.4 (sqrt(1.2) - sqrt(0.7)) = 0.554 V) keeps 0.875 V.
    expect(off.phase).toBe('phase p2');
    expectClose(off.margin!, 0.644833, 1e-5, 'abs');
  });
});

describe('biasChecks: on-state', () => {
  it('fails a p switch whose VDD..2VDD gate cannot turn it on from a VDD terminal', () => {
    const checks = checksOf(
      pump(
        PLATES,
        `  - { name: s_chg, type: pmos, w: 30um, l: 0.18um, gate: p1, levelShifter: { delay: 300ps, low: vdd, high: 2vdd, invert: true }, terminals: [vdd, top] }`,
      ),
    );
    const on = find(checks, 'on-state', 's_chg');
    expect(on.pass).toBe(false);
    expect(on.phase).toBe('phase p1');
    expect(on.detail).toMatch(/does not conduct at 1\.800 V/);
  });

  it('measures the overdrive at the worst terminal level: the highest for an n switch', () => {
    const checks = checksOf(
      pump(
        PLATES,
        `  - { name: s_chg, type: nmos, w: 10um, l: 0.18um, gate: p1, levelShifter: { delay: 300ps, low: vdd, high: 2vdd }, terminals: [vdd, top], bulk: vdd }`,
      ),
    );
    // Phase 1: gate 3.6 V, both terminals 1.8 V, body 1.8 V: 3.6 - 1.8 - 0.45 = 1.35 V.
    expectClose(find(checks, 'on-state', 's_chg').margin!, 1.35, 1e-9, 'abs');
  });
});

describe('biasChecks: stress', () => {
  it('fails a forward-biased junction: a p switch whose top terminal rises above its VDD body', () => {
    const checks = checksOf(
      pump(
        PLATES,
        `  - { name: s_chg, type: pmos, w: 30um, l: 0.18um, gate: p1, driver: [{ cell: INV }], terminals: [vdd, top], bulk: vdd }`,
      ),
    );
    const stress = find(checks, 'stress', 's_chg');
    expect(stress.pass).toBe(false);
    expectClose(stress.margin!, 1.8 - 3.6, 1e-9, 'abs');
    expect(stress.detail).toMatch(/forward-biased/);
  });

  it('fails |V_GB| = 2 x 1.98 V = 3.96 V on a device rated 2.2 V (body at 2 VDD, gate at 0 V) at the high supply corner', () => {
    const checks = checksOf(
      pump(PLATES, `  - { name: s_chg, type: pmos, w: 30um, l: 0.18um, gate: p1, driver: [{ cell: INV }], terminals: [vdd, top] }`),
    );
    const high = evaluateAll(
      resolveYaml(
        pump(
          PLATES,
          `  - { name: s_chg, type: pmos, w: 30um, l: 0.18um, gate: p1, driver: [{ cell: INV }], terminals: [vdd, top] }`,
          '{ process: tt, vdd: 1.98V, temperature: 27 }',
        ),
      ),
    )[0]!.checks.find((c) => c.kind === 'stress')!;
    // Undeclared body of a p switch: the highest level it sees, 2 VDD. In phase 1 its gate is at 0 V.
    expect(high.pass).toBe(false);
    expectClose(high.margin!, 2.2 - 3.96, 1e-9, 'abs');
    expect(high.detail).toMatch(/\|V_GB\| 3\.960 V exceeds the p-device rating 2\.200 V/);
    expectClose(find(checks, 'stress', 's_chg').margin!, 2.2 - 3.6, 1e-9, 'abs');
  });

  it('passes the boosted n charge switch: no pair of its terminals sees more than VDD (margin 2.2 - 1.8 V)', () => {
    const checks = checksOf(
      pump(
        PLATES,
        `  - { name: s_chg, type: nmos, w: 10um, l: 0.18um, gate: p1, levelShifter: { delay: 300ps, low: vdd, high: 2vdd }, terminals: [vdd, top], bulk: vdd }`,
      ),
    );
    expectClose(find(checks, 'stress', 's_chg').margin!, 0.4, 1e-9, 'abs');
  });
});

describe('biasChecks: older signal form', () => {
  it('keeps reading it, names the checks as limited and warns', () => {
    const resolved = resolveYaml(
      pump(PLATES, `  - { name: s_chg, type: pmos, w: 30um, l: 0.18um, gate: p1, driver: [{ cell: INV }], signal: vdd }`),
    );
    expect(resolved.warnings).toHaveLength(1);
    expect(resolved.warnings[0]).toMatch(/s_chg: terminals undeclared/);
    const off = evaluateAll(resolved)[0]!.checks.find((c) => c.kind === 'off-state')!;
    expect(off.name).toBe('s_chg holds off (terminals undeclared)');
    expect(off.pass).toBe(true);
  });
});

describe('switchFaults', () => {
  it('names each failing switch once with its failing kinds, and advice that no delay chain fixes it', () => {
    const faults = switchFaults(
      evaluateAll(
        resolveYaml(
          pump(
            PLATES,
            `  - { name: s_chg, type: pmos, w: 30um, l: 0.18um, gate: p1, driver: [{ cell: INV }], terminals: [vdd, top], bulk: vdd }`,
          ),
        ),
      ).map((r) => ({ name: r.corner.name, checks: r.checks })),
    );
    expect(faults.map((f) => [f.switch, f.kinds])).toEqual([['s_chg', ['off-state', 'stress']]]);
    expect(switchFaultAdvice(faults)).toMatch(/^no delay chain can fix s_chg \(off-state, stress\)/);
    expect(switchFaultAdvice([])).toBeNull();
  });
});

describe('terminal input errors', () => {
  const bad = (nodes: string, sw: string) => {
    try {
      resolveYaml(pump(nodes, sw));
    } catch (e) {
      if (e instanceof InputError) return e.issues[0]!;
      throw e;
    }
    throw new Error('no error');
  };
  it('names an unknown terminal, the nodes declared and the allowed levels', () => {
    const issue = bad(PLATES, `  - { name: s, type: nmos, w: 1um, l: 0.18um, gate: p1, terminals: [bottm, 0V] }`);
    expect(issue).toMatchObject({ code: 'reference.unknown', path: ['switches', 0, 'terminals', 0], value: '"bottm"' });
    expect(issue.expected).toMatch(/bottom, top/);
  });
  it('rejects a node named like a level', () => {
    expect(bad('  vdd: 1V', `  - { name: s, type: nmos, w: 1um, l: 0.18um, gate: p1, terminals: [vdd, 0V] }`).path).toEqual([
      'nodes',
      'vdd',
    ]);
  });
  it('rejects terminals together with signal', () => {
    expect(bad(PLATES, `  - { name: s, type: nmos, w: 1um, l: 0.18um, gate: p1, terminals: [bottom, 0V], signal: 0V }`).path).toEqual([
      'switches',
      0,
      'signal',
    ]);
  });
  it('rejects a switch connecting a node to itself', () => {
    expect(bad(PLATES, `  - { name: s, type: nmos, w: 1um, l: 0.18um, gate: p1, terminals: [top, top] }`).path).toEqual([
      'switches',
      0,
      'terminals',
    ]);
  });
});
