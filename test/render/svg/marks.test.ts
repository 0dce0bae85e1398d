import { describe, expect, it } from 'vitest';
import { createCanvas } from '../../../src/render/svg/canvas.js';
import { dimensionMark } from '../../../src/render/svg/marks.js';
import { FAIL } from '../../../src/render/palette.js';
import { all, parseSvg } from '../svg-dom.js';

describe('dimensionMark', () => {
  const draw = (fail: boolean) => {
    const canvas = createCanvas(200, 100, 'mark');
    dimensionMark(canvas.root.group(), { x: 40, y: 10 }, { x: 120, y: 30 }, 60, fail);
    return parseSvg(canvas.finish());
  };
  const coords = (l: Element) => ['x1', 'y1', 'x2', 'y2'].map((a) => Number(l.getAttribute(a)));

  it('drops a dashed extension line from each feature to 5 px below the dimension line', () => {
    const dashed = all(draw(false), 'line').filter((l) => l.getAttribute('stroke-dasharray') === '3 2');
    expect(dashed.map(coords)).toEqual([
      [40, 10, 40, 65],
      [120, 30, 120, 65],
    ]);
  });

  it('draws the dimension line between the two features at its height', () => {
    const solid = all(draw(false), 'line').filter((l) => l.getAttribute('stroke-dasharray') === null);
    expect(solid.map(coords)).toContainEqual([40, 60, 120, 60]);
    expect(all(draw(false), 'polygon')).toHaveLength(2);
  });

  it('draws every line in the failure colour when the mark fails', () => {
    expect(all(draw(true), 'line').every((l) => l.getAttribute('stroke') === FAIL)).toBe(true);
  });
});
