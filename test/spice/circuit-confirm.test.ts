/**
 * The circuit solver against ngspice (Debian package ngspice): every shipped design with a
 * `circuit:` section, simulated whole by `confirm` at tt/1.8V/27C and at the worst corners confirm
 * chooses, must agree with the solver (mean output within 2 % of VDD, ripple and efficiency
 * within 10 %) unless its switches fail their bias checks, where neither side settles: both outputs
 * fall below the design's minimum and confirm must fail. And a
 * hand-written ideal doubler deck (test/spice/decks/ideal-doubler.cir, not from the deck writer)
 * against the solver's figures for the same circuit.
 */
import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { cli, fixture, ROOT } from '../helpers.js';
import { requireTool } from '../tools.js';
import { loadResolved } from '../../src/cli/load.js';
import { worstCorners } from '../../src/analysis/corner-choice.js';
import { evaluateAll } from '../../src/analysis/evaluate.js';
import { switchFaults } from '../../src/checks/bias-checks.js';
import { levelAt } from '../../src/schema/level.js';
import { circuitFigures } from '../../src/circuit/figures.js';
import { idealDoubler } from '../circuit/ideal.js';
import type { CircuitComparison } from '../../src/report/confirm-report.js';

requireTool('ngspice', 'ngspice');

const DESIGNS = fixture('designs');
const NOMINAL = 'tt/1.8V/27C';

/** Every shipped design with a circuit section, so a demo added later is covered. */
const circuitDesigns = readdirSync(DESIGNS)
  .filter((f) => f.endsWith('.yaml') && /^circuit:/m.test(readFileSync(join(DESIGNS, f), 'utf8')))
  .sort();

/**
 * Shipped demos confirm does not pass although the model and the deck agree, each with what confirm
 * must then do (catch it: never a silent pass). Measured with ngspice 39.
 */
const KNOWN_LIMITS: Readonly<Record<string, string>> = {
  // Output, ripple and efficiency agree at every corner (efficiency +4.1 % tt, +5.0 % ss/1.62V/125C,
  // +5.2 % ff/1.98V/-40C, -7.0 % fs/1.98V/-40C), but at the 1.98 V, -40 C corners ngspice's output
  // mean wanders by +-0.2 mV from period to period without a trend (over the last 40 of 69 periods at
  // ff: -1.72704 .. -1.72742 V), above the settle test's 20 uV floor, so confirm calls it unsettled.
  'negative-pump.yaml': 'ngspice output wobbles at 1.98V/-40C',
};

/**
 * Corners where a design whose switches fail their bias checks still settles in ngspice: the leaking
 * output converges below the design's minimum (measured: 2.42 V at tt/1.62V/-40C, drift 1.3 mV per
 * period and shrinking, against 2.835 V), while the model finds no steady state.
 */
const SETTLES_BELOW_MINIMUM: readonly string[] = ['doubler-unboosted-pump.yaml tt/1.62V/-40C'];

interface ConfirmJson {
  verdict: string;
  corners: Array<{ corner: string; circuit?: CircuitComparison }>;
}

