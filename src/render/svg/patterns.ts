/** Fills that mark a failure without colour: diagonal hatching. Ids carry a prefix per drawing. */
import type { Svg } from '@svgdotjs/svg.js';
import { FAIL, FAIL_TINT } from '../palette.js';

export function failHatchId(prefix: string): string {
  return `${prefix}-fail-hatch`;
}

export function defineFailHatch(root: Svg, prefix: string): string {
  const id = failHatchId(prefix);
  const pattern = root
    .defs()
    .element('pattern')
    .attr({ id, width: 7, height: 7, patternUnits: 'userSpaceOnUse', patternTransform: 'rotate(45)' });
  pattern.element('rect').attr({ width: 7, height: 7, fill: FAIL_TINT });
  pattern.element('line').attr({ x1: 0, y1: 0, x2: 0, y2: 7, stroke: FAIL, 'stroke-width': 2.5 });
  return `url(#${id})`;
}

/** The failure hatch with a clear ground: laid over drawn marks, it leaves them visible. */
export function defineOpenFailHatch(root: Svg, prefix: string): string {
  const id = `${prefix}-fail-hatch-open`;
  const pattern = root
    .defs()
    .element('pattern')
    .attr({ id, width: 7, height: 7, patternUnits: 'userSpaceOnUse', patternTransform: 'rotate(45)' });
  pattern.element('line').attr({ x1: 0, y1: 0, x2: 0, y2: 7, stroke: FAIL, 'stroke-width': 1.5, 'stroke-opacity': 0.8 });
  return `url(#${id})`;
}
