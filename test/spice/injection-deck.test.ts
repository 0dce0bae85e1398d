/**
 * The solver's pedestal of one n switch sampling 0.5 V onto 1 pF against a hand-written ngspice deck
 * (test/spice/decks/nmos-sample.cir, not from the deck writer; Debian package ngspice, level-3 devices
 * of fixtures/models/generic180.lib).
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { ROOT } from '../helpers.js';
import { requireTool } from '../tools.js';
import { modelPedestal, SAMPLE, samplingModel } from '../circuit/sampling.js';

requireTool('ngspice', 'ngspice');

function measure(): Record<string, number> {
  const run = spawnSync('ngspice', ['-b', 'nmos-sample.cir'], { encoding: 'utf8', cwd: join(ROOT, 'test', 'spice', 'decks') });
  expect(run.status, run.stderr).toBe(0);
  const values: Record<string, number> = {};
  for (const m of run.stdout.matchAll(/^(\w+)\s*=\s*(\S+)/gm)) values[m[1]!] = Number(m[2]);
  return values;
}

describe('hand-written n switch sampling deck (test/spice/decks/nmos-sample.cir) against the solver', () => {
  it('the pedestal after turn-off: ngspice 39 -10.38 mV, the solver 14 % smaller (-8.91 mV)', () => {
    const m = measure();
    // The switch settled the capacitor to the input before opening, and the held level stays put.
    expect(Math.abs(m.v_on! - SAMPLE.input)).toBeLessThan(1e-5);
    expect(Math.abs(m.v_held2! - m.v_held!)).toBeLessThan(1e-5);
    const spice = m.v_held! - SAMPLE.input;
    const model = modelPedestal(samplingModel());
    console.log(`pedestal: solver ${(model * 1e3).toFixed(3)} mV, ngspice ${(spice * 1e3).toFixed(3)} mV`);
    expect(spice).toBeLessThan(-5e-3);
    expect(model).toBeLessThan(0);
    // Measured: the solver's pedestal is 14.2 % smaller. SPICE's Meyer capacitances keep coupling the
    // gate to source and drain over phi/2 below threshold (about 1.5 fC per side here), which the
    // solver leaves out; the gap is pinned so that a change of either side shows.
    const gap = (model - spice) / Math.abs(spice);
    expect(gap).toBeGreaterThan(0.12);
    expect(gap).toBeLessThan(0.16);
  }, 60_000);
});