describe('confirm simulates each shipped circuit to periodic steady state in ngspice', () => {
  it('finds the shipped circuit demos', () => {
    expect(circuitDesigns).toEqual(expect.arrayContaining(['doubler-pump.yaml', 'doubler-diode-pump.yaml', 'doubler-unboosted-pump.yaml']));
  });

  it('negative-pump.yaml: at tt and the worst corners the figures agree, and confirm fails exactly where ngspice reads its output as unsettled (exit 1)', () => {
    const path = join(DESIGNS, 'negative-pump.yaml');
    const { resolved } = loadResolved(path, [], {}, () => {});
    const corners = [...new Set([NOMINAL, ...worstCorners(resolved).map((c) => c.name)])];
    const run = cli('confirm', path, '--json', '--jobs', '2', '--corners', corners.join(','));
    const report = JSON.parse(run.stdout) as ConfirmJson;
    expect(report.corners.map((c) => c.corner)).toEqual(corners);
    for (const c of report.corners) {
      const circuit = c.circuit!;
      const figure = (name: string) => circuit.figures.find((f) => f.figure === name)!;
      const vdd = resolved.corners.find((r) => r.corner.name === c.corner)!.corner.vdd;
      // Measured (ngspice-39): output within 0.05 % of VDD, ripple within 0.6 %, efficiency -7.0 .. +5.2 %.
      expect(Math.abs(figure('output').difference!), `${c.corner} output`).toBeLessThanOrEqual(0.02);
      expect(Math.abs(figure('ripple').difference!), `${c.corner} ripple`).toBeLessThanOrEqual(0.1);
      expect(Math.abs(figure('efficiency').difference!), `${c.corner} efficiency`).toBeLessThanOrEqual(0.1);
      // Unsettled only by a wobble: the last two periods' means within 0.01 % of VDD (measured 62 and 75 uV).
      if (!circuit.settled) expect(Math.abs(circuit.drift!), `${c.corner} drift`).toBeLessThan(1e-4 * vdd);
      expect(circuit.pass, c.corner).toBe(circuit.settled);
    }
    const unsettled = report.corners.some((c) => !c.circuit!.settled);
    expect(report.verdict).toBe(unsettled ? 'disagree' : 'agree');
    expect(run.code).toBe(unsettled ? 1 : 0);
  }, 900_000);

  for (const file of circuitDesigns.filter((f) => KNOWN_LIMITS[f] === undefined)) {
    it(`${file}: circuit figures at ${NOMINAL} and the worst corners`, () => {
      const path = join(DESIGNS, file);
      const { resolved } = loadResolved(path, [], {}, () => {});
      const corners = [...new Set([NOMINAL, ...worstCorners(resolved).map((c) => c.name)])];
      const faults = switchFaults(evaluateAll(resolved).map((r) => ({ name: r.corner.name, checks: r.checks })));
      const run = cli('confirm', path, '--json', '--jobs', '2', '--corners', corners.join(','));
      const report = JSON.parse(run.stdout) as ConfirmJson;
      // confirm answers in the order the corners were asked for.
      expect(report.corners.map((c) => c.corner)).toEqual(corners);
      for (const c of report.corners) {
        const circuit = c.circuit!;
        const figure = (name: string) => circuit.figures.find((f) => f.figure === name)!;
        if (faults.length === 0) {
          expect(circuit.settled, `${file} ${c.corner} settled`).toBe(true);
          // The stated tolerances: output within 2 % of VDD, ripple and efficiency within 10 % of ngspice's.
          expect(Math.abs(figure('output').difference!), `${file} ${c.corner} output`).toBeLessThanOrEqual(0.02);
          expect(Math.abs(figure('ripple').difference!), `${file} ${c.corner} ripple`).toBeLessThanOrEqual(0.1);
          expect(Math.abs(figure('efficiency').difference!), `${file} ${c.corner} efficiency`).toBeLessThanOrEqual(0.1);
          expect(circuit.pass).toBe(true);
        } else {
          // A switch that fails its bias checks cannot pass the charge: ngspice's output keeps falling (measured:
          // about 25 mV per period, the load's 2.5 pC on 100 pF) and the solver, whose switches conduct only with
          // the overdrive they have, finds no steady state either and reads an output below the design's minimum.
          // Neither side has a steady state to compare (or ngspice's lies below the minimum), so confirm fails.
          expect(circuit.settled, `${file} ${c.corner} settled`).toBe(SETTLES_BELOW_MINIMUM.includes(`${file} ${c.corner}`));
          const min = resolved.design.circuit!.requirements.output?.min;
          const vdd = resolved.corners.find((r) => r.corner.name === c.corner)!.corner.vdd;
          expect(min, `${file} has an output minimum`).toBeDefined();
          expect(figure('output').model!, `${file} ${c.corner} model output`).toBeLessThan(levelAt(min!, vdd));
          expect(figure('output').simulator!, `${file} ${c.corner} ngspice output`).toBeLessThan(levelAt(min!, vdd));
          expect(circuit.pass).toBe(false);
        }
      }
      if (faults.length > 0) {
        expect(report.verdict).toBe('disagree');
        expect(run.code).toBe(1);
      }
    }, 900_000);
  }
});

describe('hand-written ideal doubler deck (test/spice/decks/ideal-doubler.cir) against the solver', () => {
  const VDD = 1.8;
  const LOAD = 100e-6;
  const F = 20e6;

  function measure(): Record<string, number> {
    const run = spawnSync('ngspice', ['-b', 'ideal-doubler.cir'], { encoding: 'utf8', cwd: join(ROOT, 'test', 'spice', 'decks') });
    expect(run.status, run.stderr).toBe(0);
    const values: Record<string, number> = {};
    for (const m of run.stdout.matchAll(/^(\w+)\s*=\s*(\S+)\s+from=/gm)) values[m[1]!] = Number(m[2]);
    return values;
  }

  it('ngspice and the solver agree on output (2 % of VDD), ripple and efficiency (10 %) for 100 ohm switches, 10 pF / 100 pF, 100 uA, 1 ns dead time', () => {
    const m = measure();
    // The deck has settled: its last two periods' means agree to 0.01 % of VDD.
    expect(Math.abs(m.vout_avg! - m.vout_prev!)).toBeLessThan(1e-4 * VDD);
    const model = idealDoubler({ vdd: VDD, frequency: F, c: 10e-12, cout: 100e-12, ron: 100, dead: 1e-9 });
    const figures = circuitFigures(model, { current: LOAD, conductance: 0 }, 0, 1000);
    const simEfficiency = (LOAD * m.vout_avg!) / (VDD * -m.q_vdd! * F);
    expect(Math.abs(figures.output - m.vout_avg!) / VDD).toBeLessThanOrEqual(0.02);
    expect(Math.abs(figures.ripple - m.vout_pp!) / m.vout_pp!).toBeLessThanOrEqual(0.1);
    expect(Math.abs(figures.efficiency! - simEfficiency) / simEfficiency).toBeLessThanOrEqual(0.1);
    // Both near the slow-switching limit 2 VDD - I/(f C) = 3.1 V (charge balance, common practice).
    expect(Math.abs(m.vout_avg! - (2 * VDD - LOAD / (F * 10e-12)))).toBeLessThan(0.02);
  }, 120_000);
});
