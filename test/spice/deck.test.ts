import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { cli, design, expectClose, tempDir } from '../helpers.js';
import { parseSimulatorOutput } from '../../src/spice/results.js';
import { loadDesign } from '../../src/cli/load.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { generatorDeck } from '../../src/spice/deck.js';
import { cellSubckt } from '../../src/spice/cells.js';
import { breakBeforeMakeMargins } from '../../src/spice/switch-margins.js';
import { evaluateCorner } from '../../src/analysis/evaluate.js';
import { requireTool } from '../tools.js';

function measureNames(deck: string): string[] {
  return [...deck.matchAll(/^\.meas tran (\S+)/gm)].map((m) => m[1]!);
}

describe('phasegap spice', () => {
  requireTool('ngspice', 'ngspice');
  it('writes a deck that ngspice (Debian package ngspice) runs without error, every .meas giving a value', () => {
    const dir = tempDir();
    const out = join(dir, 'doubler.cir');
    const written = cli('spice', design('doubler'), '--corner', 'ss/1.62V/125C', '-o', out);
    expect(written.code).toBe(0);
    const text = readFileSync(out, 'utf8');
    const names = measureNames(text);
    // Two dead times and two gaps, two widths, on/off of the three direct switches, and on/off at
    // both ends of its signal range of the level-shifted one, and the drain current of an R_on
    // bench per switch and signal end (s_gnd, s_chg, s_vdd one each, s_out two).
    expect(names.length).toBe(4 + 2 + 6 + 4 + 5);
    const run = spawnSync('ngspice', ['-b', out], { encoding: 'utf8', cwd: dir });
    expect(run.status).toBe(0);
    const parsed = parseSimulatorOutput(`${run.stdout}${run.stderr}`, names);
    expect(parsed.errors).toEqual([]);
    for (const name of names) {
      const value = parsed.values.get(name);
      expect(value, name).not.toBeNull();
      // An R_on bench reads a drain current, signed as ngspice signs it; every other value is a time.
      expect(Number.isFinite(value!) && (name.startsWith('i_ron') ? value !== 0 : value! > 0), name).toBe(true);
    }
  });

  it('includes the model file relative to the deck and sets the corner supply, temperature and parameters', () => {
    const dir = tempDir();
    const out = join(dir, 'd.cir');
    expect(cli('spice', design('doubler'), '--corner', 'ff/1.98V/-40C', '-o', out).code).toBe(0);
    const text = readFileSync(out, 'utf8');
    expect(text).toMatch(/^\.include ".*fixtures\/models\/generic180\.lib"$/m);
    expect(text).toMatch(/^\.temp -40$/m);
    expect(text).toMatch(/^vsupply vdd 0 DC 1\.98$/m);
    expect(text).toMatch(/^\.param dvthn=-0\.06$/m);
    expect(text).toMatch(/^\.param driven=1\.15$/m);
    // All four switches are devices; the high-side one sits on its level shifter's output.
    expect(text.match(/^msw/gm)?.length).toBe(4);
    expect(text).toMatch(/^msw3_0 \S+ ls3_0 /m);
  });

  it('builds the level shifter from transistors with the declared delay at the nominal corner, and the shifted gate crosses each turn-on level when the model says (ngspice)', () => {
    const dir = tempDir();
    const out = join(dir, 'ls.cir');
    expect(cli('spice', design('doubler'), '--corner', 'tt/1.8V/27C', '-o', out).code).toBe(0);
    const written = readFileSync(out, 'utf8');
    // An inverting shifter from VDD to 2 VDD (doubler.yaml): the complement of p2 (VDD - v) drives
    // it; the latch and the output stage sit on the 2 VDD rail, the output's n device on VDD.
    expect(written).toMatch(/^els3_0 ls3_0_in vdd 0 p2 1$/m);
    expect(written).toMatch(/^mls3_0_p1 ls3_0_x ls3_0_y (bias\d+) \1 pch /m);
    expect(written).toMatch(/^mls3_0_o1 ls3_0 ls3_0_x vdd 0 nch /m);
    expect(written).not.toMatch(/adc_bridge|dac_bridge/);
    const { design: d, card } = loadDesign(design('doubler'));
    const resolved = resolveDesign(d, card);
    const deck = generatorDeck(resolved, resolved.corners.find((c) => c.corner.name === 'tt/1.8V/27C')!.corner, { modelPath: 'm.lib' });
    const shifted = deck.quantities.filter((q) => q.targ.node === 'ls3_0');
    expect(shifted.map((q) => q.label)).toEqual(['s_out on @ 2.88 V', 's_out off @ 2.88 V', 's_out on @ 3.6 V', 's_out off @ 3.6 V']);
    // The shifter's own delay, p2 at 50 % to its output at mid-swing (2.7 V), both edges.
    const window = 'TD=5.625e-8';
    const text = written.replace(
      /^\.end$/m,
      [
        `.meas tran ls_rise TRIG v(p2) VAL=0.9 FALL=1 ${window} TARG v(ls3_0) VAL=2.7 RISE=1 ${window}`,
        `.meas tran ls_fall TRIG v(p2) VAL=0.9 RISE=1 ${window} TARG v(ls3_0) VAL=2.7 FALL=1 ${window}`,
        '.end',
      ].join('\n'),
    );
    writeFileSync(out, text);
    const run = spawnSync('ngspice', ['-b', out], { encoding: 'utf8', cwd: dir });
    const parsed = parseSimulatorOutput(`${run.stdout}${run.stderr}`, [...shifted.map((q) => q.name), 'ls_rise', 'ls_fall']);
    // Declared 300 ps at the nominal corner; measured here (ngspice 42) 302.6 ps rising and 329.0 ps
    // falling, within the sizing fits' 10 %.
    expectClose(parsed.values.get('ls_rise')!, 300e-12, 0.1);
    expectClose(parsed.values.get('ls_fall')!, 300e-12, 0.1);
    for (const q of shifted) {
      // Measured here: 3.3 % to 5.9 % early, the phase net's own error carried through the shifter.
      const sim = parsed.values.get(q.name)!;
      expect(Math.abs(q.model - sim) / sim, q.label).toBeLessThan(0.07);
    }
  });

  it('says when the declared shifter delay is faster than the transistor-level shifter can be sized', () => {
    const dir = tempDir();
    const out = join(dir, 'fast.cir');
    expect(
      cli('spice', design('doubler'), '--corner', 'tt/1.8V/27C', '--set', 'switches[3].levelShifter.delay=100ps', '-o', out).code,
    ).toBe(0);
    const text = readFileSync(out, 'utf8');
    expect(text).toMatch(/^\* s_out: sized for .*; the declared 100 ps is faster than it can be sized$/m);
    expect(text.match(/^msw/gm)?.length).toBe(4);
  });

  it('sizes the cells as the model does: a NAND2 stack widened by its depth', () => {
    const text = cellSubckt('NAND2', 2, { wn: 0.5e-6, wp: 1e-6 }, { l: 0.18e-6, diffusion: 0.5e-6, nModel: 'nch', pModel: 'pch' });
    const widths = [...text.matchAll(/^(m[np]\d) .* W=(\S+)/gm)].map((m) => [m[1], Number(m[2])]);
    // logical effort (Sutherland, Sproull & Harris 1999): n devices 2 x 2 x 0.5 um, p devices 2 x 1 um
    expect(widths).toEqual([
      ['mn0', 2e-6],
      ['mn1', 2e-6],
      ['mp0', 2e-6],
      ['mp1', 2e-6],
    ]);
    expect(text).toMatch(/^mn0 y a0 sn1 0 nch/m);
    expect(text).toMatch(/^mn1 sn1 a1 0 0 nch/m);
  });

  it("writes diffusions as AD = W * Ldiff and PD = 2 * (W + Ldiff), none on a stack's internal node (common practice)", () => {
    const geo = { l: 0.18e-6, diffusion: 0.5e-6, nModel: 'nch', pModel: 'pch' };
    const text = cellSubckt('NAND2', 1, { wn: 0.5e-6, wp: 1e-6 }, geo);
    // n stack: 1 um devices; the output side 0.5 pm^2 and 3 um, the shared node sn1 nothing
    expect(text).toMatch(/^mn0 y a0 sn1 0 nch W=1e-6 L=1\.8e-7 AD=5e-13 AS=0 PD=3e-6 PS=0$/m);
    expect(text).toMatch(/^mn1 sn1 a1 0 0 nch W=1e-6 L=1\.8e-7 AD=0 AS=5e-13 PD=0 PS=3e-6$/m);
    // parallel p devices: both sides contacted
    expect(text).toMatch(/^mp0 y a0 vdd vdd pch W=1e-6 L=1\.8e-7 AD=5e-13 AS=5e-13 PD=3e-6 PS=3e-6$/m);
    const shared = cellSubckt('NAND2', 1, { wn: 0.5e-6, wp: 1e-6 }, { ...geo, stackJunctions: true });
    expect(shared).toMatch(/^mn0 y a0 sn1 0 nch W=1e-6 L=1\.8e-7 AD=5e-13 AS=2\.5e-13 PD=3e-6 PS=1\.5e-6$/m);
    expect(cellSubckt('INV', 1, { wn: 0.5e-6, wp: 1e-6 }, { ...geo, diffusion: 0 })).toMatch(/AD=0 AS=0 PD=0 PS=0$/m);
  });

  it('measures over the steady-state period: the model values sit inside the deck windows', () => {
    const { design: d, card } = loadDesign(design('doubler'));
    const resolved = resolveDesign(d, card);
    const corner = resolved.corners[4]!.corner;
    const deck = generatorDeck(resolved, corner, { modelPath: 'models.lib' });
    const dead = deck.quantities.find((q) => q.name === 'dead_1')!;
    expect(dead.label).toBe('dead p1->p2');
    // p1 falls after the clock's falling edge of the measured period.
    expect(dead.trig.td).toBeCloseTo(deck.window.start + corner.duty * deck.window.period, 15);
    expect(dead.model).toBeGreaterThan(0);
  });

  it('refuses a corner the design lacks, exit 2', () => {
    const bad = cli('spice', design('doubler'), '--corner', 'tt/3V/27C');
    expect(bad.code).toBe(2);
    expect(bad.stderr).toMatch(/--corner: "tt\/3V\/27C" is not a corner of the design/);
  });
});

