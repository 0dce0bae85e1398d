/** The title block: design, what is drawn, clock, model and card, and a verdict box that reads without colour. */
import type { Svg } from '@svgdotjs/svg.js';
import type { Diagram } from '../diagram.js';
import { formatEngineering, formatTime } from '../../units/format.js';
import { FAIL, FAIL_TINT, GLYPH, INK, MUTED, PAPER, SIZE } from '../palette.js';
import { round } from './canvas.js';
import { drawText, wrapLines } from './text.js';

export interface TitleInfo {
  readonly design: string;
  readonly line: string;
  readonly note: string;
  readonly pass: boolean;
  /** Words under the verdict. */
  readonly detail: string;
  readonly data?: Readonly<Record<string, string>>;
}

export function diagramTitle(d: Diagram): TitleInfo {
  const what = d.mode === 'all' ? `${d.cornerLabel} overlaid` : `corner ${d.cornerLabel}`;
  const { pass, failing, checks } = d.verdict;
  const where = d.mode === 'all' ? ' (all corners)' : '';
  return {
    design: d.design,
    line: `${what} · clock ${formatEngineering(d.frequency, 'Hz')} (period ${formatTime(d.period)})`,
    note: `${d.model} delay model · process card ${d.card}`,
    pass,
    detail: pass ? `all ${checks} checks hold${where}` : `${failing} of ${checks} checks fail${where}`,
    data: { corner: d.cornerLabel },
  };
}

/** Line step of the note under the title, px. */
const NOTE_STEP = 13;

/** The title note's lines across the drawing's width (a long model-error note wraps rather than running off the page). */
export function titleNoteLines(note: string, width: number, margin: number): string[] {
  return wrapLines(note, SIZE.small, width - 2 * margin);
}

/** How much taller than one note line a title block with these note lines is, px: what a drawing adds above its content. */
export function titleExtraHeight(noteLines: readonly string[]): number {
  return (noteLines.length - 1) * NOTE_STEP;
}

/** Draws the title block; `noteLines` are its note wrapped (titleNoteLines), when the caller has them already. */
export function drawTitleBlock(
  root: Svg,
  info: TitleInfo,
  width: number,
  margin: number,
  noteLines: readonly string[] = titleNoteLines(info.note, width, margin),
): void {
  const g = root.group().attr({ class: 'title-block' });
  drawText(g, info.design, margin, 32, { size: SIZE.title, bold: true, className: 'title' });
  drawText(g, info.line, margin, 56, { size: SIZE.subtitle, className: 'subtitle', data: info.data ?? {} });
  noteLines.forEach((line, i) => {
    drawText(g, line, margin, 76 + i * NOTE_STEP, { size: SIZE.small, fill: MUTED, className: 'subtitle' });
  });
  // The verdict box ends above the note's first line, which may run under it.
  const boxW = 208;
  const boxH = 52;
  const bx = width - margin - boxW;
  const by = 10;
  const pass = info.pass;
  g.rect(boxW, boxH)
    .move(round(bx), by)
    .fill(pass ? PAPER : FAIL_TINT)
    .stroke({ color: pass ? INK : FAIL, width: pass ? 1.5 : 2.5 })
    .attr({ rx: 4 });
  drawText(g, `${pass ? GLYPH.pass : GLYPH.fail} ${pass ? 'PASS' : 'FAIL'}`, bx + 14, by + 26, {
    size: 18,
    bold: true,
    fill: pass ? INK : FAIL,
    className: 'verdict',
    data: { verdict: pass ? 'pass' : 'fail' },
  });
  drawText(g, info.detail, bx + 14, by + 46, { size: SIZE.small, fill: pass ? MUTED : FAIL, className: 'verdict-detail' });
  const rule = 90 + (noteLines.length - 1) * NOTE_STEP;
  g.line(margin, rule, width - margin, rule).stroke({ color: '#c9ced6', width: 1 });
}
