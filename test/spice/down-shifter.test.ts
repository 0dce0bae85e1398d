/**
 * The deck's shifter to a level below ground: its lines for a negative swing, and the shifter alone
 * in ngspice (Debian package ngspice; measured with ngspice-39) swinging between its rails with
 * the declared delay at the card's nominal corner.
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { cli, design, fixture, processCard, tempDir } from '../helpers.js';
import { requireTool } from '../tools.js';
import { loadDesign, loadProcess } from '../../src/cli/load.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { generatorDeck } from '../../src/spice/deck.js';
import { downShifterLines } from '../../src/spice/down-shifter.js';
import { sizeDownShifter } from '../../src/switches/down-shifter-sizing.js';
import { cornerModels } from '../../src/spice/models.js';
import { nominalCorner } from '../../src/switches/shifter-sizing.js';
import { parseSimulatorOutput } from '../../src/spice/results.js';

const card = loadProcess(processCard('generic180'));
const VDD = card.vddNominal;

describe('downShifterLines', () => {
  it("writes negative-pump.yaml's shifters as p pull-ups from VDD against an n latch on -VDD, the n devices' bodies at -VDD", () => {
    const { design: d, card: c } = loadDesign(design('negative-pump'));
    const resolved = resolveDesign(d, c);
    const corner = resolved.corners.find((r) => r.corner.name === 'tt/1.8V/27C')!.corner;
    const text = generatorDeck(resolved, corner, { modelPath: 'm.lib' }).text;
    const low = /^v(bias\d+) \1 0 DC -1\.8$/m.exec(text)![1]!;
    // s_gnd (switch 1) inverts: the complement of p1 (VDD - v) drives it.
    expect(text).toMatch(/^els1_0 ls1_0_in vdd 0 p1 1$/m);
    expect(text).toMatch(/^els3_0 ls3_0_in 0 p2 0 1$/m);
    for (const id of ['ls1_0', 'ls3_0']) {
      const line = (name: string) => new RegExp(`^m${id}_${name} .*$`, 'm').exec(text)![0].split(' ').slice(1, 6);
      expect(line('p1')).toEqual([`${id}_x`, `${id}_set`, 'vdd', 'vdd', 'pch']);
      expect(line('p2')).toEqual([`${id}_y`, `${id}_inb`, 'vdd', 'vdd', 'pch']);
      expect(line('n1')).toEqual([`${id}_x`, `${id}_y`, low, low, 'nch']);
      expect(line('n2')).toEqual([`${id}_y`, `${id}_x`, low, low, 'nch']);
      // Output inverter from -VDD to the 0 V high level, its p device's n-well at 0 V.
      expect(line('o1')).toEqual([id, `${id}_x`, low, low, 'nch']);
      expect(line('o2')).toEqual([id, `${id}_x`, '0', '0', 'pch']);
      // The skewed buffer's weak device is its first stage's p.
      expect(line('b2')).toEqual([`${id}_mid`, `${id}_in`, 'vdd', 'vdd', 'pch']);
    }
    // The switches sit on the shifters' outputs; s_neg's body at -VDD.
    expect(text).toMatch(new RegExp(`^msw3_0 \\S+ ls3_0 \\S+ ${low} nch `, 'm'));
    expect(text).toMatch(/^\* s_gnd: cross-coupled level shifter down to a low level below ground, inverting /m);
  });

  it('puts the output p n-well at ground and the latch on the low level when both levels are below ground', () => {
    const ls = { delay: 600e-12, transition: 300e-12, low: { scale: -2, offset: 0 }, high: { scale: -1, offset: 0 }, invert: false };
    const size = sizeDownShifter(ls, card, 30e-15, 200e-12);
    const lines = downShifterLines('ls', 'x', 'in', 'out', ls, { vdd: 'vdd', low: 'm2', high: 'm1', outputWell: '0' }, size, {
      l: card.lmin,
      diffusion: 0,
      nModel: 'nch',
      pModel: 'pch',
    });
    expect(lines.find((l) => l.startsWith('mls_o2 '))).toMatch(/^mls_o2 out ls_x m1 0 pch /);
    expect(lines.find((l) => l.startsWith('mls_o1 '))).toMatch(/^mls_o1 out ls_x m2 m2 nch /);
    expect(lines.find((l) => l.startsWith('mls_n1 '))).toMatch(/^mls_n1 ls_x ls_y m2 m2 nch /);
  });
});

describe('a shifter below ground alone in ngspice', () => {
  requireTool('ngspice', 'ngspice');
  const corner = nominalCorner(card, 0.5);
  const models = cornerModels(card, corner, fixture('models', 'generic180.lib'));
  const T = 20e-9;
  const INPUT = 200e-12;
  const LOAD = 40e-15;

  function simulate(low: number, high: number, delay: number): ReadonlyMap<string, number | null> {
    const level = (v: number) => ({ scale: v / VDD, offset: 0 });
    const ls = { delay, transition: 250e-12, low: level(low), high: level(high), invert: false };
    const size = sizeDownShifter(ls, card, LOAD, INPUT);
    const rail = (v: number) =>
      v === 0 ? '0' : v === VDD ? 'vdd' : v < 0 ? `m${String(-v).replace('.', 'p')}` : `r${String(v).replace('.', 'p')}`;
    const rails = { vdd: 'vdd', low: rail(low), high: rail(high), outputWell: rail(Math.max(0, high)) };
    const mid = (low + high) / 2;
    const window = `TD=${T}`;
    const names = ['d_rise', 'd_fall', 'v_low', 'v_high'];
    const deck = [
      'shifter below ground',
      ...models.header,
      `vsupply vdd 0 DC ${VDD}`,
      ...[...new Set([low, high])].filter((v) => v !== 0 && v !== VDD).map((v) => `v${rail(v)} ${rail(v)} 0 DC ${v}`),
      `vin in 0 PULSE(0 ${VDD} 1n ${INPUT} ${INPUT} ${T / 2 - INPUT} ${T})`,
      ...downShifterLines('ls', 'alone', 'in', 'out', ls, rails, size, { ...models.geometry, l: card.lmin }),
      `cload out 0 ${LOAD}`,
      `.tran ${T / 4000} ${2.2 * T} 0 ${T / 4000}`,
      `.meas tran d_rise TRIG v(in) VAL=${VDD / 2} RISE=1 ${window} TARG v(out) VAL=${mid} RISE=1 ${window}`,
      `.meas tran d_fall TRIG v(in) VAL=${VDD / 2} FALL=1 ${window} TARG v(out) VAL=${mid} FALL=1 ${window}`,
      // The settled levels, just before each input edge (the edges themselves kick the output past its rails).
      `.meas tran v_high FIND v(out) AT=${1.5 * T}`,
      `.meas tran v_low FIND v(out) AT=${2 * T}`,
      '.end',
      '',
    ].join('\n');
    const dir = tempDir();
    writeFileSync(join(dir, 'alone.cir'), deck);
    const run = spawnSync('ngspice', ['-b', 'alone.cir'], { encoding: 'utf8', cwd: dir });
    expect(run.status, run.stderr).toBe(0);
    const parsed = parseSimulatorOutput(`${run.stdout}${run.stderr}`, names);
    expect(parsed.errors).toEqual([]);
    return parsed.values;
  }

  // Delays within the sizing fits' worst errors (rise 28 %, fall 10 % over 60 ngspice runs: down-shifter-sizing.ts).
  // Measured (ngspice-39): -VDD..0 455.1 / 513.1 ps against 500 ps; -2 VDD..-VDD 794.1 / 832.0 ps against 800 ps;
  // -VDD/2..VDD/2 514.1 / 507.3 ps against 500 ps (rising / falling).
  it.each([
    [-VDD, 0, 500e-12],
    [-2 * VDD, -VDD, 800e-12],
    [-VDD / 2, VDD / 2, 500e-12],
  ])('swings from %s V to %s V with the declared %s s delay on both edges', (low, high, delay) => {
    const m = simulate(low, high, delay);
    expect(Math.abs(m.get('v_low')! - low)).toBeLessThan(0.01 * VDD);
    expect(Math.abs(m.get('v_high')! - high)).toBeLessThan(0.01 * VDD);
    expect(Math.abs(m.get('d_rise')! - delay) / delay).toBeLessThan(0.28);
    expect(Math.abs(m.get('d_fall')! - delay) / delay).toBeLessThan(0.1);
  });
});

describe('generatorDeck with a shifter both below ground and above VDD', () => {
  it('refuses it, naming the switch and the levels (exit 2, nothing written)', () => {
    const dir = tempDir();
    const out = join(dir, 'x.cir');
    const run = cli('spice', design('negative-pump'), '--corner', 'tt/1.8V/27C', '--set', 'switches[1].levelShifter.high=2vdd', '-o', out);
    expect(run.code).toBe(2);
    expect(run.stderr).toContain('switches.s_gnd.levelShifter: "-1.8 V .. 3.6 V" cannot be written at transistor level');
    expect(existsSync(out)).toBe(false);
  });
});
