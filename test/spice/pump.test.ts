/**
 * The whole voltage doubler in ngspice (Debian package ngspice), from hand-written decks of the
 * power stage (test/spice/decks/pump-*.cir: switches wired to the flying and storage capacitors
 * and a load current, the invented models of fixtures/models/generic180.lib). The design phasegap
 * passes must pump; the one it fails (off-state, reverse conduction) must not.
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { ROOT } from '../helpers.js';
import { requireTool } from '../tools.js';

const DECKS = join(ROOT, 'test', 'spice', 'decks');

const measured = new Map<string, Record<string, number>>();

/** The deck's .measure results, run once per deck. */
function measure(deck: string): Record<string, number> {
  const known = measured.get(deck);
  if (known) return known;
  const run = spawnSync('ngspice', ['-b', `${deck}.cir`], { encoding: 'utf8', cwd: DECKS });
  expect(run.status, run.stderr).toBe(0);
  const values: Record<string, number> = {};
  for (const m of run.stdout.matchAll(/^(\w+)\s*=\s*(\S+)\s+from=/gm)) values[m[1]!] = Number(m[2]);
  measured.set(deck, values);
  return values;
}

const VDD = 1.8;
const LOAD = 100e-6;
const F = 20e6;
const CFLY = 10e-12;
/** Ideal doubler: V_out = 2 VDD - I / (f C_fly) = 3.6 V - 0.5 V = 3.1 V (charge balance on the flying capacitor, common practice). */
const IDEAL = 2 * VDD - LOAD / (F * CFLY);

describe('whole-pump decks in ngspice (tt, 1.8 V, 27 C, 20 MHz, 100 uA load)', () => {
  requireTool('ngspice', 'ngspice');
  it('the boosted doubler (doubler.yaml) pumps to within 2 % of 2 VDD - I/(f C) = 3.1 V, drawing 2 I from VDD and nothing from its 2 VDD body source', () => {
    const m = measure('pump-boosted');
    expect(Math.abs(m.vout_avg! - IDEAL) / IDEAL).toBeLessThan(0.02);
    // A doubler draws twice the load current from its supply (charge balance); 5 % for gate and junction charge.
    expect(Math.abs(-m.ivdd_avg! - 2 * LOAD) / (2 * LOAD)).toBeLessThan(0.05);
    expect(Math.abs(m.iaux_avg!)).toBeLessThan(0.01 * LOAD);
  }, 60000);

  it('the unboosted doubler (doubler-unboosted.yaml) does not pump: its output stays below VDD, more than 2 V under the boosted one', () => {
    const boosted = measure('pump-boosted').vout_avg!;
    const unboosted = measure('pump-unboosted').vout_avg!;
    expect(unboosted).toBeLessThan(VDD);
    expect(boosted - unboosted).toBeGreaterThan(2);
  }, 60000);
});
