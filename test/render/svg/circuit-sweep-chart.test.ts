/** The chart of output and efficiency against clock frequency; well-formedness judged by xmllint (Debian package libxml2-utils). */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { tempDir } from '../../helpers.js';
import type { CircuitSweep } from '../../../src/analysis/circuit-sweep.js';
import { renderCircuitSweepChart } from '../../../src/render/svg/circuit-sweep-chart.js';
import { all, parseSvg } from '../svg-dom.js';
import { requireTool } from '../../tools.js';

requireTool('xmllint', 'libxml2-utils');

const f0 = 20e6;
const factors = [0.25, 0.5, 1, 2];
const sweep: CircuitSweep = {
  designFrequency: f0,
  efficiencyMin: 0.4,
  series: [
    {
      corner: 'tt/1.8V/27C',
      role: 'typical',
      outputMin: 3.15,
      outputMax: 3.6,
      points: factors.map((k, i) => ({
        frequency: f0 * k,
        output: 2.6 + 0.25 * i,
        efficiency: 0.6 - 0.08 * i,
        pass: i === 2,
        outputPass: i >= 2,
        efficiencyPass: i < 3,
      })),
    },
    {
      corner: 'ff/<b>&',
      role: 'worst',
      outputMin: 3.465,
      outputMax: 3.96,
      points: factors.map((k, i) => ({
        frequency: f0 * k,
        output: i === 1 ? null : 3 + 0.2 * i,
        efficiency: i === 1 ? null : 0.58 - 0.08 * i,
        pass: i === 1 ? null : true,
        outputPass: i === 1 ? null : true,
        efficiencyPass: i === 1 ? null : true,
      })),
    },
  ],
};
const svg = renderCircuitSweepChart({ design: 'pump', output: 'out', sweep });
const root = parseSvg(svg);

const centre = (g: Element): [number, number] => {
  const m = g.querySelector('.marker')!;
  if (m.nodeName === 'circle') return [Number(m.getAttribute('cx')), Number(m.getAttribute('cy'))];
  return [
    Number(m.getAttribute('x')) + Number(m.getAttribute('width')) / 2,
    Number(m.getAttribute('y')) + Number(m.getAttribute('height')) / 2,
  ];
};

describe('renderCircuitSweepChart', () => {
  it('is well-formed XML with the corner name as text (xmllint)', () => {
    const file = join(tempDir(), 'c.svg');
    writeFileSync(file, svg);
    expect(spawnSync('xmllint', ['--noout', file]).status).toBe(0);
    expect(all(root, '.legend-label').map((t) => t.textContent)).toContain('ff/<b>&');
  });

  it('plots every computed point with its value, and leaves out the one without a steady state', () => {
    const out = all(root, '.series-output .point');
    expect(out.map((p) => Number(p.getAttribute('data-output')))).toEqual([2.6, 2.85, 3.1, 3.35, 3, 3.4, 3.6]);
    expect(all(root, '.series-efficiency .point').map((p) => Number(p.getAttribute('data-efficiency')))).toEqual(
      [60, 52, 44, 36, 58, 42, 34].map((v) => expect.closeTo(v, 9)) as unknown as number[],
    );
    expect(root.querySelector('.missing-note')!.textContent).toBe('no steady state (not drawn): 10.0 MHz at ff/<b>&');
  });

  it('places the points on a log frequency axis and a linear volt axis', () => {
    const pts = all(root, '.series-output')[0]!.querySelectorAll('.point');
    const c = [...pts].map(centre);
    // Equal frequency ratios are equal steps across.
    expect(c[1]![0] - c[0]![0]).toBeCloseTo(c[2]![0] - c[1]![0], 1);
    expect(c[2]![0] - c[1]![0]).toBeCloseTo(c[3]![0] - c[2]![0], 1);
    // Equal volt steps are equal steps up.
    expect(c[0]![1] - c[1]![1]).toBeCloseTo(c[1]![1] - c[2]![1], 1);
    expect(c[1]![1]).toBeLessThan(c[0]![1]);
  });

  it('marks the design frequency through the point at 20 MHz', () => {
    const line = root.querySelector('.design-frequency line')!;
    const at = [...all(root, '.series-output')[0]!.querySelectorAll('.point')].map(centre)[2]!;
    expect(Number(line.getAttribute('x1'))).toBeCloseTo(at[0], 1);
    expect(root.querySelector('.design-frequency-label')!.textContent).toBe('design 20.0 MHz');
  });

  it('crosses out the points that miss their own requirement in each panel', () => {
    expect(all(root, '.series-output')[0]!.querySelectorAll('.point').length).toBe(4);
    expect([...all(root, '.series-output')[0]!.querySelectorAll('.point')].map((p) => p.querySelector('.fail-cross') !== null)).toEqual([
      true,
      true,
      false,
      false,
    ]);
    expect([...all(root, '.series-efficiency')[0]!.querySelectorAll('.point')].map((p) => p.querySelector('.fail-cross') !== null)).toEqual(
      [false, false, false, true],
    );
  });

  it('draws the requirements at their values', () => {
    expect(all(root, '.requirements line').map((l) => [l.getAttribute('class'), Number(l.getAttribute('data-value'))])).toEqual([
      ['output-min', 3.15],
      ['output-max', 3.6],
      ['output-min', 3.465],
      ['output-max', 3.96],
      ['efficiency-min', 0.4],
    ]);
  });
});
