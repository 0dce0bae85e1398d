import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { design, expectClose, resolveYaml } from '../helpers.js';
import { evaluateCorner } from '../../src/analysis/evaluate.js';
import { chargePackets, circuitWaves } from '../../src/render/circuit-waves.js';

const resolved = resolveYaml(readFileSync(design('doubler-pump'), 'utf8'));
const typical = resolved.corners.find((c) => c.corner.name === 'tt/1.8V/27C')!.corner;
const result = evaluateCorner(resolved, typical);

describe('circuitWaves', () => {
  const waves = circuitWaves(resolved, result)!;

  it('draws the output, then each capacitor plate that is a circuit node, named as in the design file', () => {
    expect(waves.corner).toBe('tt/1.8V/27C');
    expect(waves.nodes.map((n) => [n.node, n.role, n.note])).toEqual([
      ['out', 'output', 'output'],
      ['top', 'plate', 'c_fly top plate'],
      ['bottom', 'plate', 'c_fly bottom plate'],
    ]);
  });

  it("keeps the solver's output extremes, mean and ripple", () => {
    const c = result.circuit!;
    const out = waves.nodes[0]!;
    expect(out.min).toBeCloseTo(c.trace.outputMin, 12);
    expect(out.max).toBeCloseTo(c.trace.outputMax, 12);
    expect(out.max - out.min).toBeCloseTo(c.ripple, 12);
    expect(out.mean).toBe(c.output);
    expect(waves.ripple).toBe(c.ripple);
  });

  it('spans one period from the window start, ascending, with every solver sample', () => {
    const period = 1 / resolved.design.clock.frequency;
    for (const n of waves.nodes) {
      expect(n.points[0]![0]).toBe(0);
      expect(n.points[n.points.length - 1]![0]).toBeCloseTo(period, 20);
      for (let i = 1; i < n.points.length; i++) expect(n.points[i]![0]).toBeGreaterThanOrEqual(n.points[i - 1]![0]);
      // The trace's boundaries less the repeated last one, plus the two ends of the window.
      expect(n.points.length).toBe(result.circuit!.trace.times.length - 1 + 2);
    }
  });

  it("puts the bottom plate at ground while p1 conducts and at VDD while p2 does (the doubler's two states)", () => {
    const bottom = waves.nodes[2]!;
    const at = (t: number) => bottom.points.reduce((best, p) => (Math.abs(p[0] - t) < Math.abs(best[0] - t) ? p : best))[1];
    // p1 is high from about 2 ns to 25 ns and p2 from about 27 ns to 50 ns at this corner (timing diagram).
    expect(at(15e-9)).toBeCloseTo(0, 3);
    expect(at(40e-9)).toBeCloseTo(1.8, 2);
  });

  it('finds one charge packet lifting the output by the ripple, while p2 hands the top plate to the output', () => {
    expect(waves.packets.length).toBe(1);
    const p = waves.packets[0]!;
    // After p1 has fallen (about 27 ns) and within the period: the transfer switch conducts from
    // 29.18 ns and the packet ends at the solver's sample at 34.97 ns, on its level shifter's edge
    // fitted at every corner with its first stages' switching points and its output swing (29.19 and
    // 34.98 ns without them; 29.21 and 34.99 ns on the nominal-corner shifter fits; 29.19 and 34.97
    // ns on a linear ramp and the earlier shifter fits; 29.25 and 35.02 ns before the
    // drive law's bend below full drive and the drains' Miller overlap; 29.26 and 35.04 ns before the
    // card stated its drain saturation voltage, 29.10 and 34.89 ns before its alpha-power refit), pinned to 10 ps.
    expect(p.start).toBeGreaterThan(27e-9);
    expect(p.end).toBeLessThan(50e-9);
    expectClose(p.start, 29.182e-9, 0.01e-9, 'abs');
    expectClose(p.end, 34.967e-9, 0.01e-9, 'abs');
    expect(p.rise).toBeGreaterThan(0.9 * waves.ripple);
    expect(p.rise).toBeLessThanOrEqual(waves.ripple + 1e-12);
  });

  it('is null for a design without a circuit', () => {
    const plain = resolveYaml(readFileSync(design('doubler'), 'utf8'));
    expect(circuitWaves(plain, evaluateCorner(plain, plain.corners[0]!.corner))).toBeNull();
  });
});

describe('chargePackets', () => {
  it.each([
    [
      'a sawtooth: one rise',
      [
        [0, 1],
        [1, 0.9],
        [2, 0.8],
        [3, 1],
        [4, 0.95],
      ],
      1,
      [{ start: 2, end: 3, rise: 0.2 }],
    ],
    [
      'a flat line: none',
      [
        [0, 1],
        [1, 1],
        [2, 1],
      ],
      1,
      [],
    ],
    [
      'a rise across the period end: one packet',
      [
        [0, 1.1],
        [1, 1.2],
        [2, 1.1],
        [3, 1.0],
        [4, 1.05],
      ],
      1,
      [{ start: 3, end: 5, rise: 0.15 }],
    ],
    [
      'a negative output: the packet is the fall',
      [
        [0, -1],
        [1, -0.9],
        [2, -1.2],
        [3, -1.1],
      ],
      -1,
      [{ start: 1, end: 2, rise: -0.3 }],
    ],
  ] as const)('%s', (_, pts, sign, expected) => {
    const values = pts.map((p) => p[1]);
    const ripple = Math.max(...values) - Math.min(...values);
    const got = chargePackets(pts, ripple, sign);
    expect(got.length).toBe(expected.length);
    got.forEach((g, i) => {
      expect(g.start).toBe(expected[i]!.start);
      expect(g.end).toBe(expected[i]!.end);
      expect(g.rise).toBeCloseTo(expected[i]!.rise, 12);
    });
  });
});
