import { describe, expect, it } from 'vitest';
import { bandOutline, crossingAt, edgeGroups, type EdgeGroup } from '../../src/render/svg/envelope.js';
import type { DiagramRow } from '../../src/render/diagram.js';
import { expectClose } from '../helpers.js';

function group(ramps: Array<[number, number]>, rising = true): EdgeGroup {
  const rs = ramps.map(([t50, transition]) => ({ t50, transition, rising }));
  return {
    rising,
    ramps: rs,
    corners: rs.map((_, i) => `c${i}`),
    t50Min: Math.min(...rs.map((r) => r.t50)),
    t50Max: Math.max(...rs.map((r) => r.t50)),
  };
}

describe('bandOutline', () => {
  it('spans exactly the earliest and latest 50 % time at mid level', () => {
    const g = group([
      [1e-9, 100e-12],
      [1.3e-9, 300e-12],
      [1.1e-9, 50e-12],
    ]);
    const outline = bandOutline(g).outline;
    const mids = outline.filter(([, v]) => v === 0.5).map(([t]) => t);
    expect(mids).toEqual([1e-9, 1.3e-9]);
  });

  it('follows the lower and upper envelope of the ramps at every level (exact at the crossing of two ramps)', () => {
    // A fast late ramp and a slow early one cross: the left side switches ramp part way up.
    const g = group([
      [1.0e-9, 800e-12],
      [1.1e-9, 100e-12],
    ]);
    const outline = bandOutline(g).outline;
    for (let k = 0; k <= 20; k++) {
      const v = k / 20;
      const left = Math.min(...g.ramps.map((r) => crossingAt(r, v)));
      const right = Math.max(...g.ramps.map((r) => crossingAt(r, v)));
      const onLeft = interpolate(outline.slice(0, outline.findIndex(([, lv]) => lv === 1) + 1), v);
      const onRight = interpolate(outline.slice(outline.findIndex(([, lv]) => lv === 1) + 1), v);
      expectClose(onLeft, left, 1e-9);
      expectClose(onRight, right, 1e-9);
    }
  });

  it('handles falling edges (time grows as the level drops)', () => {
    const g = group(
      [
        [2e-9, 200e-12],
        [2.4e-9, 200e-12],
      ],
      false,
    );
    const outline = bandOutline(g).outline;
    expect(outline[0]).toEqual([2.1e-9, 0]);
    expect(outline[outline.length - 1]).toEqual([2.5e-9, 0]);
  });
});

/** Time on one side of an outline (monotone in level) at level v. */
function interpolate(path: ReadonlyArray<readonly [number, number]>, v: number): number {
  const sorted = [...path].sort((a, b) => a[1] - b[1]);
  for (let i = 1; i < sorted.length; i++) {
    const [t0, v0] = sorted[i - 1]!;
    const [t1, v1] = sorted[i]!;
    if (v >= v0 && v <= v1) return v1 === v0 ? t0 : t0 + ((t1 - t0) * (v - v0)) / (v1 - v0);
  }
  throw new Error(`level ${v} outside the outline`);
}

describe('edgeGroups', () => {
  it('pairs each reference edge with the same-direction edge of every corner, across the period boundary', () => {
    const T = 10e-9;
    const wave = (t: number) => ({
      net: 'p1',
      period: T,
      initial: 0 as const,
      ramps: [
        { t50: t, transition: 1e-10, rising: true },
        { t50: 5e-9, transition: 1e-10, rising: false },
      ],
    });
    const row: DiagramRow = {
      net: 'p1',
      role: 'phase',
      phase: 0,
      // One corner's rising edge lands just before the period start, so it is reported near T.
      waves: [
        { corner: 'a', wave: wave(0.2e-9) },
        { corner: 'b', wave: wave(9.9e-9) },
      ],
      reference: wave(0.2e-9),
    };
    const [rise] = edgeGroups(row);
    expectClose(rise!.t50Min, -0.1e-9, 1e-6);
    expectClose(rise!.t50Max, 0.2e-9, 1e-6);
    expect(rise!.corners).toEqual(['a', 'b']);
  });
});
