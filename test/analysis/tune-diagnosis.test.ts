import { describe, it, expect } from 'vitest';
import { diagnose, stuckSwitches, type Closest } from '../../src/analysis/tune-diagnosis.js';
import { evaluateAll } from '../../src/analysis/evaluate.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { loadDesign } from '../../src/cli/load.js';
import { design } from '../helpers.js';

const ns = 1e-9;

describe('diagnose', () => {
  // The demo with a 1 ns minimum and a 1.5 ns maximum dead time: 1.5x allowed, about 3.3x across its corners.
  const { design: d } = loadDesign(design('doubler'), ['requirements.deadTime.min=1ns', 'requirements.deadTime.max=1.5ns']);
  const closest = (extra: Partial<Closest> = {}): Closest => ({
    deadMin: 1 * ns,
    deadMax: 3.3 * ns,
    limiting: { kind: 'dead-time-max' },
    failing: [
      { check: 'dead p1->p2 <= 1.50 ns', kind: 'dead-time-max', corners: ['ss/1.62V/125C'], worst: -1.8 * ns },
      { check: 'dead p1->p2 >= 1.00 ns', kind: 'dead-time-min', corners: ['ff/1.98V/-40C'], worst: -0.1 * ns },
    ],
    stuck: [],
    ...extra,
  });

  it('names the conflict with the spread of the closest candidate and the least of any searched, and advises no widening', () => {
    const searched = [
      { deadMin: 1 * ns, deadMax: 3.3 * ns },
      { deadMin: 0.5 * ns, deadMax: 1.6 * ns },
      { deadMin: NaN, deadMax: NaN },
    ];
    const diag = diagnose(d, closest(), searched)!;
    expect(diag.conflict).toEqual({ min: 1 * ns, max: 1.5 * ns, spread: 3.3, leastSpread: 3.2 });
    expect(diag.widen).toBe(false);
    expect(diag.failing.length).toBe(2);
  });

  it('finds no conflict when some searched chain spreads less than max/min', () => {
    const diag = diagnose(d, closest(), [{ deadMin: 1 * ns, deadMax: 1.4 * ns }])!;
    expect(diag.conflict).toBeNull();
  });

  it('advises a wider search only when every failure wants more delay and no switch is stuck', () => {
    const { design: plain } = loadDesign(design('doubler'));
    const wantsDelay = closest({
      failing: [{ check: 'dead p2->p1 >= 500 ps', kind: 'dead-time-min', corners: ['ff/1.98V/-40C'], worst: -1e-10 }],
    });
    expect(diagnose(plain, wantsDelay, [])!.widen).toBe(true);
    const stuck = { ...wantsDelay, stuck: [{ switch: 's_chg', status: 'never' as const, corners: ['ss/1.62V/125C'], detail: '' }] };
    expect(diagnose(plain, stuck, [])!.widen).toBe(false);
    expect(diagnose(plain, null, [])).toBeNull();
  });
});

describe('stuckSwitches', () => {
  it('names a switch that never turns on and the corners where it does not', () => {
    // The demo's switches all switch; the same results with s_gnd marked as never conducting name it at every corner.
    const { design: d, card } = loadDesign(design('doubler'));
    const results = evaluateAll(resolveDesign(d, card));
    expect(stuckSwitches(results)).toEqual([]);
    const faked = results.map((r) => ({
      ...r,
      switches: r.switches.map((s) =>
        s.name === 's_gnd' ? { ...s, status: 'never' as const, detail: 'gate never reaches its threshold' } : s,
      ),
    }));
    const stuck = stuckSwitches(faked);
    expect(stuck.map((s) => [s.switch, s.status, s.corners.length])).toEqual([['s_gnd', 'never', 45]]);
  });
});
