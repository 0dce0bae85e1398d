import { describe, expect, it } from 'vitest';
import { MAX_REPEATED_PERIODS, rampsBetween, wavePoints, type NetWave } from '../../src/render/waveform.js';
import { expectClose } from '../helpers.js';

const T = 10e-9;
const square: NetWave = {
  net: 'p1',
  period: T,
  initial: 0,
  ramps: [
    { t50: 2e-9, transition: 200e-12, rising: true },
    { t50: 6e-9, transition: 400e-12, rising: false },
  ],
};

describe('wavePoints', () => {
  it('draws each edge as a ramp from rail to rail centred on its 50 % time', () => {
    const pts = wavePoints(square, 0, T);
    expect(pts).toEqual(
      [
        [0, 0],
        [1.9e-9, 0],
        [2.1e-9, 1],
        [5.8e-9, 1],
        [6.2e-9, 0],
        [T, 0],
      ].map(([t, v]) => [expect.closeTo(t!, 20), v]),
    );
  });

  it('repeats the period on both sides of the reported one', () => {
    const pts = wavePoints(square, -5e-9, 3e-9);
    // The falling edge of the previous period sits at 6 ns - T = -4 ns.
    expect(pts[0]).toEqual([-5e-9, 1]);
    expectClose(pts[1]![0], -4.2e-9, 1e-9);
    expectClose(pts[2]![0], -3.8e-9, 1e-9);
    expect(pts[pts.length - 1]).toEqual([3e-9, 1]);
  });

  it('cuts a window inside a ramp at the interpolated level', () => {
    const pts = wavePoints(square, 2e-9, 2.05e-9);
    expectClose(pts[0]![1], 0.5, 1e-9);
    expectClose(pts[1]![1], 0.75, 1e-9);
  });

  it('meets two ramps that overlap (a pulse shorter than its edges) where their lines cross', () => {
    const pulse: NetWave = {
      net: 'x',
      period: T,
      initial: 0,
      ramps: [
        { t50: 1e-9, transition: 400e-12, rising: true },
        { t50: 1.2e-9, transition: 400e-12, rising: false },
      ],
    };
    const pts = wavePoints(pulse, 0, 3e-9);
    // Rising line 0.5 + (t - 1 ns)/0.4 ns and falling line 0.5 - (t - 1.2 ns)/0.4 ns cross at 1.1 ns, level 0.75.
    expect(pts.length).toBe(5);
    expectClose(pts[2]![0], 1.1e-9, 1e-9);
    expectClose(pts[2]![1], 0.75, 1e-9);
    expectClose(pts[3]![0], 1.4e-9, 1e-9);
    expect(pts[3]![1]).toBe(0);
  });

  it("draws a shaped edge through its model crossings, rail to rail, and its neighbours' ramps as before", () => {
    // A rising edge whose 10 % point comes 100 ps before its 50 % point and whose 90 % point 300 ps
    // after it (a slow tail), as the delay model shapes it.
    const shape: Array<[number, number]> = [
      [-150e-12, 0],
      [-100e-12, 0.1],
      [0, 0.5],
      [300e-12, 0.9],
      [450e-12, 1],
    ];
    const shaped: NetWave = { ...square, ramps: [{ ...square.ramps[0]!, shape }, square.ramps[1]!] };
    const pts = wavePoints(shaped, 0, T);
    expect(pts).toEqual(
      [
        [0, 0],
        [1.85e-9, 0],
        [1.9e-9, 0.1],
        [2e-9, 0.5],
        [2.3e-9, 0.9],
        [2.45e-9, 1],
        [5.8e-9, 1],
        [6.2e-9, 0],
        [T, 0],
      ].map(([t, v]) => [expect.closeTo(t!, 20), v]),
    );
  });

  it('draws a shaped edge as its ramp where its shape would run into the next edge', () => {
    const shape: Array<[number, number]> = [
      [-100e-12, 0],
      [0, 0.5],
      [4.5e-9, 1],
    ];
    const shaped: NetWave = { ...square, ramps: [{ ...square.ramps[0]!, shape }, square.ramps[1]!] };
    expect(wavePoints(shaped, 0, T)).toEqual(wavePoints(square, 0, T));
  });

  it('draws a net that never switches as a flat line at its level', () => {
    expect(wavePoints({ net: 'q', period: T, initial: 1, ramps: [] }, 0, T)).toEqual([
      [0, 1],
      [T, 1],
    ]);
  });
});

describe('rampsBetween', () => {
  it('lists every copy of every edge that reaches into the range', () => {
    const ramps = rampsBetween(square, 0, 2 * T);
    const inside = ramps.filter((r) => r.t50 >= 0 && r.t50 <= 2 * T).map((r) => r.t50);
    expect(inside.map((t) => Math.round(t * 1e12))).toEqual([2000, 6000, 12000, 16000]);
  });

  it('repeats over at most MAX_REPEATED_PERIODS + 1 periods around the window when an edge is far longer than the period', () => {
    const slow: NetWave = {
      net: 'clk',
      period: T,
      initial: 0,
      ramps: [
        { t50: 2e-9, transition: 1, rising: true },
        { t50: 7e-9, transition: 1, rising: false },
      ],
    };
    const ramps = rampsBetween(slow, 0, T);
    expect(ramps.length).toBe(2 * (MAX_REPEATED_PERIODS + 1));
    expect(ramps.some((r) => r.t50 === 2e-9)).toBe(true);
    expect(wavePoints(slow, 0, T).length).toBeLessThan(4 * (MAX_REPEATED_PERIODS + 1));
  });

  it('gives nothing for a window with an infinite end instead of looping', () => {
    expect(rampsBetween(square, -Infinity, T)).toEqual([]);
  });
});
