import { describe, it, expect } from 'vitest';
import { leastConduction, objectiveOf, score, usefulConduction } from '../../src/analysis/tune-objective.js';
import { evaluateAll } from '../../src/analysis/evaluate.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { defaultSpace, tuneChains } from '../../src/analysis/tune.js';
import { wrapTime } from '../../src/measure/wrap-time.js';
import { loadDesign } from '../../src/cli/load.js';
import { design } from '../helpers.js';

describe('usefulConduction', () => {
  // The demo's 45 corners, evaluated once for both tests.
  const { design: d, card } = loadDesign(design('doubler'));
  const results = evaluateAll(resolveDesign(d, card));

  it('is the narrowest switch on-window at the corner, shorter than either phase width', () => {
    const period = 1 / d.clock.frequency;
    for (const r of results) {
      if (!r.measurement.ok) throw new Error('settles');
      const windows = r.switches.map((s) => wrapTime(s.offEarliest - s.onLatest, period));
      const t = usefulConduction(r, period);
      expect(t).toBe(Math.min(...windows));
      // The switches conduct inside their phase: less than the phase width, more than half of it at 20 MHz.
      expect(t).toBeLessThan(Math.max(...Object.values(r.measurement.widths)));
      expect(t).toBeGreaterThan(period / 4);
    }
  });

  it('takes its least over the corners at the slow corner, where the dead time is largest', () => {
    expect(leastConduction(results, 1 / d.clock.frequency).corner).toBe('ss/1.62V/125C');
  });
});

describe('objectiveOf and score', () => {
  it('defaults to the conduction time, and reads the dead-time and weighted objectives from the tune section', () => {
    expect(objectiveOf(loadDesign(design('doubler')).design)).toEqual({
      kind: 'conduction',
      weights: { conduction: 1, margin: 0, deadTime: 0 },
    });
    expect(objectiveOf(loadDesign(design('doubler'), ['tune.objective=dead-time']).design).weights).toEqual({
      conduction: 0,
      margin: 0,
      deadTime: 1,
    });
    const w = objectiveOf(loadDesign(design('doubler'), ['tune.objective=weighted', 'tune.weights.margin=10']).design);
    expect(w.weights).toEqual({ conduction: 1, margin: 10, deadTime: 0 });
    expect(score(w, { conduction: 23e-9, margin: 70e-12, deadMax: 1.9e-9 })).toBeCloseTo(23e-9 + 700e-12, 20);
    expect(score(w, { conduction: NaN, margin: 0, deadMax: 0 })).toBe(-Infinity);
  });

  it('a weighted objective that values margin ranks a chain with more margin first', () => {
    // The demo's extreme corners only (fast-cold, slow-hot and the supply ends): the ranking needs no more.
    const { design: d, card } = loadDesign(design('doubler'), [
      'tune.objective=weighted',
      'tune.weights.conduction=0',
      'tune.weights.margin=1',
      'corners.process=[ff, ss]',
      'corners.vdd=[1.62V, 1.98V]',
      'corners.temperature=[-40, 125]',
    ]);
    const space = { ...defaultSpace(d), stages: [2, 4, 6], stageSizes: [1], headroom: 0, tapers: [], feedbackTaps: [] };
    const r = tuneChains(d, card, undefined, space, { top: 3 });
    const margins = r.proposals.map((p) => p.limiting!.margin!);
    expect(r.proposals[0]!.score).toBe(margins[0]);
    for (const p of r.proposals) expect(margins[0]! + 0.01 * r.proposals[0]!.deadMax).toBeGreaterThanOrEqual(p.limiting!.margin!);
  });
});
