/**
 * Physics that must emerge from the model (not be special-cased): how the dead times of a
 * generator move with process, supply, temperature, loads, chain length and style.
 */
import { describe, it, expect, beforeAll } from 'vitest';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadDesign } from '../../src/cli/load.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { evaluateAll } from '../../src/analysis/evaluate.js';
import { design, processCard, tempDir } from '../helpers.js';

/** Dead times (p1->p2, p2->p1 at 50 %, s) of every corner, by corner name. */
type DeadTimes = Map<string, readonly [number, number]>;

function deadTimes(path: string, overrides: readonly string[] = []): DeadTimes {
  const { design: d, card } = loadDesign(path, overrides);
  const resolved = resolveDesign(d, card);
  const out = new Map<string, readonly [number, number]>();
  for (const r of evaluateAll(resolved)) {
    if (!r.measurement.ok) throw new Error(`${r.corner.name}: ${r.measurement.reason}`);
    out.set(r.corner.name, [r.measurement.deadTimes[0].t50, r.measurement.deadTimes[1].t50]);
  }
  return out;
}

function get(map: DeadTimes, corner: string): readonly [number, number] {
  const d = map.get(corner);
  if (!d) throw new Error(`no corner ${corner} in ${[...map.keys()].join(', ')}`);
  return d;
}

/** Both dead times strictly increase along the list. */
function expectIncreasing(series: ReadonlyArray<readonly [number, number]>, label: string): void {
  for (let i = 1; i < series.length; i++) {
    for (const k of [0, 1] as const) {
      if (!(series[i]![k] > series[i - 1]![k])) {
        expect.fail(`${label}: dead time ${k === 0 ? 'p1->p2' : 'p2->p1'} went from ${series[i - 1]![k]} to ${series[i]![k]} at step ${i}`);
      }
    }
  }
}

/**
 * A symmetric NAND generator with no switches, equal phase loads and one corner axis set per test
 * through --set style overrides.
 */
let probe = '';
beforeAll(() => {
  probe = join(tempDir(), 'probe.yaml');
  writeFileSync(
    probe,
    [
      'name: physics-probe',
      `process: ${JSON.stringify(processCard('generic180'))}`,
      'clock: { frequency: 20MHz, transition: 200ps }',
      'generator: { template: nand, gateSize: 2, stages: 6, stageLoad: 40fF, buffer: [2, 6, 18] }',
      'loads: { p1: 0.8pF, p2: 0.8pF }',
      '',
    ].join('\n'),
  );
});

const axes = (process: string, vdd: readonly string[], temperature: readonly number[]): string[] => [
  `corners.process=[${process}]`,
  `corners.vdd=[${vdd.join(', ')}]`,
  `corners.temperature=[${temperature.join(', ')}]`,
];

describe('dead time across PVT at generic180', () => {
  it('rises from ff/1.98V/-40C through tt/1.8V/27C to ss/1.62V/125C on the demo design, whose extremes they are', () => {
    const all = deadTimes(design('doubler'));
    const path = ['ff/1.98V/-40C', 'tt/1.8V/27C', 'ss/1.62V/125C'].map((c) => get(all, c));
    expectIncreasing(path, 'doubler fast -> typical -> slow');
    for (const k of [0, 1] as const) {
      const values = [...all.entries()].sort((a, b) => a[1][k] - b[1][k]);
      expect(values[0]![0]).toBe('ff/1.98V/-40C');
      expect(values[values.length - 1]![0]).toBe('ss/1.62V/125C');
    }
  });

  it('rises monotonically along ff/1.98V/-40C -> tt/1.8V/27C -> ss/1.62V/125C', () => {
    const path = [
      ['ff', '1.98V', -40],
      ['tt', '1.8V', 27],
      ['ss', '1.62V', 125],
    ] as const;
    const series = path.map(([p, v, t]) => get(deadTimes(probe, axes(p, [v], [t])), `${p}/${v}/${t}C`));
    expectIncreasing(series, 'fast -> typical -> slow');
  });

  it('falls monotonically as the supply rises at tt/27C', () => {
    const vdds = ['2.1V', '1.98V', '1.9V', '1.8V', '1.7V', '1.62V', '1.5V'];
    const map = deadTimes(probe, axes('tt', vdds, [27]));
    expectIncreasing(
      vdds.map((v) => get(map, `tt/${v}/27C`)),
      'supply falling',
    );
  });

  it('rises monotonically with temperature at tt/1.8V', () => {
    const temps = [-40, 0, 27, 85, 125];
    const map = deadTimes(probe, axes('tt', ['1.8V'], temps));
    expectIncreasing(
      temps.map((t) => get(map, `tt/1.8V/${t}C`)),
      'temperature rising',
    );
  });

  it('moves in opposite directions from tt at the skewed corners fs and sf', () => {
    const map = deadTimes(probe, axes('tt, fs, sf', ['1.8V'], [27]));
    const [tt, fs, sf] = ['tt', 'fs', 'sf'].map((p) => get(map, `${p}/1.8V/27C`));
    for (const k of [0, 1] as const) {
      const up = fs![k] - tt![k];
      const down = sf![k] - tt![k];
      expect(Math.sign(up) * Math.sign(down)).toBe(-1);
      // Both shifts are real, not rounding: at least 1 % of the typical dead time.
      expect(Math.min(Math.abs(up), Math.abs(down))).toBeGreaterThan(0.01 * tt![k]);
    }
  });
});

