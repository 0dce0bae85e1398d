/**
 * The timing diagram draws each phase edge as the delay model shapes it, so the picture shows the
 * clean gap and the switch instants the checks read, not a straight ramp of the same 10-90 % time.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { evaluateAll } from '../../src/analysis/evaluate.js';
import { buildDiagram } from '../../src/render/diagram.js';
import { wavePoints, type NetWave } from '../../src/render/waveform.js';
import { design, expectClose, resolveYaml } from '../helpers.js';

const resolved = resolveYaml(readFileSync(design('too-tight'), 'utf8'));
const results = evaluateAll(resolved);
const index = results.findIndex((r) => r.corner.name === 'sf/1.62V/125C');
const diagram = buildDiagram(resolved, results, { kind: 'corner', index }, 'phases');
const wave = (net: string): NetWave => diagram.rows.find((r) => r.net === net)!.reference;

/** Where the drawn line first crosses `level` going `up` (or down) inside [from, to], s. */
function crossing(w: NetWave, level: number, up: boolean, from: number, to: number): number {
  const pts = wavePoints(w, from, to);
  for (let k = 1; k < pts.length; k++) {
    const [t0, v0] = pts[k - 1]!;
    const [t1, v1] = pts[k]!;
    if (up ? v0 < level && v1 >= level : v0 > level && v1 <= level) return t0 + ((level - v0) * (t1 - t0)) / (v1 - v0);
  }
  return Number.NaN;
}

describe('buildDiagram with shaped edges (too-tight at sf/1.62V/125C)', () => {
  it("draws the phases' edges from the model's shape, not as straight ramps", () => {
    for (const net of ['p1', 'p2']) for (const r of wave(net).ramps) expect(r.shape?.length, net).toBe(21);
    expect(wave('clk').ramps.every((r) => r.shape === undefined)).toBe(true);
  });

  it('shows the clean gap p2 -> p1 the check reads between the drawn 10 % crossings (140 ps)', () => {
    const m = results[index]!.measurement;
    if (!m.ok) throw new Error(m.reason);
    const T = diagram.period;
    const p2Off = crossing(wave('p2'), 0.1, false, 0, 5e-9);
    const p1On = crossing(wave('p1'), 0.1, true, 0, 5e-9);
    expectClose(p1On - p2Off, m.deadTimes[1].gap, 1e-12, 'abs');
    expect(m.deadTimes[1].gap).toBeGreaterThan(100e-12);
    // And its 50 % points stay the dead time's.
    expectClose(crossing(wave('p1'), 0.5, true, 0, 5e-9) - crossing(wave('p2'), 0.5, false, 0, 5e-9), m.deadTimes[1].t50, 1e-12, 'abs');
    expect(T).toBe(50e-9);
  });
});
