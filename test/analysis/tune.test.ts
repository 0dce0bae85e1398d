import { describe, it, expect } from 'vitest';
import { tuneChains, defaultSpace, TIE_FRACTION, type ChainKnobs, type TuneSpace } from '../../src/analysis/tune.js';
import { loadDesign } from '../../src/cli/load.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { evaluateAll } from '../../src/analysis/evaluate.js';
import type { Design } from '../../src/schema/design.js';
import { cli, design, inputErrorMessage, tempDir } from '../helpers.js';
import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';

const fF = 1e-15;

function load(name: string, overrides: string[] = []) {
  const { design: d, card } = loadDesign(design(name), overrides);
  return { d, card };
}

/** Every corner of the design with these chain knobs. */
function verdicts(d: Design, card: ReturnType<typeof load>['card'], knobs: ChainKnobs) {
  if (d.generator.template === 'netlist') throw new Error('template expected');
  const resolved = resolveDesign({ ...d, generator: { ...d.generator, ...knobs, stageSize: knobs.stageSize as number } }, card);
  return evaluateAll(resolved);
}

const small = (d: Design, extra: Partial<TuneSpace> = {}): TuneSpace => ({ ...defaultSpace(d), stages: [2, 4], stageSizes: [1], ...extra });

describe('tuneChains', () => {
  it('fixes the design that fails break-before-make: every proposal passes every corner, one load step less fails', () => {
    const { d, card } = load('too-tight');
    const space = small(d);
    const result = tuneChains(d, card, undefined, space);
    expect(result.current.pass).toBe(false);
    expect(result.proposals.length).toBe(2);
    for (const p of result.proposals) {
      expect(verdicts(d, card, p.knobs).every((r) => r.pass)).toBe(true);
      // The least capacitor that passes, to the step: one step less fails somewhere.
      expect(p.knobs.stageLoad).toBeGreaterThan(0);
      const less = verdicts(d, card, { ...p.knobs, stageLoad: p.knobs.stageLoad - space.loadStep });
      expect(less.every((r) => r.pass)).toBe(false);
      // Proposals are whole multiples of the step.
      expect(Math.abs(p.knobs.stageLoad / space.loadStep - Math.round(p.knobs.stageLoad / space.loadStep))).toBeLessThan(1e-9);
    }
  });

  it('wastes less dead time than the demo design it starts from, and reports the dead times it measured', () => {
    const { d, card } = load('doubler');
    const result = tuneChains(d, card, undefined, small(d));
    expect(result.current.pass).toBe(true);
    const best = result.proposals[0]!;
    expect(best.deadMax).toBeLessThan(result.current.deadMax);
    const results = verdicts(d, card, best.knobs);
    const dead = results.flatMap((r) => (r.measurement.ok ? r.measurement.deadTimes.map((x) => x.t50) : []));
    expect(best.deadMax).toBe(Math.max(...dead));
    expect(best.deadMin).toBe(Math.min(...dead));
    // The demo requires 500 ps at every corner; the least wasteful chain sits just above it.
    expect(best.deadMin).toBeGreaterThanOrEqual(500e-12);
    expect(best.deadMin).toBeLessThan(510e-12);
  });

  it('keeps the asked headroom on every check of every proposal', () => {
    const { d, card } = load('doubler');
    const result = tuneChains(d, card, undefined, small(d, { headroom: 50e-12 }));
    expect(result.proposals.length).toBeGreaterThan(0);
    for (const p of result.proposals) expect(p.limiting!.margin!).toBeGreaterThanOrEqual(50e-12);
  });

  it('ranks by the largest dead time, treating values within the tie fraction as equal and then preferring shorter chains', () => {
    const { d, card } = load('doubler');
    const result = tuneChains(d, card, undefined, { ...defaultSpace(d), stages: [2, 4, 6, 8], stageSizes: [1, 2] });
    const best = Math.min(...result.proposals.map((p) => p.deadMax));
    const bucket = (x: number) => Math.floor((x - best) / (TIE_FRACTION * best));
    for (let i = 1; i < result.proposals.length; i++) {
      const a = result.proposals[i - 1]!;
      const b = result.proposals[i]!;
      expect(bucket(a.deadMax)).toBeLessThanOrEqual(bucket(b.deadMax));
      if (bucket(a.deadMax) === bucket(b.deadMax)) expect(a.knobs.stages).toBeLessThanOrEqual(b.knobs.stages);
    }
  });

  it('finds nothing when the clock is too fast for any chain, and names what is closest', () => {
    const { d, card } = load('doubler', ['clock.frequency=400MHz']);
    const result = tuneChains(d, card, undefined, small(d));
    expect(result.proposals).toEqual([]);
    expect(result.closest).not.toBeNull();
    expect(result.closest!.pass).toBe(false);
    expect(result.closest!.limiting).not.toBeNull();
  });

  it('names as closest a searched chain, never the design itself, when the search is too narrow', () => {
    const { d, card } = load('doubler');
    const result = tuneChains(d, card, undefined, { ...small(d), stages: [2], maxLoad: 30 * fF });
    // The design's own chain (6 stages, 40 fF) passes but lies outside the search.
    expect(result.current.pass).toBe(true);
    expect(result.proposals).toEqual([]);
    expect(result.closest!.knobs.stages).toBe(2);
    expect(result.closest!.limiting!.kind).toBe('dead-time-min');
    const r = cli('tune', design('doubler'), '--stages', '2', '--sizes', '1', '--max-load', '30fF');
    expect(r.code).toBe(1);
    expect(r.stdout).toContain('still fails; it wants more delay than the search allows: widen it with --max-load or --stages');
  });

  it('refuses a free-form netlist, naming the field', () => {
    const { d, card } = load('lp-netlist');
    expect(inputErrorMessage(() => tuneChains(d, card))).toBe('generator.template: "netlist" is a free-form netlist; tune adjusts the delay chains of the nand or nor template');
  });

  it('more delay capacitance never shortens the fast-corner dead time (common practice: a delay cap slows its node)', () => {
    const { d, card } = load('doubler');
    let previous = -Infinity;
    for (const c of [0, 10, 20, 40, 80]) {
      const dead = verdicts(d, card, { stages: 4, stageSize: 1, stageLoad: c * fF })
        .flatMap((x) => (x.measurement.ok ? x.measurement.deadTimes.map((y) => y.t50) : []));
      const least = Math.min(...dead);
      expect(least).toBeGreaterThan(previous);
      previous = least;
    }
  });
});