describe('dead time symmetry', () => {
  const corners = axes('tt, ff, ss, fs, sf', ['1.62V', '1.98V'], [-40, 125]);

  it('keeps both dead times equal within 1 fs while the loads are equal', () => {
    const map = deadTimes(probe, corners);
    expect(map.size).toBe(20);
    for (const [name, [a, b]] of map) {
      if (!(Math.abs(a - b) < 1e-15)) expect.fail(`${name}: ${a} vs ${b}`);
    }
  });

  it('pulls them apart when one phase carries more load: the loaded phase hands over late and takes over late', () => {
    const equal = deadTimes(probe, corners);
    const heavy = deadTimes(probe, [...corners, 'loads.p1=2.4pF']);
    for (const [name, [a, b]] of heavy) {
      const [a0, b0] = get(equal, name);
      // p1 falls later, so p1->p2 shortens; p1 also rises later, so p2->p1 lengthens.
      expect(a, name).toBeLessThan(a0);
      expect(b, name).toBeGreaterThan(b0);
      expect(b - a, name).toBeGreaterThan(10e-12);
    }
  });
});

describe('delay chain length', () => {
  it('never shortens a dead time as stages are added (0, 2, ..., 12)', () => {
    const stages = [0, 2, 4, 6, 8, 10, 12];
    const corners = axes('ff, tt, ss', ['1.62V', '1.98V'], [-40, 125]);
    const runs = stages.map((n) => deadTimes(probe, [...corners, `generator.stages=${n}`]));
    for (const name of runs[0]!.keys())
      expectIncreasing(
        runs.map((r) => get(r, name)),
        `${name} over stages`,
      );
  });
});

describe('generator style', () => {
  it('gives NAND and NOR generators with the same chain dead times of the same order (ratio 0.5..2)', () => {
    const corners = axes('tt, ff, ss, fs, sf', ['1.62V', '1.8V', '1.98V'], [-40, 27, 125]);
    const nand = deadTimes(probe, corners);
    // The nor style needs an even buffer to keep the phases active high; the chain is the same.
    const nor = deadTimes(probe, [...corners, 'generator.template=nor', 'generator.buffer=[6, 18]']);
    expect(nor.size).toBe(45);
    for (const [name, [a, b]] of nor) {
      const [a0, b0] = get(nand, name);
      for (const ratio of [a / a0, b / b0]) {
        if (!(ratio >= 0.5 && ratio <= 2)) expect.fail(`${name}: nor/nand dead-time ratio ${ratio}`);
      }
    }
  });
});

describe('temperature inversion on generic-lp', () => {
  const temps = [-40, 0, 27, 85, 125];
  const lp = (vdd: string) => {
    const map = deadTimes(probe, [
      `process=${JSON.stringify(processCard('generic-lp'))}`,
      ...axes('tt', [vdd], temps),
      'clock.transition=300ps',
    ]);
    return temps.map((t) => get(map, `tt/${vdd}/${t}C`));
  };

  it('makes the dead time fall as temperature rises at its low supply, 0.9 V (nominal - 10 %, common practice)', () => {
    expectIncreasing(lp('0.9V').reverse(), 'generic-lp at 0.9 V, temperature falling');
  });
});