describe('break-before-make from the deck instants', () => {
  it('gives, from the model side of the deck, exactly the margin check reports at that corner', () => {
    for (const name of ['doubler', 'too-tight']) {
      const { design: d, card } = loadDesign(design(name));
      const resolved = resolveDesign(d, card);
      for (const { corner } of [resolved.corners[0]!, resolved.corners[22]!, resolved.corners[44]!]) {
        const deck = generatorDeck(resolved, corner, { modelPath: 'm.lib' });
        const margins = breakBeforeMakeMargins(deck.quantities, () => null, deck.breakBeforeMake, deck.window.period);
        const checks = evaluateCorner(resolved, corner).checks.filter((c) => c.kind === 'break-before-make');
        expect(margins.map((m) => m.check)).toEqual(checks.map((c) => c.name));
        margins.forEach((m, i) => {
          // The deck's instants are the check's; the check then takes the switch-instant error band off.
          const c = checks[i]!;
          const guard = c.subject.type === 'switch-events' ? c.subject.min : NaN;
          expect(m.model).toBeCloseTo(Math.min(...c.parts!.map((p) => p.span!)) - guard, 15);
          expect(c.margin!).toBeLessThan(m.model);
        });
      }
    }
  });

  it('ngspice (Debian package ngspice) confirms too-tight.yaml breaks break-before-make at sf/1.98V/125C though its 50 % dead time is positive, and the model agrees', () => {
    const r = cli('confirm', design('too-tight'), '--corners', 'sf/1.98V/125C', '--json', '--jobs', '1');
    const corner = JSON.parse(r.stdout).corners[0];
    expect(corner.quantities.find((q: { quantity: string }) => q.quantity === 'dead p1->p2').simulator).toBeGreaterThan(0);
    const [bbm] = corner.breakBeforeMake;
    expect(bbm.check).toBe('s_high/s_low break-before-make + 50.0 ps');
    // The model's handover alone fails there too, 28 ps above ngspice's: confirm says the two agree;
    // check's margin, with the switch-instant band off it, is below both (test/checks/switch-band.test.ts).
    expect(bbm.model).toBeLessThan(0);
    expect(bbm.simulator).toBeLessThan(0);
    expect(bbm.agrees).toBe(true);
    // Measured here on the card's fitted alpha-power law, bent below full drive, and saturation voltage,
    // with the drains' Miller overlap and the shifter output's fitted edge: model -29.2 ps, ngspice 39
    // -49.6 ps (time step at most 10 ps) with the card's diffusions (AD = W * 0.5 um, no junctions
    // inside stacks) and s_high's transistor-level shifter, sized by the shifter fits re-made on
    // ngspice-39, and the switches' thresholds on SPICE level 3's temperature law: model -32.4 ps,
    // ngspice -53.7 ps (on the straight threshold law: -29.2 and -49.6 ps). With the earlier fits
    // (their sizing) and the shifter output a linear ramp: model -78.1 ps, ngspice -152.4 ps. The raw
    // model is 21 ps the less pessimistic of the two, which the check's switch-instant band covers
    // (it reports -127 ps). With each driving edge solved with its driver's own threshold and
    // opposing network: model -30.7 ps, ngspice -53.7 ps. With the shifter's edges fitted at every
    // corner and its latch fight against the p device's triode current: model -9.1 ps (45 ps the less
    // pessimistic; the check's band, 3.6 % of the path, still takes it to -54.9 ps). With the shifter
    // driven by p2's central slope (its tail no longer read as a slow input): model +7.9 ps, 62 ps
    // above ngspice; the band, then 5.0 % of the path, took the check to -54.9 ps. With the shifter's
    // first stages' switching points against the input ramp and its output stage's swing: model
    // -25.5 ps, 28 ps above ngspice; the band, now 3.1 % of the path, takes the check to -65.5 ps.
    expectClose(bbm.model, -25.5e-12, 1e-12, 'abs');
    expectClose(bbm.simulator, -53.7e-12, 10e-12, 'abs');
  });
});

