/** Point markers told apart by shape, not only colour: circle, square, triangle, diamond, nabla, cross. */
import type { G } from '@svgdotjs/svg.js';
import type { MarkerShape } from '../palette.js';
import { points, round } from './canvas.js';

export interface MarkerStyle {
  /** Half the marker's size, px. */
  readonly radius: number;
  readonly colour: string;
  /** Inside of the closed shapes. */
  readonly fill: string;
  /** Outline of the closed shapes, px. */
  readonly width: number;
  /** Stroke of the cross's two lines, px. */
  readonly crossWidth: number;
}

export function drawMarker(g: G, shape: MarkerShape, x: number, y: number, style: MarkerStyle): void {
  const r = style.radius;
  const stroke = { color: style.colour, width: style.width };
  const poly = (pts: Array<[number, number]>) => g.polygon(points(pts)).fill(style.fill).stroke(stroke).attr({ class: 'marker' });
  switch (shape) {
    case 'circle':
      g.circle(2 * r)
        .center(round(x), round(y))
        .fill(style.fill)
        .stroke(stroke)
        .attr({ class: 'marker' });
      return;
    case 'square':
      poly([
        [x - r * 0.85, y - r * 0.85],
        [x + r * 0.85, y - r * 0.85],
        [x + r * 0.85, y + r * 0.85],
        [x - r * 0.85, y + r * 0.85],
      ]);
      return;
    case 'triangle':
      poly([
        [x, y - r],
        [x + r, y + r * 0.8],
        [x - r, y + r * 0.8],
      ]);
      return;
    case 'diamond':
      poly([
        [x, y - r * 1.1],
        [x + r, y],
        [x, y + r * 1.1],
        [x - r, y],
      ]);
      return;
    case 'nabla':
      poly([
        [x - r, y - r * 0.8],
        [x + r, y - r * 0.8],
        [x, y + r],
      ]);
      return;
    case 'cross':
      g.line(round(x - r), round(y - r), round(x + r), round(y + r))
        .stroke({ color: style.colour, width: style.crossWidth })
        .attr({ class: 'marker' });
      g.line(round(x - r), round(y + r), round(x + r), round(y - r)).stroke({ color: style.colour, width: style.crossWidth });
  }
}
