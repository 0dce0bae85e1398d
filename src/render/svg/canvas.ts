/**
 * A fresh SVG document for one drawing (svg.js on svgdom's window, so it runs in Node). Every
 * drawing gets its own window: nothing is shared between renders.
 */
import { createSVGWindow } from 'svgdom';
import { SVG, registerWindow, type Svg } from '@svgdotjs/svg.js';
import { xmlDocument, xmlText } from './xml-text.js';

export interface Canvas {
  readonly root: Svg;
  /** The finished document as text. */
  finish(): string;
}

export function createCanvas(width: number, height: number, title: string): Canvas {
  const window = createSVGWindow();
  registerWindow(window, window.document);
  const root = SVG(window.document.documentElement) as Svg;
  root.clear();
  root.attr({ width: round(width), height: round(height), viewBox: `0 0 ${round(width)} ${round(height)}`, role: 'img' });
  root.element('title').words(xmlText(title));
  return {
    root,
    finish: () => `${xmlDocument(root.svg())}\n`,
  };
}

/** Coordinates are written with at most two decimals, so files are small and stable. */
export function round(x: number): number {
  if (!Number.isFinite(x)) throw new Error(`internal: non-finite coordinate ${x}`);
  const r = Math.round(x * 100) / 100;
  return Object.is(r, -0) ? 0 : r;
}

/** An SVG points list from [x, y] pairs. */
export function points(list: ReadonlyArray<readonly [number, number]>): string {
  return list.map(([x, y]) => `${round(x)},${round(y)}`).join(' ');
}
