import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { scaleLinear } from 'd3-scale';
import { evaluateAll, type CornerResult } from '../../src/analysis/evaluate.js';
import { resolveDesign, type ResolvedDesign } from '../../src/analysis/resolve.js';
import { loadDesign } from '../../src/cli/load.js';
import { worstCornerIndex } from '../../src/analysis/corner-choice.js';
import { buildDiagram } from '../../src/render/diagram.js';
import { renderTimingSvg } from '../../src/render/svg/timing.js';
import { design, tempDir } from '../helpers.js';
import { all, parseSvg, pointList } from './svg-dom.js';
import { requireTool } from '../tools.js';

function evaluate(name: string, set: string[] = []): { resolved: ResolvedDesign; results: CornerResult[] } {
  const { design: d, card } = loadDesign(design(name), set);
  const resolved = resolveDesign(d, card);
  return { resolved, results: evaluateAll(resolved) };
}

const doubler = evaluate('doubler');
const integrator = evaluate('sc-integrator');
const tight = evaluate('too-tight');
/** The same generator held to a least dead time it cannot meet at the fast corners. */
const tightDead = evaluate('too-tight', ['requirements.deadTime.min=400ps']);

function draw(
  e: { resolved: ResolvedDesign; results: CornerResult[] },
  kind: 'corner' | 'all',
  index: number,
  nets: 'phases' | 'all' = 'phases',
): string {
  const choice = kind === 'corner' ? ({ kind, index } as const) : ({ kind, reference: index } as const);
  return renderTimingSvg(buildDiagram(e.resolved, e.results, choice, nets));
}

const ps = (s: number) => `${Math.round(s * 1e12)} ps`;
const expectCloseSum = (a: number, b: number) => expect(Math.abs(a - b)).toBeLessThan(1e-15);

