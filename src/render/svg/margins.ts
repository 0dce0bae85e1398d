/**
 * The margin chart: one row per check, one marker per corner on a shared margin axis. The axis is
 * symmetric-logarithmic (linear within a few picoseconds of zero, logarithmic beyond) so a
 * 100 ps dead-time margin and a 40 ns settling shortfall are both readable. The zero line is the
 * requirement; the failing side is hatched; every failing row says FAIL in words.
 */
import type { G } from '@svgdotjs/svg.js';
import { scaleSymlog, type ScaleSymLog } from 'd3-scale';
import type { MarginRow } from '../margins.js';
import { CIRCUIT_KINDS, marginUnit } from '../../checks/check.js';
import { CORNER_COLOURS, CORNER_SHAPES, FAIL, GLYPH, GRID, INK, MUTED, PAPER, SIZE, type MarkerShape } from '../palette.js';
import { xmlText } from './xml-text.js';
import { createCanvas, round } from './canvas.js';
import { drawMarker } from './markers.js';
import { defineFailHatch } from './patterns.js';
import { drawText, fitText, textWidth } from './text.js';
import { drawTitleBlock, titleExtraHeight, titleNoteLines, type TitleInfo } from './title.js';
import { formatSignedTimeShort, prefixedUnits, unitFor } from '../../units/format.js';
import { runTitle, type RunDrawingOptions } from './metadata.js';

export interface MarginChartInput {
  readonly title: TitleInfo;
  readonly rows: readonly MarginRow[];
  /** Process corners in legend order. */
  readonly processes: readonly string[];
}

export type MarginSvgOptions = RunDrawingOptions;

const MARGIN = 16;
const LABEL_COLUMN = 350;
const RESULT_COLUMN = 260;
const TOP = 140;
/** Width of the linear part of the axis around zero, s. */
const LINEAR_PART = 10e-12;

const TICK_TIME_UNITS = prefixedUnits('s', 1e-6, 1e-12);
const CHARGE_UNITS = prefixedUnits('C', 1e-9, 1e-15);

/** Signed time with a unit for axis ticks: +100 ps, -1 ns, 0. */
export function marginTickLabel(seconds: number): string {
  if (seconds === 0) return '0';
  const sign = seconds > 0 ? '+' : '-';
  const a = Math.abs(seconds);
  const [unit, name] = unitFor(a, TICK_TIME_UNITS);
  return `${sign}${Number((a / unit).toPrecision(3))} ${name}`;
}

const signedTime = formatSignedTimeShort;

/** Decade ticks inside the domain: 0, +-10 ps, +-100 ps, +-1 ns, ... (decades 10^from .. 10^to; seconds by default). */
export function decadeTicks(lo: number, hi: number, [from, to]: readonly [number, number] = [-11, 0]): number[] {
  const ticks = [0];
  for (let k = from; k <= to; k++) {
    const v = Number(`1e${k}`);
    if (v > Math.max(-lo, hi)) break;
    if (v <= hi) ticks.push(v);
    if (-v >= lo) ticks.unshift(-v);
  }
  return ticks;
}

/** A corner's marker: filled where that corner fails the check. */
function marker(g: G, shape: MarkerShape, x: number, y: number, colour: string, filled: boolean): void {
  drawMarker(g, shape, x, y, { radius: 4.5, colour, fill: filled ? colour : PAPER, width: 1.4, crossWidth: 1.8 });
}

function style(processes: readonly string[], process: string): { shape: MarkerShape; colour: string } {
  const i = Math.max(0, processes.indexOf(process)) % CORNER_SHAPES.length;
  return { shape: CORNER_SHAPES[i]!, colour: CORNER_COLOURS[i]! };
}

