/** Dimension marks: a line with arrowheads between two instants, extension lines, and its labels. */
import type { G } from '@svgdotjs/svg.js';
import { FAIL, INK, MUTED } from '../palette.js';
import { points, round } from './canvas.js';

const ARROW = 6;

/** Extension line from a feature down (or up) to a dimension line. */
export function extensionLine(g: G, x: number, y0: number, y1: number, fail: boolean): void {
  g.line(round(x), round(y0), round(x), round(y1)).stroke({ color: fail ? FAIL : MUTED, width: 1, dasharray: '3 2' });
}

/**
 * Dimension line from x0 to x1 at y with arrowheads pointing at both ends. A span too short for
 * inward arrows gets outward ones; a negative span (x1 < x0) is drawn the same way, reversed.
 */
export function dimensionLine(g: G, x0: number, x1: number, y: number, fail: boolean): void {
  const colour = fail ? FAIL : INK;
  const lo = Math.min(x0, x1);
  const hi = Math.max(x0, x1);
  const inward = hi - lo >= 2.5 * ARROW;
  g.line(round(inward ? lo : lo - 3 * ARROW), round(y), round(inward ? hi : hi + 3 * ARROW), round(y)).stroke({
    color: colour,
    width: fail ? 1.8 : 1.2,
  });
  const head = (x: number, dir: 1 | -1) =>
    g
      .polygon(
        points([
          [x, y],
          [x + dir * ARROW, y - ARROW / 2.2],
          [x + dir * ARROW, y + ARROW / 2.2],
        ]),
      )
      .fill(colour);
  head(lo, inward ? 1 : -1);
  head(hi, inward ? -1 : 1);
  g.line(round(lo), round(y - 5), round(lo), round(y + 5)).stroke({ color: colour, width: 1 });
  g.line(round(hi), round(y - 5), round(hi), round(y + 5)).stroke({ color: colour, width: 1 });
}

/** A dimension between two features: an extension line from each down to just past the dimension line at y, then the line. */
export function dimensionMark(
  g: G,
  from: { readonly x: number; readonly y: number },
  to: { readonly x: number; readonly y: number },
  y: number,
  fail: boolean,
): void {
  extensionLine(g, from.x, from.y, y + 5, fail);
  extensionLine(g, to.x, to.y, y + 5, fail);
  dimensionLine(g, from.x, to.x, y, fail);
}

/** A small marker that reads without colour: a filled circle (pass) or a cross in a box (fail). */
export function verdictGlyph(g: G, x: number, y: number, pass: boolean): void {
  if (pass) {
    g.circle(8).center(round(x), round(y)).fill(INK);
    return;
  }
  g.rect(11, 11).center(round(x), round(y)).fill('#ffffff').stroke({ color: FAIL, width: 1.6 });
  g.line(round(x - 3.5), round(y - 3.5), round(x + 3.5), round(y + 3.5)).stroke({ color: FAIL, width: 1.8 });
  g.line(round(x - 3.5), round(y + 3.5), round(x + 3.5), round(y - 3.5)).stroke({ color: FAIL, width: 1.8 });
}
