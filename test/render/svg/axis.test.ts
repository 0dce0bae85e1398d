import { describe, expect, it } from 'vitest';
import { scaleLinear } from 'd3-scale';
import { drawValueAxis } from '../../../src/render/svg/axis.js';
import { createCanvas } from '../../../src/render/svg/canvas.js';
import { all, parseSvg } from '../svg-dom.js';

describe('drawValueAxis', () => {
  const canvas = createCanvas(300, 200, 'axis');
  const y = scaleLinear().domain([0, 2]).range([180, 20]);
  drawValueAxis(
    canvas.root.group(),
    y,
    [
      { value: 0, label: '0 V' },
      { value: 1, label: '1 V' },
    ],
    60,
    280,
  );
  const svg = parseSvg(canvas.finish());
  const lines = all(svg, 'line').map((l) => ['x1', 'y1', 'x2', 'y2'].map((a) => Number(l.getAttribute(a))));

  it('draws a grid line across the plot at each tick, then the axis over the whole range', () => {
    expect(lines).toEqual([
      [60, 180, 280, 180],
      [60, 100, 280, 100],
      [60, 20, 60, 180],
    ]);
  });

  it('writes each label right-aligned 8 px left of the axis, 4 px below its tick', () => {
    const labels = all(svg, 'text.tick-label').map((t) => [
      t.textContent,
      t.getAttribute('x'),
      t.getAttribute('y'),
      t.getAttribute('text-anchor'),
    ]);
    expect(labels).toEqual([
      ['0 V', '52', '184', 'end'],
      ['1 V', '52', '104', 'end'],
    ]);
  });
});