/** The kinds of margin on the chart, each on its own axis: timing (s), voltage (V), charge (C) and fraction (''). */
interface AxisUnit {
  readonly unit: 's' | 'V' | 'C' | '';
  /** Width of the linear part around zero, and the least half-span of the axis. */
  readonly linear: number;
  readonly span: number;
  /** Decade exponents of the ticks. */
  readonly decades: readonly [number, number];
  readonly tick: (value: number) => string;
  readonly signed: (value: number) => string;
  readonly title: string;
  /** Heading of the block when it is not the first. */
  readonly label: string;
}

const TIME_AXIS: AxisUnit = {
  unit: 's',
  linear: LINEAR_PART,
  span: 100e-12,
  decades: [-11, 0],
  tick: marginTickLabel,
  signed: signedTime,
  title: 'margin (symmetric log scale: linear within 10 ps of zero)',
  label: 'timing checks',
};

const VOLT_AXIS: AxisUnit = {
  unit: 'V',
  linear: 10e-3,
  span: 100e-3,
  decades: [-2, 1],
  tick: voltTickLabel,
  signed: signedVolts,
  title: 'switch bias margin in volts (off-state, on-state, stress; symmetric log: linear within 10 mV of zero)',
  label: 'switch bias checks',
};

/** The volt block when it also holds the circuit's output and ripple checks. */
const CIRCUIT_VOLT_AXIS: AxisUnit = {
  ...VOLT_AXIS,
  title: 'margin in volts (switch bias, circuit output and ripple; symmetric log: linear within 10 mV of zero)',
  label: 'voltage checks',
};

const CHARGE_AXIS: AxisUnit = {
  unit: 'C',
  linear: 10e-15,
  span: 100e-15,
  decades: [-14, -9],
  tick: chargeTickLabel,
  signed: signedCharge,
  title: 'lost charge margin per period in coulombs (symmetric log: linear within 10 fC of zero)',
  label: 'circuit charge checks',
};

const FRACTION_AXIS: AxisUnit = {
  unit: '',
  linear: 0.01,
  span: 0.1,
  decades: [-2, 0],
  tick: fractionTickLabel,
  signed: signedFraction,
  title: 'efficiency margin in percentage points (symmetric log: linear within 1 % of zero)',
  label: 'circuit efficiency checks',
};

/** Signed charge for axis ticks: +100 fC, -1 pC, 0. */
export function chargeTickLabel(coulombs: number): string {
  if (coulombs === 0) return '0';
  const a = Math.abs(coulombs);
  const [unit, name] = unitFor(a, CHARGE_UNITS);
  return `${coulombs > 0 ? '+' : '-'}${Number((a / unit).toPrecision(3))} ${name}`;
}

function signedCharge(coulombs: number): string {
  const a = Math.abs(coulombs);
  const [unit, name] = unitFor(a, CHARGE_UNITS);
  return `${coulombs < 0 ? '-' : '+'}${(a / unit).toFixed(2)} ${name}`;
}

/** Signed fraction for axis ticks, in percent: +10 %, -1 %, 0. */
export function fractionTickLabel(fraction: number): string {
  if (fraction === 0) return '0';
  return `${fraction > 0 ? '+' : '-'}${Number((Math.abs(fraction) * 100).toPrecision(3))} %`;
}

function signedFraction(fraction: number): string {
  return `${fraction < 0 ? '-' : '+'}${(Math.abs(fraction) * 100).toFixed(1)} %`;
}

/** Signed voltage for axis ticks: +100 mV, -1 V, 0. */
export function voltTickLabel(volts: number): string {
  if (volts === 0) return '0';
  const a = Math.abs(volts);
  return `${volts > 0 ? '+' : '-'}${a >= 1 ? `${Number(a.toPrecision(3))} V` : `${Number((a * 1e3).toPrecision(3))} mV`}`;
}

function signedVolts(volts: number): string {
  const a = Math.abs(volts);
  return `${volts < 0 ? '-' : '+'}${a >= 1 ? `${a.toFixed(2)} V` : `${Math.round(a * 1e3)} mV`}`;
}