describe('phasegap tune', () => {
  it('is what a failing check points to', () => {
    const failing = cli('check', design('too-tight'));
    expect(failing.code).toBe(1);
    expect(failing.stderr).toBe(`phasegap: hint: phasegap tune ${design('too-tight')} proposes delay chains that pass every corner\n`);
    expect(cli('check', design('doubler')).stderr).toBe('');
    expect(cli('check', design('too-tight'), '--json').stderr).toBe('');
  });

  it('prints the current design, the proposals and the command that applies the best; exit 0', () => {
    const r = cli('tune', design('too-tight'), '--stages', '2,4', '--sizes', '1');
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/^too-tight-clock: delay chains tuned at 20\.00 MHz over 45 corners/);
    expect(r.stdout).toMatch(/current design +2 +1 +40 fF .* FAIL/);
    expect(r.stdout).toMatch(/proposal 1 /);
    const apply = /phasegap check (\S+) (--set generator\.stages=\d+) (--set generator\.stageSize=\S+) (--set generator\.stageLoad=\S+)/.exec(r.stdout);
    expect(apply).not.toBeNull();
    // The printed command passes.
    const check = cli('check', apply![1]!, ...apply!.slice(2).flatMap((s) => s.split(' ')));
    expect(check.code).toBe(0);
    expect(r.stdout).toContain('caution: These are model estimates');
  });

  it('--json lists proposals with their overrides and exits 1 when nothing passes', () => {
    const r = cli('tune', design('doubler'), '--stages', '2', '--sizes', '1', '--set', 'clock.frequency=400MHz', '--json');
    expect(r.code).toBe(1);
    const report = JSON.parse(r.stdout);
    expect(report.verdict).toBe('fail');
    expect(report.proposals).toEqual([]);
    expect(report.closest.pass).toBe(false);
    expect(report.searched).toEqual({ stages: [2], stageSizes: [1], maxLoad: 500e-15, loadStep: 0.5e-15, headroom: 0 });
    expect(report.cautions.length).toBe(3);
  });

  it('rejects bad search options with exit 2, naming the option and writing nothing', () => {
    const dir = tempDir();
    const out = join(dir, 'tune.json');
    const cases: Array<[string[], string]> = [
      [['--stages', '3'], '--stages: "3" must be even whole numbers from the early tap (0) to 64'],
      [['--sizes', '0'], '--sizes: "0" must be stage sizes above 0'],
      [['--max-load', '20pA'], '--max-load: "20pA" is not a capacitance'],
      [['--margin', '-5ps'], '--margin: "-5ps" must be a time of at least 0'],
      [['--top', '0'], '--top: "0" must be a whole number of at least 1'],
    ];
    for (const [args, message] of cases) {
      const r = cli('tune', design('doubler'), ...args, '-o', out);
      expect(r.code).toBe(2);
      expect(r.stderr).toContain(message);
    }
    expect(existsSync(out)).toBe(false);
    expect(readdirSync(dir)).toEqual([]);
  });
});

describe('tuneChains: switch faults', () => {
  it('does not search the chains when a switch fails off-state or stress, and names the switch', () => {
    const { d, card } = load('doubler-unboosted');
    const result = tuneChains(d, card);
    expect(result.faults.map((f) => [f.switch, f.kinds])).toEqual([['s_chg', ['off-state', 'stress']]]);
    expect(result.proposals).toEqual([]);
    expect(result.closest).toBeNull();
    expect(result.evaluations).toBe(45);
  });

  it('says no delay chain can fix it instead of advising more delay', () => {
    const run = cli('tune', design('doubler-unboosted'));
    expect(run.code).toBe(1);
    expect(run.stdout).toMatch(/no delay chain can fix s_chg \(off-state, stress\)/);
    expect(run.stdout).toMatch(/reverse conduction/);
    expect(run.stdout).not.toMatch(/more delay|--max-load/);
  });
});
