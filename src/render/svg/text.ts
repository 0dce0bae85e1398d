/**
 * Text placement without a font engine: a width estimate that errs wide, and a placer that moves
 * a label to the next free line when it would overlap one already placed.
 */
import type { G } from '@svgdotjs/svg.js';
import { FONT, INK, PAPER } from '../palette.js';
import { round } from './canvas.js';
import { xmlText } from './xml-text.js';

/** Estimated advance of a string, px; DejaVu Sans averages about 0.6 em, digits 0.64 em. */
export function textWidth(text: string, size: number, bold = false): number {
  return [...text].length * size * (bold ? 0.7 : 0.64);
}

/** The text cut to `width` px with an ellipsis, or whole when it fits. */
export function fitText(text: string, size: number, width: number, bold = false): string {
  if (textWidth(text, size, bold) <= width) return text;
  let t = text;
  while (t.length > 1 && textWidth(`${t}\u2026`, size, bold) > width) t = t.slice(0, -1);
  return `${t}\u2026`;
}

export interface Box {
  readonly x0: number;
  readonly y0: number;
  readonly x1: number;
  readonly y1: number;
}

export function overlaps(a: Box, b: Box): boolean {
  return a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1;
}

export type Anchor = 'start' | 'middle' | 'end';

export interface TextStyle {
  readonly size: number;
  readonly anchor?: Anchor;
  readonly bold?: boolean;
  readonly fill?: string;
  readonly family?: string;
  readonly className?: string;
  readonly data?: Readonly<Record<string, string>>;
  /** Paint a white outline under the glyphs so lines behind the label do not cut through it. */
  readonly halo?: boolean;
  /** Paint an opaque paper box under the label, so lines crossing it stop at its edge. */
  readonly ground?: boolean;
  /** Turns the label about its anchor point, degrees clockwise (-90 reads bottom to top). */
  readonly rotate?: number;
}

/** The box a label occupies with its baseline at y. */
export function textBox(text: string, x: number, y: number, style: TextStyle): Box {
  const w = textWidth(text, style.size, style.bold);
  const x0 = style.anchor === 'middle' ? x - w / 2 : style.anchor === 'end' ? x - w : x;
  return { x0, y0: y - style.size * 0.95, x1: x0 + w, y1: y + style.size * 0.3 };
}

export function drawText(g: G, text: string, x: number, y: number, style: TextStyle): void {
  if (style.ground) {
    const b = textBox(text, x, y, style);
    g.rect(round(b.x1 - b.x0 + 4), round(b.y1 - b.y0 + 2))
      .move(round(b.x0 - 2), round(b.y0 - 1))
      .fill(PAPER)
      .attr({ class: 'label-ground' });
  }
  const t = g.plain(xmlText(text)).attr({
    x: round(x),
    y: round(y),
    'font-size': style.size,
    'font-family': style.family ?? FONT,
    fill: style.fill ?? INK,
    'text-anchor': style.anchor ?? 'start',
  });
  if (style.bold) t.attr('font-weight', 'bold');
  if (style.halo) t.attr({ stroke: '#ffffff', 'stroke-width': 4, 'stroke-linejoin': 'round', 'paint-order': 'stroke' });
  if (style.rotate !== undefined) t.attr('transform', `rotate(${style.rotate} ${round(x)} ${round(y)})`);
  if (style.className) t.attr('class', style.className);
  for (const [k, v] of Object.entries(style.data ?? {})) t.attr(`data-${k}`, xmlText(v));
}

/** Keeps the boxes of labels already drawn; `place` finds the first free line for a new one. */
export class LabelPlacer {
  private readonly boxes: Box[] = [];

  reserve(box: Box): void {
    this.boxes.push(box);
  }

  /** Tries baselines y, y + step, y + 2 step, ... and returns the first free one (it is reserved). */
  place(text: string, x: number, y: number, style: TextStyle, step: number, tries = 4): number {
    for (let k = 0; k < tries; k++) {
      const box = textBox(text, x, y + k * step, style);
      if (!this.boxes.some((b) => overlaps(b, box))) {
        this.boxes.push(box);
        return y + k * step;
      }
    }
    const last = y + (tries - 1) * step;
    this.boxes.push(textBox(text, x, last, style));
    return last;
  }
}

/** Splits a note into lines no wider than `width`, breaking at " · " first, then at spaces. */
export function wrapLines(text: string, size: number, width: number): string[] {
  const lines: string[] = [];
  let line = '';
  const parts = text.split(' · ');
  const push = (piece: string, joiner: string) => {
    const next = line === '' ? piece : `${line}${joiner}${piece}`;
    if (line !== '' && textWidth(next, size) > width) {
      lines.push(line);
      line = piece;
    } else line = next;
  };
  for (const part of parts) {
    if (textWidth(part, size) <= width) {
      push(part, ' · ');
      continue;
    }
    part.split(' ').forEach((word, i) => {
      push(word, i === 0 ? ' · ' : ' ');
    });
  }
  if (line !== '') lines.push(line);
  return lines;
}
