/**
 * The analytic model against hand-written transistor-level references: ngspice (Debian package
 * ngspice) runs the decks of this folder (nand-gen.cir, nor-gen.cir, nor-gen-inner.cir,
 * inv-chain.cir on the invented level-1 devices of devices.lib) at every corner of their designs.
 * Targets on every corner: dead time |error| median <= 5 % and worst <= 10 %, corner ranking
 * (Spearman) >= 0.98, the clean gap within 10 ps either way and, as the checks read it, never more
 * than 10 ps optimistic, phase 10-90 % times within 10 %, the dead-time change from moving the clock
 * to the inner NOR input within 2 points of ngspice's, and the temperature slope of delay within 3
 * points of ngspice's, temperature inversion at 0.9 V included.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import {
  compareGenerator,
  deckAt,
  maxAbs,
  median,
  modelChain,
  resolveReference,
  simulate,
  spiceChain,
  type GeneratorComparison,
  type PhaseFigures,
} from './harness.js';
import { requireTool } from '../tools.js';

requireTool('ngspice', 'ngspice');

const ps = 1e-12;
const SLOW = 600_000;

/** One comparison per deck, shared by the suites that read it. */
const comparisons = new Map<string, Promise<GeneratorComparison>>();
const compare = (design: string, deck: string): Promise<GeneratorComparison> => {
  let c = comparisons.get(deck);
  if (!c) {
    c = compareGenerator(design, deck);
    comparisons.set(deck, c);
  }
  return c;
};

const GENERATORS = [
  ['nand-gen.yaml', 'nand-gen.cir'],
  ['nor-gen.yaml', 'nor-gen.cir'],
  ['nor-gen-inner.yaml', 'nor-gen-inner.cir'],
] as const;

for (const [design, deck] of GENERATORS) {
  describe(`${deck} in ngspice vs the analytic model, 45 corners`, () => {
    let c: GeneratorComparison;
    beforeAll(async () => {
      c = await compare(design, deck);
    }, SLOW);

    it('has dead times within 5 % at the median and 10 % at worst', () => {
      expect(c.deadErrors.length).toBe(90);
      expect(median(c.deadErrors.map(Math.abs))).toBeLessThanOrEqual(0.05);
      expect(maxAbs(c.deadErrors)).toBeLessThanOrEqual(0.1);
    });

    it('ranks the corners as ngspice does (Spearman >= 0.98)', () => {
      expect(c.rank).toBeGreaterThanOrEqual(0.98);
    });

    it('never reads the clean gap at 10 % more than 10 ps optimistic once its error band is taken off', () => {
      for (const [i, e] of c.boundErrors.entries()) expect(e, `${c.model[i >> 1]!.corner}`).toBeLessThanOrEqual(10 * ps);
    });

    it('gives the clean gap at 10 % itself within 10 ps either way (measured: NAND -0.5 to +9.9 ps, NOR -7.2 to +6.7 ps, inner NOR -3.5 to +5.2 ps)', () => {
      expect(maxAbs(c.gapErrors)).toBeLessThanOrEqual(10 * ps);
    });

    it('calls a corner clean at 10 % only where ngspice does', () => {
      c.model.forEach((m, i) => {
        for (let k = 0; k < 2; k++) if (m.bound[k]! > 0) expect(c.spice[i]!.gap[k], m.corner).toBeGreaterThan(0);
      });
    });

    it('gives every phase edge its 10-90 % time within 10 %', () => {
      expect(maxAbs(c.edgeErrors)).toBeLessThanOrEqual(0.1);
    });
  });
}

describe('nor-gen-inner.cir against nor-gen.cir: the clock on the inner input of the NOR stacks, 45 corners', () => {
  let outer: GeneratorComparison;
  let inner: GeneratorComparison;
  beforeAll(async () => {
    outer = await compare('nor-gen.yaml', 'nor-gen.cir');
    inner = await compare('nor-gen-inner.yaml', 'nor-gen-inner.cir');
  }, 2 * SLOW);

  /** Relative change of every dead time when the clock moves to the inner input. */
  const change = (a: readonly PhaseFigures[], b: readonly PhaseFigures[]): number[] =>
    a.flatMap((m, i) => [0, 1].map((k) => b[i]!.dead[k]! / m.dead[k]! - 1));

  it('changes the dead time as ngspice does, within 2 points at every corner', () => {
    const model = change(outer.model, inner.model);
    const spice = change(outer.spice, inner.spice);
    expect(median(spice.map(Math.abs))).toBeGreaterThan(0.03);
    for (const [i, d] of spice.entries()) {
      expect(
        Math.abs(model[i]! - d),
        `${outer.model[i >> 1]!.corner}: model ${(100 * model[i]!).toFixed(1)} %, ngspice ${(100 * d).toFixed(1)} %`,
      ).toBeLessThanOrEqual(0.02);
    }
  });
});

describe('inv-chain.cir in ngspice vs the analytic model, tt/ss/ff at 0.9 V and 1.8 V', () => {
  const resolved = resolveReference('inv-chain.yaml');
  const model = modelChain(resolved);
  let spice: Array<{ rise: number; fall: number }>;
  beforeAll(async () => {
    spice = (await simulate(resolved.corners.map(({ corner }) => deckAt('inv-chain.cir', corner)))).map(spiceChain);
  }, SLOW);

  /** Change of the four-stage delay from -40 C to 125 C, in points of the 27 C delay, per process and supply. */
  const slopes = (delays: ReadonlyArray<{ rise: number; fall: number }>): Map<string, number> => {
    const out = new Map<string, number>();
    const at = (process: string, vdd: number, temperature: number) => {
      const i = model.findIndex((m) => m.corner.process === process && m.corner.vdd === vdd && m.corner.temperature === temperature);
      const d = delays[i]!;
      return d.rise + d.fall;
    };
    for (const process of ['tt', 'ss', 'ff']) {
      for (const vdd of [0.9, 1.8])
        out.set(`${process}/${vdd}V`, (100 * (at(process, vdd, 125) - at(process, vdd, -40))) / at(process, vdd, 27));
    }
    return out;
  };

  it('has the temperature slope of delay within 3 points of ngspice, inverted at 0.9 V and normal at 1.8 V', () => {
    const m = slopes(model);
    const s = slopes(spice);
    for (const [key, slope] of s) {
      expect(Math.abs(m.get(key)! - slope), `${key}: model ${m.get(key)!.toFixed(1)}, ngspice ${slope.toFixed(1)}`).toBeLessThanOrEqual(3);
      if (key.endsWith('/0.9V')) expect(Math.max(slope, m.get(key)!), key).toBeLessThan(0);
      else expect(Math.min(slope, m.get(key)!), key).toBeGreaterThan(0);
    }
  });

  it('gives the four-stage delay within 10 % on both edges', () => {
    const errors = model.flatMap((m, i) => [(m.rise - spice[i]!.rise) / spice[i]!.rise, (m.fall - spice[i]!.fall) / spice[i]!.fall]);
    expect(errors.length).toBe(36);
    expect(maxAbs(errors)).toBeLessThanOrEqual(0.1);
  });
});