/** Vertical room of the axis under a block, px. */
const AXIS_ROOM = 60;
/** Room above a block's rows for its side labels, px. */
const BLOCK_HEAD = 40;

export function renderMarginSvg(input: MarginChartInput, options: MarginSvgOptions = {}): string {
  const width = options.width ?? 1200;
  const prefix = options.idPrefix ?? 'pgm';
  const lanes = Math.max(1, input.processes.length);
  const rowHeight = Math.max(30, lanes * 7 + 12);
  const x0 = MARGIN + LABEL_COLUMN;
  const x1 = width - MARGIN - RESULT_COLUMN;
  const rowsIn = (unit: AxisUnit['unit']) => input.rows.filter((r) => marginUnit(r.kind) === unit);
  const voltRows = rowsIn('V');
  const voltAxis = voltRows.some((r) => CIRCUIT_KINDS.has(r.kind)) ? CIRCUIT_VOLT_AXIS : VOLT_AXIS;
  const blocks = [TIME_AXIS, voltAxis, CHARGE_AXIS, FRACTION_AXIS]
    .map((axis) => ({ rows: axis.unit === 'V' ? voltRows : rowsIn(axis.unit), axis }))
    .filter((b, k) => b.rows.length > 0 || (k === 0 && input.rows.length === 0));
  const title = runTitle(input.title, options.run);
  const noteLines = titleNoteLines(title.note, width, MARGIN);
  const start = TOP + titleExtraHeight(noteLines);
  let height = start;
  for (const [k, b] of blocks.entries()) height += (k > 0 ? BLOCK_HEAD : 0) + b.rows.length * rowHeight + AXIS_ROOM;
  const plotEnd = height;
  height += 60;
  const canvas = createCanvas(width, height, `${input.title.design}: margin of every check at every corner`);
  const root = canvas.root;
  root.rect(width, height).fill(PAPER);
  const hatch = defineFailHatch(root, prefix);
  drawTitleBlock(root, title, width, MARGIN, noteLines);
  let top = start;
  for (const [k, block] of blocks.entries()) {
    if (k > 0) top += BLOCK_HEAD;
    const bottom = top + block.rows.length * rowHeight;
    drawBlock(root, block.rows, block.axis, { top, bottom, rowHeight, x0, x1, hatch, first: k === 0 }, input.processes);
    top = bottom + AXIS_ROOM;
  }
  drawLegend(
    root.group(),
    input.processes,
    MARGIN,
    plotEnd + 2,
    input.rows.some((r) => r.unmeasured.length > 0),
  );
  return canvas.finish();
}

interface BlockFrame {
  readonly top: number;
  readonly bottom: number;
  readonly rowHeight: number;
  readonly x0: number;
  readonly x1: number;
  readonly hatch: string;
  readonly first: boolean;
}

