import { describe, expect, it } from 'vitest';
import { drawMarker, type MarkerStyle } from '../../../src/render/svg/markers.js';
import { createCanvas } from '../../../src/render/svg/canvas.js';
import type { MarkerShape } from '../../../src/render/palette.js';
import { all, parseSvg, pointList } from '../svg-dom.js';

const STYLE: MarkerStyle = { radius: 4, colour: '#112233', fill: '#ffffff', width: 1.5, crossWidth: 2 };

function drawn(shape: MarkerShape): Element {
  const canvas = createCanvas(100, 100, 'marker');
  drawMarker(canvas.root.group(), shape, 50, 40, STYLE);
  return parseSvg(canvas.finish());
}

describe('drawMarker', () => {
  it('draws a circle of the radius about the point, filled and outlined as the style says', () => {
    const [c] = all(drawn('circle'), 'circle.marker');
    expect(c!.getAttribute('r')).toBe('4');
    expect([c!.getAttribute('cx'), c!.getAttribute('cy')]).toEqual(['50', '40']);
    expect(c!.getAttribute('fill')).toBe('#ffffff');
    expect(c!.getAttribute('stroke')).toBe('#112233');
    expect(c!.getAttribute('stroke-width')).toBe('1.5');
  });

  it('draws a square as a closed polygon 0.85 radius either side of the point', () => {
    const [p] = all(drawn('square'), 'polygon.marker');
    expect(pointList(p!)).toEqual([
      [46.6, 36.6],
      [53.4, 36.6],
      [53.4, 43.4],
      [46.6, 43.4],
    ]);
  });

  it('draws triangle, diamond and nabla as polygons of three, four and three corners', () => {
    expect(pointList(all(drawn('triangle'), 'polygon.marker')[0]!)).toHaveLength(3);
    expect(pointList(all(drawn('diamond'), 'polygon.marker')[0]!)).toHaveLength(4);
    const nabla = pointList(all(drawn('nabla'), 'polygon.marker')[0]!);
    // Point down: the third corner is below the centre.
    expect(nabla[2]).toEqual([50, 44]);
  });

  it('draws a cross as two diagonal lines of the cross width through the point', () => {
    const lines = all(drawn('cross'), 'line');
    expect(lines).toHaveLength(2);
    expect(lines.map((l) => ['x1', 'y1', 'x2', 'y2'].map((a) => Number(l.getAttribute(a))))).toEqual([
      [46, 36, 54, 44],
      [46, 44, 54, 36],
    ]);
    expect(lines.every((l) => l.getAttribute('stroke-width') === '2')).toBe(true);
  });
});
