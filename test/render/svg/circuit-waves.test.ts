/**
 * The circuit rows of the timing diagram: the output trace's drawn extremes are the solver's
 * ripple on the row's volt axis, the rows share the whole period's time scale, and node names are
 * data. Well-formedness is judged by xmllint (Debian package libxml2-utils).
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { design, designFromYaml, processCard, resolveYaml, tempDir } from '../../helpers.js';
import { loadProcess } from '../../../src/cli/load.js';
import { resolveDesign } from '../../../src/analysis/resolve.js';
import { evaluateCorner } from '../../../src/analysis/evaluate.js';
import { buildDiagram } from '../../../src/render/diagram.js';
import { renderTimingSvg } from '../../../src/render/svg/timing.js';
import type { Design } from '../../../src/schema/design.js';
import { all, parseSvg, pointList } from '../../render/svg-dom.js';
import { requireTool } from '../../tools.js';

requireTool('xmllint', 'libxml2-utils');

function xmllint(svg: string): number | null {
  const file = join(tempDir(), 'd.svg');
  writeFileSync(file, svg);
  return spawnSync('xmllint', ['--noout', file], { encoding: 'utf8' }).status;
}

function drawn(resolved: ReturnType<typeof resolveYaml>, corner = 'tt/1.8V/27C') {
  const result = evaluateCorner(resolved, resolved.corners.find((c) => c.corner.name === corner)!.corner);
  const svg = renderTimingSvg(buildDiagram(resolved, [result], { kind: 'corner', index: 0 }, 'phases'));
  return { result, svg, root: parseSvg(svg) };
}

const pump = resolveYaml(readFileSync(design('doubler-pump'), 'utf8'));

describe('renderTimingSvg with a circuit', () => {
  const { result, svg, root } = drawn(pump);

  it('is well-formed XML (xmllint)', () => {
    expect(xmllint(svg)).toBe(0);
  });

  it('draws one row per node: out, top, bottom', () => {
    expect(all(root, '.circuit-row').map((r) => r.getAttribute('data-node'))).toEqual(['out', 'top', 'bottom']);
    expect(all(root, '.circuit-label').map((t) => t.textContent)).toEqual(['out', 'top', 'bottom']);
  });

  it("draws the output trace so its lowest and highest points are the solver's ripple apart, within a pixel", () => {
    const row = root.querySelector('.circuit-row.output')!;
    const [lo, hi] = row.getAttribute('data-domain')!.split(' ').map(Number) as [number, number];
    const [bottom, top] = row.getAttribute('data-plot')!.split(' ').map(Number) as [number, number];
    const ys = pointList(row.querySelector('.node-wave')!).map((p) => p[1]);
    const volts = (y: number) => lo + ((bottom - y) / (bottom - top)) * (hi - lo);
    const pxPerVolt = (bottom - top) / (hi - lo);
    const c = result.circuit!;
    expect(Math.abs(Math.max(...ys) - Math.min(...ys) - c.ripple * pxPerVolt)).toBeLessThanOrEqual(1);
    expect(Math.abs(volts(Math.min(...ys)) - c.trace.outputMax) * pxPerVolt).toBeLessThanOrEqual(1);
    expect(Math.abs(volts(Math.max(...ys)) - c.trace.outputMin) * pxPerVolt).toBeLessThanOrEqual(1);
    // The ripple mark spans the same extremes.
    expect(Number(row.querySelector('.ripple-mark')!.getAttribute('data-ripple'))).toBe(c.ripple);
    expect(Number(row.querySelector('.mean-line')!.getAttribute('y1'))).toBeCloseTo(bottom - (c.output - lo) * pxPerVolt, 1);
  });

  it('labels the volt axis with ticks inside the row, each at its value', () => {
    const row = root.querySelector('.circuit-row.output')!;
    const [lo, hi] = row.getAttribute('data-domain')!.split(' ').map(Number) as [number, number];
    const [bottom, top] = row.getAttribute('data-plot')!.split(' ').map(Number) as [number, number];
    const ticks = all(row, '.volt-tick');
    expect(ticks.length).toBeGreaterThanOrEqual(3);
    for (const t of ticks) {
      const m = /^(\d+\.\d+) V$/.exec(t.textContent ?? '')!;
      expect(m).not.toBeNull();
      const v = Number(m[1]);
      expect(v).toBeGreaterThanOrEqual(lo);
      expect(v).toBeLessThanOrEqual(hi);
      // Baseline 4 px under the tick's line.
      expect(Number(t.getAttribute('y')) - 4).toBeCloseTo(bottom - ((v - lo) / (hi - lo)) * (bottom - top), 0);
    }
  });

  it('runs every node trace across the whole-period panel, aligned with the phase waveforms', () => {
    const phase = root.querySelector('.panel-overview .signal-row[data-signal="p1"] .wave')!;
    const px = pointList(phase).map((p) => p[0]);
    for (const wave of all(root, '.circuit-row .node-wave')) {
      const xs = pointList(wave).map((p) => p[0]);
      expect(Math.min(...xs)).toBe(Math.min(...px));
      expect(Math.max(...xs)).toBe(Math.max(...px));
    }
  });

  it('shades the charge packet inside phase 2 and names it in the legend', () => {
    const packets = all(root, '.charge-packet');
    expect(packets.length).toBe(1);
    expect(all(root, '.legend-label').map((t) => t.textContent)).toContain('charge packet into the output');
  });

  it('leaves a design without a circuit without circuit rows', () => {
    const plain = resolveYaml(readFileSync(design('doubler'), 'utf8'));
    const r = evaluateCorner(plain, plain.corners[0]!.corner);
    const d = parseSvg(renderTimingSvg(buildDiagram(plain, [r], { kind: 'corner', index: 0 }, 'phases')));
    expect(all(d, '.circuit-waves').length).toBe(0);
  });
});

describe('renderTimingSvg with a hostile node name (validation bypassed)', () => {
  const hostile = 'o<u>t&"\'\u0001]]>';
  const base = designFromYaml(readFileSync(design('doubler-pump'), 'utf8'));
  const rename = (t: string | number) => (t === 'out' ? hostile : t);
  const { out: level, ...others } = base.nodes;
  const renamed: Design = {
    ...base,
    nodes: { ...others, [hostile]: level! },
    switches: base.switches.map((s) => ({
      ...s,
      terminals: s.terminals && ([rename(s.terminals[0]), rename(s.terminals[1])] as [string, string]),
    })),
    circuit: {
      ...base.circuit!,
      output: hostile,
      capacitors: base.circuit!.capacitors.map((c) => ({
        ...c,
        between: [rename(c.between[0]), rename(c.between[1])] as [string, string],
      })),
    },
  };
  const resolved = resolveDesign(renamed, loadProcess(processCard('generic180')));
  const { svg, root } = drawn(resolved);

  it('writes the name as text (xmllint accepts the file; the forbidden control character is dropped)', () => {
    expect(xmllint(svg)).toBe(0);
    expect(svg).not.toContain('<u>');
    expect(root.querySelector('.circuit-label')!.textContent).toBe('o<u>t&"\']]>');
    expect(root.querySelector('.circuit-row.output')!.getAttribute('data-node')).toBe('o<u>t&"\']]>');
  });
});