/** One block of rows on its own symmetric-log axis, with its zero line and fail side. */
function drawBlock(root: G, rows: readonly MarginRow[], axis: AxisUnit, f: BlockFrame, processes: readonly string[]): void {
  const block = root.group().attr({ class: 'margin-block', 'data-unit': axis.unit });
  const margins = rows.flatMap((r) => r.points.map((p) => p.margin));
  const lo = Math.min(-axis.span, ...margins) * 1.15;
  const hi = Math.max(axis.span, ...margins) * 1.15;
  const scale = scaleSymlog().constant(axis.linear).domain([lo, hi]).range([f.x0, f.x1]);
  const zero = scale(0);
  const bg = block.group().attr({ class: 'chart-background' });
  bg.rect(round(zero - f.x0), round(Math.max(1, f.bottom - f.top)))
    .move(round(f.x0), f.top)
    .fill(f.hatch)
    .attr({ 'fill-opacity': 0.35, class: 'fail-side' });
  drawText(bg, `${GLYPH.fail} fails`, zero - 8, f.top - 12, {
    size: SIZE.small,
    anchor: 'end',
    fill: FAIL,
    bold: true,
    className: 'side-label',
  });
  drawText(bg, `holds ${GLYPH.pass}`, zero + 8, f.top - 12, { size: SIZE.small, fill: INK, bold: true, className: 'side-label' });
  if (f.first) {
    drawText(bg, 'requirement (margin 0)', zero, f.top - 30, { size: SIZE.small, anchor: 'middle', fill: INK, className: 'zero-label' });
    drawText(bg, 'check (requirement)', f.x0 - 10, f.top - 12, {
      size: SIZE.small,
      anchor: 'end',
      fill: MUTED,
      bold: true,
      className: 'column-head',
    });
    drawText(bg, 'worst corner and verdict', f.x1 + 14, f.top - 12, {
      size: SIZE.small,
      fill: MUTED,
      bold: true,
      className: 'column-head',
    });
  } else {
    drawText(bg, axis.label, f.x0 - 10, f.top - 12, { size: SIZE.small, anchor: 'end', fill: MUTED, bold: true, className: 'column-head' });
  }
  drawAxis(block.group(), scale, decadeTicks(lo, hi, axis.decades), f.bottom, f.top, axis);
  rows.forEach((row, i) => {
    drawRow(block.group(), row, i, { top: f.top + i * f.rowHeight, height: f.rowHeight }, scale, processes, f.x0, f.x1, axis);
  });
  block
    .line(round(zero), f.top - (f.first ? 22 : 4), round(zero), round(f.bottom))
    .stroke({ color: INK, width: 2 })
    .attr({ class: 'zero-line' });
}

function drawAxis(g: G, scale: ScaleSymLog<number, number>, ticks: readonly number[], y: number, top: number, axis: AxisUnit): void {
  g.attr({ class: 'margin-axis' });
  let lastRight = -Infinity;
  for (const t of ticks) {
    const x = scale(t);
    g.line(round(x), top, round(x), round(y)).stroke({ color: GRID, width: 1 });
    const label = axis.tick(t);
    const w = textWidth(label, SIZE.tick);
    if (x - w / 2 < lastRight + 6) continue;
    lastRight = x + w / 2;
    drawText(g, label, x, y + 18, { size: SIZE.tick, anchor: 'middle', fill: MUTED, className: 'tick-label' });
  }
  const [x0, x1] = scale.range() as [number, number];
  g.line(round(x0), round(y), round(x1), round(y)).stroke({ color: MUTED, width: 1 });
  drawText(g, axis.title, (x0 + x1) / 2, y + 38, { size: SIZE.small, anchor: 'middle', fill: MUTED, className: 'axis-title' });
}

