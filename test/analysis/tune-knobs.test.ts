import { describe, it, expect } from 'vitest';
import {
  ownKnobs,
  proposalOverrides,
  searchableTapers,
  searchableTaps,
  taperedBuffer,
  templateOf,
  withKnobs,
} from '../../src/analysis/tune-knobs.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { evaluateAll } from '../../src/analysis/evaluate.js';
import { loadDesign } from '../../src/cli/load.js';
import { cli, design } from '../helpers.js';

describe('taperedBuffer', () => {
  it('keeps the last size and divides by the ratio towards the chain, never below size 1', () => {
    expect(taperedBuffer(18, 3, 3)).toEqual([2, 6, 18]);
    expect(taperedBuffer(18, 3, 4)).toEqual([1.13, 4.5, 18]);
    expect(taperedBuffer(12, 2, 2)).toEqual([6, 12]);
    expect(taperedBuffer(2, 3, 4)).toEqual([1, 1, 2]);
    expect(taperedBuffer(18, 1, 3)).toEqual([18]);
  });
});

describe('searchable knobs', () => {
  it('tapers a buffer of two or more inverters and taps the feedback after even counts of them', () => {
    const nand = templateOf(loadDesign(design('doubler')).design);
    expect(searchableTapers(nand)).toEqual([2, 3, 4]);
    expect(searchableTaps(nand)).toEqual([0, 2]);
    const nor = templateOf(loadDesign(design('sc-integrator')).design);
    expect(nor.template).toBe('nor');
    // nor's [3, 12]: after both inverters the feedback is the phase itself.
    expect(searchableTaps(nor)).toEqual([0, 2]);
    const bare = templateOf(loadDesign(design('sc-integrator'), ['generator.buffer=[]']).design);
    expect(searchableTapers(bare)).toEqual([]);
    expect(searchableTaps(bare)).toEqual([0]);
  });
});

describe('withKnobs and the feedback tap', () => {
  it('feeding back after two buffer inverters puts them inside the dead time: every dead time grows', () => {
    const { design: d, card } = loadDesign(design('doubler'));
    const own = ownKnobs(templateOf(d));
    const dead = (tap: number) =>
      evaluateAll(resolveDesign(withKnobs(d, { ...own, feedbackTap: tap }), card)).map((r) =>
        r.measurement.ok ? Math.min(...r.measurement.deadTimes.map((x) => x.t50)) : NaN,
      );
    const before = dead(0);
    const after = dead(2);
    after.forEach((t, i) => {
      expect(t).toBeGreaterThan(before[i]!);
    });
  });

  it('an odd tap or one past the buffer is refused with the field and the rule', () => {
    const odd = cli('check', design('doubler'), '--set', 'generator.feedbackTap=1');
    expect(odd.code).toBe(2);
    expect(odd.stderr).toContain('generator.feedbackTap: 1 must be even and at most the buffer length (3)');
    expect(cli('check', design('doubler'), '--set', 'generator.feedbackTap=4').code).toBe(2);
  });
});

describe('proposalOverrides', () => {
  it('names the buffer and the tap only when they differ from the design', () => {
    const own = { stages: 6, stageSize: 1, stageLoad: 40e-15, buffer: [2, 6, 18], feedbackTap: 0 };
    const f = (c: number) => `${c / 1e-15}fF`;
    expect(proposalOverrides({ ...own, stages: 2 }, f, own)).toEqual([
      'generator.stages=2',
      'generator.stageSize=1',
      'generator.stageLoad=40fF',
    ]);
    expect(proposalOverrides({ ...own, buffer: [1.13, 4.5, 18], feedbackTap: 2 }, f, own)).toEqual([
      'generator.stages=6',
      'generator.stageSize=1',
      'generator.stageLoad=40fF',
      'generator.buffer=[1.13,4.5,18]',
      'generator.feedbackTap=2',
    ]);
  });
});