describe('phasegap confirm without ngspice', () => {
  it('says how to install it and exits 2', () => {
    const r = cli('confirm', design('doubler'), '--corners', 'tt/1.8V/27C', '--ngspice', '/nonexistent/ngspice');
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/ngspice: "\/nonexistent\/ngspice" is not installed .*apt-get install ngspice/);
  });
});

describe('phasegap confirm', () => {
  requireTool('ngspice', 'ngspice');
  it('prints model and ngspice side by side and exits 1 when a difference exceeds the tolerance', () => {
    const junit = join(tempDir(), 'confirm.xml');
    const r = cli(
      'confirm',
      design('doubler'),
      '--model',
      'analytic',
      '--corners',
      'tt/1.8V/27C',
      '--tolerance',
      '0.5%',
      '--jobs',
      '1',
      '--junit',
      junit,
    );
    expect(r.code).toBe(1);
    expect(r.stdout.split('\n')[0]).toBe('verdict: FAIL (fails: simulator agreement)');
    expect(r.stdout).toMatch(/^ {2}simulator agreement: FAIL: \d+ quantities beyond 0\.5 % \(first: [^)]+ at tt\/1\.8V\/27C\)$/m);
    expect(r.stdout).toMatch(/^provenance: simulator: ngspice-\S+$/m);
    expect(readFileSync(junit, 'utf8')).toMatch(
      /<testcase classname="phasegap.confirm.dead" name="dead p1->p2 at tt\/1.8V\/27C">\s*<failure/,
    );
    expect(r.stdout).toMatch(/^doubler-clock: analytic model vs ngspice-\S+, tolerance 0\.5 %, 1 corner$/m);
    expect(r.stdout).toMatch(/^tt\/1\.8V\/27C\s+dead p1->p2\s+[\d.]+ ns\s+[\d.]+ ns\s+[-+][\d.]+ %\s+over$/m);
    expect(r.stdout).toMatch(/^verdict: DISAGREE \(0\/1 corners within tolerance, break-before-make verdicts alike for all 2 pairs\)$/m);
  });

  it('lists per corner and quantity the model, the simulator and the relative error in --json', () => {
    const r = cli(
      'confirm',
      design('doubler'),
      '--model',
      'analytic',
      '--corners',
      'ff/1.98V/-40C',
      '--tolerance',
      '0.5',
      '--json',
      '--jobs',
      '1',
    );
    expect(r.code).toBe(0);
    const report = JSON.parse(r.stdout) as {
      verdict: string;
      corners: Array<{ corner: string; quantities: Array<{ quantity: string; model: number; simulator: number; relativeError: number }> }>;
    };
    expect(report.verdict).toBe('agree');
    const labels = report.corners[0]!.quantities.map((q) => q.quantity);
    expect(labels).toEqual(['dead p1->p2', 'gap p1->p2', 'dead p2->p1', 'gap p2->p1', 'width p1', 'width p2']);
    for (const q of report.corners[0]!.quantities) {
      expect(q.relativeError).toBeCloseTo((q.model - q.simulator) / q.simulator, 12);
      expect(q.simulator).toBeGreaterThan(0);
    }
  });

  it('takes the tolerance from requirements.confirmTolerance when the flag is absent, the flag winning over it', () => {
    const tight = cli(
      'confirm',
      design('doubler'),
      '--model',
      'analytic',
      '--corners',
      'tt/1.8V/27C',
      '--set',
      'requirements.confirmTolerance=0.001',
      '--jobs',
      '1',
      '--json',
    );
    expect(tight.code).toBe(1);
    expect(JSON.parse(tight.stdout).tolerance).toBe(0.001);
    const flag = cli(
      'confirm',
      design('doubler'),
      '--model',
      'analytic',
      '--corners',
      'tt/1.8V/27C',
      '--set',
      'requirements.confirmTolerance=0.001',
      '--tolerance',
      '50%',
      '--jobs',
      '1',
      '--json',
    );
    expect(flag.code).toBe(0);
    expect(JSON.parse(flag.stdout).tolerance).toBe(0.5);
  });

  it('rejects a bad tolerance and an unknown corner with exit 2', () => {
    expect(cli('confirm', design('doubler'), '--tolerance', '-3').stderr).toMatch(
      /--tolerance: "-3" must be a relative difference above 0/,
    );
    expect(cli('confirm', design('doubler'), '--corners', 'tt/9V/27C').code).toBe(2);
  });
});