function drawRow(
  g: G,
  row: MarginRow,
  index: number,
  band: { top: number; height: number },
  scale: ScaleSymLog<number, number>,
  processes: readonly string[],
  x0: number,
  x1: number,
  axis: AxisUnit,
): void {
  g.attr({ class: 'margin-row', 'data-check': row.name, 'data-kind': row.kind });
  if (index % 2 === 1)
    g.rect(round(x1 - x0), round(band.height))
      .move(round(x0), round(band.top))
      .fill('#f3f4f6')
      .attr({ 'fill-opacity': 0.6 });
  const mid = band.top + band.height / 2;
  const fail = row.failing > 0;
  drawText(g, fitText(row.name, SIZE.annotation, LABEL_COLUMN - 24), x0 - 10, row.requirement ? mid - 1 : mid + 5, {
    size: SIZE.annotation,
    anchor: 'end',
    fill: fail ? FAIL : INK,
    bold: fail,
    className: 'check-label',
    data: { check: row.name },
  });
  if (row.requirement) {
    drawText(g, fitText(row.requirement, SIZE.small, LABEL_COLUMN - 24), x0 - 10, mid + 12, {
      size: SIZE.small,
      anchor: 'end',
      fill: MUTED,
      className: 'check-requirement',
    });
  }
  const lanes = Math.max(1, processes.length);
  const laneGap = (band.height - 10) / lanes;
  for (const p of row.points) {
    const lane = Math.max(0, processes.indexOf(p.process));
    const { shape, colour } = style(processes, p.process);
    const y = band.top + 5 + laneGap * (lane + 0.5);
    marker(g, shape, scale(p.margin), y, colour, !p.pass);
  }
  // Corners without a margin: one boxed '?' at the fail side's edge, naming them.
  if (row.unmeasured.length > 0) {
    const m = unmeasuredMark(g, x0 + 10, mid).attr({ 'data-corners': row.unmeasured.join(' '), 'data-count': row.unmeasured.length });
    m.element('title').words(xmlText(`not measured at ${row.unmeasured.join(', ')}`));
  }
  if (row.worst) {
    const lane = Math.max(0, processes.indexOf(row.worst.process));
    g.circle(17)
      .center(round(scale(row.worst.margin)), round(band.top + 5 + laneGap * (lane + 0.5)))
      .fill('none')
      .stroke({ color: INK, width: 1.5 })
      .attr({ class: 'worst-ring' });
  }
  const verdict = fail ? `${GLYPH.fail} FAIL at ${row.failing}/${row.corners}` : `${GLYPH.pass} holds at all ${row.corners}`;
  const worst = row.worst ? `${axis.signed(row.worst.margin)} at ${row.worst.corner}` : 'no margin measured';
  drawText(g, worst, x1 + 14, mid - 2, {
    size: SIZE.small,
    fill: INK,
    className: 'worst-label',
    data: { margin: row.worst ? String(row.worst.margin) : '' },
  });
  const tail = row.unmeasured.length > 0 ? ` · ${GLYPH.unknown} ${row.unmeasured.length} unmeasured` : '';
  drawText(g, `${verdict}${tail}`, x1 + 14, mid + 12, {
    size: SIZE.small,
    fill: fail ? FAIL : MUTED,
    bold: fail,
    className: 'verdict-label',
  });
}

/** A boxed question mark: the check has no margin at that corner (and counts as failing there). */
function unmeasuredMark(g: G, x: number, y: number): G {
  const m = g.group().attr({ class: 'unmeasured-mark' });
  m.rect(14, 14)
    .move(round(x - 7), round(y - 7))
    .fill(PAPER)
    .stroke({ color: FAIL, width: 1.2 });
  drawText(m, GLYPH.unknown, x, y + 4.5, { size: SIZE.small, anchor: 'middle', bold: true, fill: FAIL });
  return m;
}

function drawLegend(g: G, processes: readonly string[], x: number, y: number, unmeasured: boolean): void {
  g.attr({ class: 'legend' });
  drawText(g, 'process corner (row lane, colour and shape):', x, y, { size: SIZE.small, fill: MUTED, className: 'legend-label' });
  let cx = x + textWidth('process corner (row lane, colour and shape):', SIZE.small) + 16;
  for (const p of processes) {
    const { shape, colour } = style(processes, p);
    marker(g, shape, cx + 5, y - 4, colour, false);
    drawText(g, p, cx + 16, y, { size: SIZE.small, fill: INK, className: 'legend-label' });
    cx += 34 + textWidth(p, SIZE.small);
  }
  if (unmeasured) {
    unmeasuredMark(g, x + 6, y + 18);
    drawText(g, 'not measured at that corner (counts as failing)', x + 18, y + 22, {
      size: SIZE.small,
      fill: INK,
      className: 'legend-label',
    });
  }
  drawText(
    g,
    'filled marker = that corner fails the check; ring = worst corner; a named constraint shows its requirement under its name',
    x,
    y + (unmeasured ? 40 : 22),
    { size: SIZE.small, fill: MUTED, className: 'legend-label legend-note' },
  );
}