describe('renderTimingSvg', () => {
  requireTool('rsvg-convert', 'librsvg2-bin');
  it('writes well-formed XML that librsvg (Debian librsvg2-bin, rsvg-convert) also reads', () => {
    const svg = draw(integrator, 'corner', 0);
    expect(() => parseSvg(svg)).not.toThrow();
    const dir = tempDir();
    writeFileSync(join(dir, 'd.svg'), svg);
    execFileSync('rsvg-convert', ['-w', '400', join(dir, 'd.svg'), '-o', join(dir, 'd.png')]);
  });

  it('has one row per signal in order in every panel: clock, its complement, phases, complements, early phases', () => {
    const svg = parseSvg(draw(integrator, 'corner', 0));
    for (const panel of ['overview', 'detail-a', 'detail-b']) {
      const rows = all(svg, `g.panel-${panel} .signal-row`).map((e) => e.getAttribute('data-signal'));
      expect(rows).toEqual(['clk', 'clkb', 'p1', 'p2', 'p1b', 'p2b', 'p1e', 'p2e']);
    }
    const labels = all(svg, '.row-labels.detail .row-label').map((e) => e.textContent);
    expect(labels).toEqual(['clk', 'clkb', 'p1', 'p2', 'p1b', 'p2b', 'p1e', 'p2e']);
  });

  it('adds every internal net after them with --nets all', () => {
    const svg = parseSvg(draw(doubler, 'corner', 0, 'all'));
    const rows = all(svg, 'g.panel-overview .signal-row').map((e) => e.getAttribute('data-signal'));
    expect(rows.slice(0, 4)).toEqual(['clk', 'clkb', 'p1', 'p2']);
    expect(new Set(rows)).toEqual(new Set(doubler.resolved.netlist.netNames));
    expect(rows.length).toBe(doubler.resolved.netlist.netNames.length);
  });

  it('labels each handover with the dead time the engine measured, in whole picoseconds', () => {
    for (const [e, index] of [
      [doubler, 0],
      [integrator, 7],
      [tight, worstCornerIndex(tight.results)],
    ] as const) {
      const result = e.results[index]!;
      if (!result.measurement.ok) throw new Error('fixture corner did not settle');
      const svg = parseSvg(draw(e, 'corner', index));
      const labels = all(svg, 'text.dead-time-label');
      expect(labels.length).toBe(2);
      for (const d of result.measurement.deadTimes) {
        const label = labels.find((l) => l.getAttribute('data-from') === d.from && l.getAttribute('data-to') === d.to);
        expect(label?.textContent?.startsWith(`dead time ${ps(d.t50)}`)).toBe(true);
      }
    }
  });

  it('marks a failing dead time with hatching, a glyph and the word FAIL', () => {
    const index = tightDead.results.findIndex((r) => r.corner.name === 'ff/1.98V/-40C');
    const result = tightDead.results[index]!;
    expect(result.checks.some((c) => c.kind === 'dead-time-min' && !c.pass)).toBe(true);
    const text = draw(tightDead, 'corner', index);
    const svg = parseSvg(text);
    const failing = all(svg, 'text.dead-time-label').filter((l) => l.textContent?.includes('\u2715 FAIL'));
    expect(failing.length).toBeGreaterThan(0);
    expect(all(svg, 'rect.dead-zone.fail').length).toBeGreaterThan(0);
    expect(all(svg, 'rect.dead-zone.fail')[0]!.getAttribute('fill')).toMatch(/^url\(#.*fail-hatch\)$/);
    expect(all(svg, 'text.verdict')[0]!.textContent).toBe('\u2715 FAIL');
  });

  it('marks a failing break-before-make handover with hatching and the word FAIL', () => {
    const index = worstCornerIndex(tight.results);
    const failing = tight.results[index]!.checks.filter((c) => c.kind === 'break-before-make' && !c.pass);
    expect(failing.length).toBeGreaterThan(0);
    const svg = parseSvg(draw(tight, 'corner', index));
    const labels = all(svg, 'text.bbm-label').filter((l) => l.textContent!.endsWith('\u2715 FAIL'));
    expect(labels.length).toBeGreaterThan(0);
    expect(all(svg, 'rect.bbm-fail').length).toBe(labels.length);
    // The worst handover's margin (gap minus guard) is the check's margin.
    const least = Math.min(...labels.map((l) => Number(l.getAttribute('data-margin'))));
    expect(least).toBeCloseTo(Math.min(...failing.map((c) => c.margin!)), 18);
    // Its note adds up: the handover less the guard and the model's switch-instant error the check
    // takes off (the part's need beyond the guard) is the margin shown.
    const part = failing[0]!.parts!.find((q) => q.margin === failing[0]!.margin)!;
    const error = part.need! - 50e-12;
    expect(error).toBeGreaterThan(10e-12);
    const notes = all(svg, 'text.mark-note').map((n) => n.textContent!);
    expect(notes).toContain(`margin ${Math.round(part.margin * 1e12)} ps (guard 50 ps + model error ${ps(error)})`);
    expectCloseSum(part.span! - 50e-12 - error, part.margin);
  });

  it('labels every break-before-make handover with the gap between the switches', () => {
    const index = worstCornerIndex(doubler.results);
    const result = doubler.results[index]!;
    const svg = parseSvg(draw(doubler, 'corner', index));
    const labels = all(svg, 'text.bbm-label');
    expect(labels.length).toBe(4);
    const off = (n: string) => result.switches.find((s) => s.name === n)!;
    // s_gnd stops, then s_vdd starts: the gap is s_vdd's turn-on minus s_gnd's turn-off, one period apart at most.
    const T = result.simulation.period;
    const gap = (((off('s_vdd').on - off('s_gnd').off) % T) + T) % T;
    const label = labels.find((l) => l.getAttribute('data-from') === 's_gnd' && l.getAttribute('data-to') === 's_vdd')!;
    expect(label.textContent).toBe(`s_gnd off to s_vdd on ${ps(gap)}`);
  });

  it('draws the overlay envelope of each edge from exactly the earliest to the latest corner', () => {
    const reference = worstCornerIndex(integrator.results);
    const diagram = buildDiagram(integrator.resolved, integrator.results, { kind: 'all', reference }, 'phases');
    const svg = parseSvg(renderTimingSvg(diagram));
    const T = diagram.period;
    const p1 = integrator.resolved.netlist.netIndex.get('p1')!;
    // The p1 rising 50 % times at every corner, straight from the simulator, relative to the clock edge.
    const rises = integrator.results.map((r) => {
      const e = r.simulation.edges;
      for (let i = 0; i < e.count; i++) if (e.net[i] === p1 && e.rising[i] === 1) return e.time[i]! - r.simulation.windowStart;
      throw new Error('no rising edge');
    });
    const lo = Math.min(...rises);
    const hi = Math.max(...rises);
    const bands = all(svg, 'g.panel-detail-a .signal-row[data-signal="p1"] polygon.edge-band').filter(
      (b) => Math.abs(Number(b.getAttribute('data-t50-min')) - lo) < 1e-15,
    );
    expect(bands.length).toBe(1);
    const band = bands[0]!;
    expect(Number(band.getAttribute('data-t50-max'))).toBeCloseTo(hi, 18);
    expect(band.getAttribute('data-corners')).toBe(String(integrator.results.length));
    // The polygon's two vertices at the 50 % level sit at the scale positions of those times.
    const panel = all(svg, 'g.panel-detail-a')[0]!;
    const w = diagram.windows[0];
    expect(Number(panel.getAttribute('data-from'))).toBe(w.from);
    const axisLine = all(svg, 'g.panel-detail-a .signal-row[data-signal="p1"] polyline.wave')[0]!;
    const xs = pointList(axisLine).map(([x]) => x);
    const scale = scaleLinear()
      .domain([w.from, w.to])
      .range([Math.min(...xs), Math.max(...xs)]);
    const ys = pointList(band).map(([, y]) => y);
    const midY = (Math.min(...ys) + Math.max(...ys)) / 2;
    const mids = pointList(band)
      .filter(([, y]) => Math.abs(y - midY) < 0.011)
      .map(([x]) => x)
      .sort((a, b) => a - b);
    expect(mids.length).toBe(2);
    expect(Math.abs(mids[0]! - scale(lo))).toBeLessThanOrEqual(0.005);
    expect(Math.abs(mids[1]! - scale(hi))).toBeLessThanOrEqual(0.005);
    void T;
  });

  it('gives the least and the most dead time over the corners in the overlay, with their corners', () => {
    const svg = parseSvg(draw(doubler, 'all', 0));
    const measured = doubler.results.filter((r) => r.measurement.ok);
    for (const index of [0, 1] as const) {
      const values = measured.map((r) => (r.measurement.ok ? r.measurement.deadTimes[index].t50 : NaN));
      const least = Math.min(...values);
      const most = Math.max(...values);
      const d = measured[0]!.measurement.ok ? measured[0]!.measurement.deadTimes[index] : null;
      const labels = all(svg, 'text.dead-time-label').filter((l) => l.getAttribute('data-from') === d!.from);
      expect(labels.map((l) => l.textContent).sort()).toEqual([`least dead time ${ps(least)}`, `most dead time ${ps(most)}`]);
      const leastCorner = measured[values.indexOf(least)]!.corner.name;
      expect(labels.find((l) => l.textContent!.startsWith('least'))!.getAttribute('data-corner')).toBe(leastCorner);
    }
  });

  it('never writes NaN, undefined or Infinity', () => {
    for (const e of [doubler, integrator, tight, tightDead]) {
      for (const text of [
        draw(e, 'corner', 0),
        draw(e, 'all', worstCornerIndex(e.results)),
        draw(e, 'corner', worstCornerIndex(e.results), 'all'),
      ]) {
        expect(text).not.toMatch(/NaN|undefined|Infinity/);
      }
    }
  });

  it('puts design, corner, frequency and verdict in the title block', () => {
    const svg = parseSvg(draw(doubler, 'corner', 4));
    const titles = all(svg, '.title-block text').map((t) => t.textContent ?? '');
    expect(titles[0]).toBe('doubler-clock');
    expect(titles[1]).toBe(`corner ${doubler.results[4]!.corner.name} · clock 20.0 MHz (period 50.0 ns)`);
    expect(titles).toContain(doubler.results[4]!.pass ? '\u2713 PASS' : '\u2715 FAIL');
  });
});

describe('renderTimingSvg: off-state strips', () => {
  const unboosted = evaluate('doubler-unboosted');
  const tt = unboosted.results.findIndex((r) => r.corner.name === 'tt/1.8V/27C');

  it('marks the intervals where each switch must be off: p2 and both dead times for a p1 switch', () => {
    const d = buildDiagram(unboosted.resolved, unboosted.results, { kind: 'corner', index: tt }, 'phases');
    const chg = d.switches.find((s) => s.name === 's_chg')!;
    expect(chg.offState!.intervals.map((i) => i.state)).toEqual(['the dead time', 'phase p2', 'the dead time']);
    // The intervals tile the period outside phase 1: from p1's fall to its next rise.
    const m = unboosted.results[tt]!.measurement;
    if (!m.ok) throw new Error('settles');
    const total = chg.offState!.intervals.reduce((sum, i) => sum + i.end - i.start, 0);
    expect(total).toBeCloseTo(d.period - m.widths.p1!, 15);
    expect(chg.offState!.pass).toBe(false);
    // By hand at tt/1.8V/27C, in p2: |V_T| = vth0 0.45 V (no dvth at tt, no temperature term at t0; the
    // top plate at 2 VDD = 3.6 V acts as source above the 1.8 V body, a forward bias, so no body effect),
    // less the design's 1.8 off-state decades of 1.5 * kT/q * ln 10 at 27 C (160.8 mV), less
    // V_SG = 3.6 - 1.8 V: 0.45 - 0.1608 - 1.8 = -1.5108 V. s_gnd (source and body at 0 V, gate at 0 V)
    // holds by 0.45 - 0.1608 = +289 mV.
    expect(chg.offState!.margin).toBeCloseTo(-1.510802, 5);
    expect(d.switches.find((s) => s.name === 's_gnd')!.offState!.pass).toBe(true);
  });

  it("hatches the failing switch's off intervals, names the reverse conduction in its lane and keeps the others grey", () => {
    const svg = parseSvg(draw(unboosted, 'corner', tt));
    const lanes = all(svg, 'g.panel-overview g.switch-lane');
    const chg = lanes.find((l) => l.getAttribute('data-switch') === 's_chg')!;
    expect(all(chg, 'g.off-state.fail rect.off-interval').length).toBeGreaterThan(0);
    expect(all(chg, 'text.off-state-label')[0]!.textContent).toBe('\u2715 off: FAILS -1.51 V in p2, reverse conduction');
    const gnd = lanes.find((l) => l.getAttribute('data-switch') === 's_gnd')!;
    expect(all(gnd, 'g.off-state.fail').length).toBe(0);
    expect(all(gnd, 'text.off-state-label')[0]!.textContent).toBe('off: holds +289 mV');
  });
});
