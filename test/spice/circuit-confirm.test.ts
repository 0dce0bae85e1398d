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
 * Shipped demos the model and the deck do not yet agree on, each with what confirm must then do
 * (catch it: never a silent pass). Measured with ngspice 39 at tt/1.8V/27C.
 */
const KNOWN_LIMITS: Readonly<Record<string, string>> = {
  // Output and ripple agree; the model's efficiency is 42 % optimistic: it counts no energy for a shifter
  // whose high level is 0 V, while the deck's transistor shifters draw from VDD and from the -VDD level.
  'negative-pump.yaml': 'efficiency optimistic',
};

/**
 * Designs whose level-shifted switches leave the model's efficiency optimistic at the edge of the
 * tolerance: the model counts each cross-coupled shifter's node, output and latch-fight energy
 * (shifter-energy.ts) but with the card's capacitances per width, 16 to 30 % below the deck's
 * junctions and overlaps, and no short-circuit energy in the generator's own gates (doubler-pump:
 * generator 150 uW in the model against 172 uW in ngspice at tt, where it counted 134 uW with the
 * switch gates' charge alone; efficiency +9.9 % at tt/1.8V/27C, +10.1 % at ss/1.62V/125C, +11.2 %
 * at ff/1.98V/-40C, ngspice-39).
 */
const EFFICIENCY_OPTIMISTIC: readonly string[] = ['doubler-pump.yaml'];

interface ConfirmJson {
  verdict: string;
  corners: Array<{ corner: string; circuit?: CircuitComparison }>;
}

describe('confirm simulates each shipped circuit to periodic steady state in ngspice', () => {
  it('finds the shipped circuit demos', () => {
    expect(circuitDesigns).toEqual(expect.arrayContaining(['doubler-pump.yaml', 'doubler-diode-pump.yaml', 'doubler-unboosted-pump.yaml']));
  });

  it("negative-pump.yaml: at tt and the worst corners confirm agrees on output and ripple and flags the model's efficiency as optimistic (exit 1)", () => {
    const path = join(DESIGNS, 'negative-pump.yaml');
    const { resolved } = loadResolved(path, [], {}, () => {});
    const corners = [...new Set([NOMINAL, ...worstCorners(resolved).map((c) => c.name)])];
    const run = cli('confirm', path, '--json', '--jobs', '2', '--corners', corners.join(','));
    const report = JSON.parse(run.stdout) as ConfirmJson;
    expect(report.corners.map((c) => c.corner)).toEqual(corners);
    for (const c of report.corners) {
      const circuit = c.circuit!;
      const figure = (name: string) => circuit.figures.find((f) => f.figure === name)!;
      expect(circuit.settled, c.corner).toBe(true);
      // Measured (ngspice-39): output -0.6 to -0.7 % of VDD, ripple +3.3 to +4.5 %.
      expect(Math.abs(figure('output').difference!), `${c.corner} output`).toBeLessThanOrEqual(0.02);
      expect(Math.abs(figure('ripple').difference!), `${c.corner} ripple`).toBeLessThanOrEqual(0.1);
      // Measured +42.4 to +42.6 % (tt: model 22.9 %, ngspice 16.1 %; generator 122 uW against 195 uW, of which
      // the -1.8 V level the shifters' latches and output stages sit on delivers 29.9 uW).
      expect(figure('efficiency').difference!, `${c.corner} efficiency`).toBeGreaterThan(0.3);
      expect(circuit.pass).toBe(false);
    }
    expect(report.verdict).toBe('disagree');
    expect(run.code).toBe(1);
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
          if (EFFICIENCY_OPTIMISTIC.includes(file)) {
            // Measured +9.9 .. +11.2 %: optimistic everywhere, over the tolerance somewhere, and confirm flags each corner over it.
            const difference = figure('efficiency').difference!;
            expect(difference, `${file} ${c.corner} efficiency`).toBeGreaterThan(0);
            expect(difference, `${file} ${c.corner} efficiency`).toBeLessThanOrEqual(0.12);
            expect(circuit.pass).toBe(difference <= 0.1);
          } else {
            expect(Math.abs(figure('efficiency').difference!), `${file} ${c.corner} efficiency`).toBeLessThanOrEqual(0.1);
            expect(circuit.pass).toBe(true);
          }
        } else {
          // A switch that fails its bias checks cannot pass the charge: ngspice's output keeps falling (measured:
          // about 25 mV per period, the load's 2.5 pC on 100 pF) and the solver, whose switches conduct only with
          // the overdrive they have, finds no steady state either and reads an output below the design's minimum.
          // Neither side has a steady state to compare, so confirm fails.
          expect(circuit.settled, `${file} ${c.corner} settled`).toBe(false);
          const min = resolved.design.circuit!.requirements.output?.min;
          const vdd = resolved.corners.find((r) => r.corner.name === c.corner)!.corner.vdd;
          expect(min, `${file} has an output minimum`).toBeDefined();
          expect(figure('output').model!, `${file} ${c.corner} model output`).toBeLessThan(levelAt(min!, vdd));
          expect(figure('output').simulator!, `${file} ${c.corner} ngspice output`).toBeLessThan(levelAt(min!, vdd));
          expect(circuit.pass).toBe(false);
        }
      }
      if (faults.length > 0 || EFFICIENCY_OPTIMISTIC.includes(file)) {
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
