/**
 * The timing diagram: a title block, the whole period, then both handovers enlarged side by side
 * with dead-time and break-before-make dimension marks, and a legend. A single corner draws each
 * signal as its ramps; an overlay draws each edge as the band its corners span, with the worst
 * corner's waveform as a line through the bands.
 */
import type { G, Svg } from '@svgdotjs/svg.js';
import { scaleLinear, type ScaleLinear } from 'd3-scale';
import type { Diagram, DiagramRow, SpanMark, SwitchRow } from '../diagram.js';
import type { TimeWindow } from '../windows.js';
import { wavePoints } from '../waveform.js';
import { wrapTime } from '../../measure/wrap-time.js';
import { formatEngineering, formatPs, formatSignedPs, formatSignedTime, formatTime } from '../../units/format.js';
import { CLOCK, DEAD_ZONE, FAIL, FAINT, GLYPH, GRID, INK, INTERNAL, MUTED, PANEL, PAPER, PHASE, PHASE_TINT, SIZE } from '../palette.js';
import { createCanvas, points, round } from './canvas.js';
import { drawTimeAxis } from './axis.js';
import { bandOutline, edgeGroups, type EdgeGroup } from './envelope.js';
import { dimensionMark } from './marks.js';
import { defineFailHatch, defineOpenFailHatch, failHatchId } from './patterns.js';
import { drawText, fitText, textWidth, wrapLines } from './text.js';
import { xmlText } from './xml-text.js';
import { diagramTitle, drawTitleBlock } from './title.js';
import { runTitle, type RunDrawingOptions } from './metadata.js';
import { circuitLegendEntries, circuitWavesHeight, drawCircuitWaves } from './circuit-waves.js';

export type TimingSvgOptions = RunDrawingOptions;

const MARGIN = 16;
const LABEL_COLUMN = 150;
const PANEL_GAP = 36;
const TITLE_HEIGHT = 92;
/** Height of one dead-time mark's lane and of a break-before-make lane under the handovers, px. */
const DEAD_LANE = 60;
const BBM_LANE = 62;
/** Room between an off-state label and the conduction bars either side of it, px. */
export const OFF_LABEL_GAP = 10;
/** Height of a settle-path lane in the whole-period panel, px. */
const SETTLE_LANE = 40;
const AXIS_HEIGHT = 34;
/** Shifts, in periods, that bring every copy of a periodic event into a window up to two periods away. */
const PERIOD_COPIES = [-2, -1, 0, 1, 2] as const;

/** Dead-time and break-before-make values as shown: whole picoseconds, ns from 10 ns. */
export const psText = formatPs;
const signedPs = formatSignedPs;

interface Context {
  readonly d: Diagram;
  readonly root: Svg;
  readonly hatch: string;
  /** The failure hatch without its ground, for marks laid over what they mark. */
  readonly openHatch: string;
  readonly prefix: string;
  readonly groups: Map<string, EdgeGroup[]>;
}

interface Band {
  readonly top: number;
  readonly height: number;
}

interface Layout {
  readonly signal: readonly Band[];
  readonly switches: readonly Band[];
  readonly dead: Band | null;
  readonly bbm: ReadonlyMap<string, Band>;
  /** Settle-path lanes (whole-period panel only), in the order of Diagram.settle. */
  readonly settle: readonly Band[];
  readonly bottom: number;
}

/**
 * What one kind of panel shows. The whole period carries the settle paths and writes each switch's
 * off-state verdict in its lane; the enlarged handovers carry the dimension marks (dead-time and
 * break-before-make lanes, dead zones, the phases' 50 % points) and name switches that do not switch.
 */
interface PanelKind {
  /** Class of the panel's row labels. */
  readonly name: 'overview' | 'detail';
  /** Height of a signal row and of a switch lane, px. */
  readonly row: number;
  readonly lane: number;
  readonly dimensionMarks: boolean;
  readonly settleLanes: boolean;
  readonly offStateLabels: boolean;
}

const WHOLE_PERIOD: PanelKind = { name: 'overview', row: 26, lane: 16, dimensionMarks: false, settleLanes: true, offStateLabels: true };
const HANDOVER: PanelKind = { name: 'detail', row: 34, lane: 22, dimensionMarks: true, settleLanes: false, offStateLabels: false };

function rowColour(row: { role: string; phase: 0 | 1 | null }): string {
  if (row.phase !== null) return PHASE[row.phase];
  return row.role === 'internal' ? INTERNAL : CLOCK;
}

function dash(role: string): string | undefined {
  if (role === 'complement' || role === 'clock-complement') return '7 4';
  if (role === 'early') return '2 3';
  return undefined;
}

function levelY(band: Band, v: number): number {
  const hi = band.top + band.height * 0.18;
  const lo = band.top + band.height * 0.82;
  return lo - v * (lo - hi);
}

function layoutRows(d: Diagram, top: number, kind: PanelKind): Layout {
  let y = top;
  const signal = d.rows.map(() => {
    const b = { top: y, height: kind.row };
    y += kind.row;
    return b;
  });
  let dead: Band | null = null;
  if (kind.dimensionMarks && d.deadTimes.length > 0) {
    const marks = Math.max(...d.deadTimes.map((m) => m.marks.length));
    dead = { top: y, height: DEAD_LANE * marks };
    y += dead.height;
  }
  const switches = d.switches.map(() => {
    const b = { top: y, height: kind.lane };
    y += kind.lane;
    return b;
  });
  const bbm = new Map<string, Band>();
  if (kind.dimensionMarks) {
    for (const m of d.breakBeforeMake) {
      if (bbm.has(m.name)) continue;
      bbm.set(m.name, { top: y, height: BBM_LANE });
      y += BBM_LANE;
    }
  }
  const settle = kind.settleLanes
    ? d.settle.map(() => {
        const b = { top: y, height: SETTLE_LANE };
        y += SETTLE_LANE;
        return b;
      })
    : [];
  return { signal, switches, dead, bbm, settle, bottom: y };
}

export function renderTimingSvg(d: Diagram, options: TimingSvgOptions = {}): string {
  const width = options.width ?? 1200;
  const prefix = options.idPrefix ?? 'pg';
  const x0 = MARGIN + LABEL_COLUMN;
  const x1 = width - MARGIN;
  const overviewTop = TITLE_HEIGHT + 44;
  const rows = layoutRows(d, overviewTop, WHOLE_PERIOD);
  // The circuit's node voltages sit under the whole period's lanes, above its time axis.
  const overview = { ...rows, bottom: rows.bottom + circuitWavesHeight(d.circuit) };
  const handoverTop = overview.bottom + AXIS_HEIGHT + 62;
  const handovers = layoutRows(d, handoverTop, HANDOVER);
  const legendTop = handovers.bottom + AXIS_HEIGHT + 16;
  const height = legendTop + legendHeight(d, width - 2 * MARGIN, failHatchId(prefix)) + 8;
  const title = `${d.design}: timing diagram, ${d.cornerLabel}`;
  const canvas = createCanvas(width, height, title);
  const root = canvas.root;
  root.rect(width, height).fill(PAPER);
  const ctx: Context = {
    d,
    root,
    hatch: defineFailHatch(root, prefix),
    openHatch: defineOpenFailHatch(root, prefix),
    prefix,
    groups: new Map(),
  };
  if (d.mode === 'all') for (const row of d.rows) ctx.groups.set(row.net, edgeGroups(row));

  drawTitleBlock(root, runTitle(diagramTitle(d), options.run), width, MARGIN);
  sectionHeading(root, 'Whole period', `T = ${formatTime(d.period)}, times from the clock's rising 50 % point`, MARGIN, overviewTop - 26);
  const whole: TimeWindow = { from: 0, to: d.period, half: 0 };
  const overviewScale = scaleLinear().domain([0, d.period]).range([x0, x1]);
  // Axes and their grid lines go beneath the panels: no grid line crosses a label.
  const overviewAxis = root.group();
  drawWindowBrackets(ctx, overviewScale, overview, overviewTop - 2);
  drawPanel(ctx, 'overview', whole, overviewScale, overview, WHOLE_PERIOD);
  if (d.circuit)
    drawCircuitWaves(root, d.circuit, overviewScale, {
      top: rows.bottom,
      labelRight: x0,
      labelWidth: LABEL_COLUMN - 14,
      prefix,
      overlay: d.mode === 'all',
    });
  drawTimeAxis(overviewAxis, overviewScale, overview.bottom + 4, overviewTop, Math.floor((x1 - x0) / 90));
  drawRowLabels(ctx, overview, x0 - 10, WHOLE_PERIOD);

  sectionHeading(
    root,
    'Handovers, enlarged',
    "same time scale in both panels; edges drawn with the delay model's shapes and transition times",
    MARGIN,
    handoverTop - 36,
  );
  const panelWidth = (x1 - x0 - PANEL_GAP) / 2;
  d.windows.forEach((w, i) => {
    const px0 = x0 + i * (panelWidth + PANEL_GAP);
    const scale = scaleLinear()
      .domain([w.from, w.to])
      .range([px0, px0 + panelWidth]);
    drawText(root.group(), `${i === 0 ? 'A' : 'B'}  ${panelTitle(d, w)}`, px0, handoverTop - 10, {
      size: SIZE.label,
      bold: true,
      className: 'panel-title',
    });
    const axis = root.group();
    drawPanel(ctx, i === 0 ? 'detail-a' : 'detail-b', w, scale, handovers, HANDOVER);
    drawTimeAxis(axis, scale, handovers.bottom + 4, handoverTop, Math.max(3, Math.floor(panelWidth / 95)));
  });
  drawRowLabels(ctx, handovers, x0 - 10, HANDOVER, panelWidth);
  drawLegend(ctx, MARGIN, legendTop, width - 2 * MARGIN);
  return canvas.finish();
}

function sectionHeading(root: Svg, heading: string, note: string, x: number, y: number): void {
  const g = root.group().attr({ class: 'section-heading' });
  drawText(g, heading, x, y, { size: 15, bold: true });
  drawText(g, note, x + textWidth(heading, 15, true) + 12, y, { size: SIZE.small, fill: MUTED });
}

function panelTitle(d: Diagram, w: TimeWindow): string {
  const clock = d.rows[0]?.net ?? 'clock';
  const mark = d.deadTimes.find((m) => m.marks[0] !== undefined && halfOf(d, m.marks[0].start) === w.half);
  const edge = `${clock} ${w.half === 0 ? 'rises' : 'falls'}`;
  return mark ? `${edge}: ${mark.from} off, then ${mark.to} on` : edge;
}

function halfOf(d: Diagram, t: number): 0 | 1 {
  const at = wrapTime(t, d.period);
  return at < clockFallOf(d) ? 0 : 1;
}

function clockFallOf(d: Diagram): number {
  const clock = d.rows[0]!.reference;
  const fall = clock.ramps.find((r) => !r.rising);
  return fall ? fall.t50 : d.period / 2;
}

/** The copy of t (shifted by whole periods) inside the window, or null. */
function inWindow(t: number, w: TimeWindow, period: number): number | null {
  const k = Math.ceil((w.from - t) / period);
  const shifted = t + k * period;
  return shifted <= w.to ? shifted : null;
}

function drawWindowBrackets(ctx: Context, scale: ScaleLinear<number, number>, layout: Layout, y: number): void {
  const g = ctx.root.group().attr({ class: 'window-brackets' });
  const T = ctx.d.period;
  ctx.d.windows.forEach((w, i) => {
    for (const k of [-1, 0, 1]) {
      const a = Math.max(0, w.from + k * T);
      const b = Math.min(T, w.to + k * T);
      if (b <= a) continue;
      g.rect(round(scale(b) - scale(a)), round(layout.bottom - y))
        .move(round(scale(a)), round(y))
        .fill(PANEL)
        .stroke({ color: GRID, width: 1 });
    }
    const centre = scale(Math.min(T, Math.max(0, (w.from + w.to) / 2)));
    drawText(g, i === 0 ? 'A' : 'B', centre, y - 3, {
      size: SIZE.small,
      bold: true,
      fill: MUTED,
      anchor: 'middle',
      className: 'bracket-label',
    });
  });
}

/** One panel as its marks see it: the time window, its scale to pixels, the row layout and the panel's kind. */
interface Frame {
  readonly w: TimeWindow;
  readonly scale: ScaleLinear<number, number>;
  readonly layout: Layout;
  readonly kind: PanelKind;
}

function drawPanel(ctx: Context, name: string, w: TimeWindow, scale: ScaleLinear<number, number>, layout: Layout, kind: PanelKind): void {
  const frame: Frame = { w, scale, layout, kind };
  const [px0, px1] = scale.range() as [number, number];
  const clipId = `${ctx.prefix}-clip-${name}`;
  ctx.root
    .defs()
    .element('clipPath')
    .attr({ id: clipId })
    .element('rect')
    .attr({
      x: round(px0),
      y: round(layout.signal[0]?.top ?? 0),
      width: round(px1 - px0),
      height: round(layout.bottom - (layout.signal[0]?.top ?? 0)),
    });
  const panel = ctx.root.group().attr({ class: `panel panel-${name}`, 'data-from': String(w.from), 'data-to': String(w.to) });
  const clipped = panel.group().attr({ 'clip-path': `url(#${clipId})` });
  for (const band of layout.signal) {
    clipped.line(round(px0), round(band.top + band.height), round(px1), round(band.top + band.height)).stroke({ color: GRID, width: 1 });
  }
  if (kind.dimensionMarks) drawDeadZones(ctx, clipped, frame);
  ctx.d.rows.forEach((row, i) => {
    drawSignalRow(ctx, clipped, row, layout.signal[i]!, frame);
  });
  ctx.d.switches.forEach((s, i) => {
    drawSwitchLane(ctx, clipped, s, layout.switches[i]!, frame);
  });
  if (kind.dimensionMarks) {
    // Labels go on a layer above every mark's lines, so no later mark's extension line crosses them.
    const labels = panel.group().attr({ class: 'mark-labels' });
    drawDeadMarks(ctx, panel, frame, labels);
    drawBbmMarks(ctx, panel, frame, labels);
    labels.front();
  }
  if (kind.settleLanes) drawSettleMarks(ctx, panel, frame);
}

/**
 * Each settle path in the whole period: its common on-window as an outlined bar, the on-time it
 * needs as a solid bar from the same start, and a line with the numbers; a shortfall is hatched.
 */
function drawSettleMarks(ctx: Context, g: G, { scale, layout }: Frame): void {
  const T = ctx.d.period;
  ctx.d.settle.forEach((mark, i) => {
    const band = layout.settle[i];
    if (!band) return;
    const [px0] = scale.range() as [number, number];
    const barY = band.top + 24;
    if ('reason' in mark) {
      const ug = g.group().attr({ class: 'settle-mark unmeasured', 'data-path': mark.name, 'data-corner': mark.corner });
      ug.rect(24, 10)
        .move(round(px0 + 4), round(barY))
        .fill(ctx.hatch)
        .stroke({ color: FAIL, width: 1 })
        .attr({ class: 'settle-unmeasured' });
      const [, px1] = scale.range() as [number, number];
      drawText(
        ug,
        fitText(`${mark.name}: not measurable at ${mark.corner} ${GLYPH.fail} FAIL`, SIZE.annotation, px1 - px0 - 8, true),
        px0 + 4,
        band.top + 16,
        { size: SIZE.annotation, fill: FAIL, bold: true, className: 'settle-label', halo: true },
      );
      drawText(ug, fitText(mark.reason, SIZE.small, px1 - px0 - 40, false), px0 + 34, barY + 9, {
        size: SIZE.small,
        fill: FAIL,
        className: 'settle-reason',
        halo: true,
      });
      return;
    }
    const sg = g
      .group()
      .attr({ class: 'settle-mark', 'data-path': mark.name, 'data-corner': mark.corner, 'data-margin': String(mark.margin) });
    // A window may run past the period's end: draw it in two pieces.
    const pieces = (from: number, to: number): Array<[number, number]> => {
      const a = wrapTime(from, T);
      const b = a + (to - from);
      return b <= T
        ? [[a, b]]
        : [
            [a, T],
            [0, b - T],
          ];
    };
    for (const [a, b] of pieces(mark.start, mark.end)) {
      sg.rect(round(Math.max(1, scale(b) - scale(a))), 10)
        .move(round(scale(a)), round(barY))
        .fill(PAPER)
        .stroke({ color: INK, width: 1 })
        .attr({ class: 'settle-window' });
    }
    for (const [a, b] of pieces(mark.start, mark.start + Math.min(mark.needed, T))) {
      sg.rect(round(Math.max(1, scale(b) - scale(a))), 4)
        .move(round(scale(a)), round(barY + 3))
        .fill(mark.pass ? INK : ctx.hatch)
        .attr({ class: 'settle-needed' });
    }
    const raw = mark.end - mark.start;
    const usable = mark.margin + mark.needed;
    const worstDuty = Math.abs(raw - usable) > 1e-15 ? ` (${formatTime(usable)} at the worst duty)` : '';
    const text =
      `${mark.name}: on together ${formatTime(raw)}${worstDuty}, needs ${formatTime(mark.needed)}, margin ${formatSignedTime(mark.margin)}` +
      `${ctx.d.mode === 'all' ? ` · worst at ${mark.corner}` : ''}${mark.pass ? '' : ` ${GLYPH.fail} FAIL`}`;
    drawText(sg, text, px0 + 4, band.top + 16, {
      size: SIZE.annotation,
      fill: mark.pass ? INK : FAIL,
      bold: !mark.pass,
      className: 'settle-label',
      halo: true,
    });
  });
}

function drawSignalRow(ctx: Context, g: G, row: DiagramRow, band: Band, { w, scale, kind }: Frame): void {
  const colour = rowColour(row);
  const rg = g.group().attr({ class: 'signal-row', 'data-signal': row.net, 'data-role': row.role });
  const toXY = (p: readonly [number, number]): [number, number] => [scale(p[0]), levelY(band, p[1])];
  const line = wavePoints(row.reference, w.from, w.to).map(toXY);
  if (ctx.d.mode === 'all') {
    for (const group of ctx.groups.get(row.net) ?? []) {
      for (const k of PERIOD_COPIES) {
        const shift = k * ctx.d.period;
        if (group.t50Max + shift < w.from - ctx.d.period * 0.01 || group.t50Min + shift > w.to + ctx.d.period * 0.01) continue;
        const outline = bandOutline(group).outline.map(([t, v]) => toXY([t + shift, v]));
        rg.polygon(points(outline))
          .fill(row.phase !== null ? PHASE_TINT[row.phase] : GRID)
          .stroke({ color: colour, width: 0.8 })
          .attr({
            class: 'edge-band',
            'data-t50-min': String(group.t50Min + shift),
            'data-t50-max': String(group.t50Max + shift),
            'data-corners': String(group.ramps.length),
          });
      }
    }
  } else if (row.role === 'phase' || row.role === 'early') {
    const area: Array<[number, number]> = [[scale(w.from), levelY(band, 0)], ...line, [scale(w.to), levelY(band, 0)]];
    rg.polygon(points(area))
      .fill(PHASE_TINT[row.phase ?? 0])
      .attr({ 'fill-opacity': 0.7 });
  }
  const stroke = { color: colour, width: row.role === 'phase' ? 2 : 1.5, linejoin: 'round' as const };
  const poly = rg.polyline(points(line)).fill('none').stroke(stroke).attr({ class: 'wave' });
  const pattern = dash(row.role);
  if (pattern) poly.attr('stroke-dasharray', pattern);
  if (kind.dimensionMarks && row.role === 'phase') {
    for (const r of row.reference.ramps) {
      const t = inWindow(r.t50, w, row.reference.period);
      if (t !== null)
        rg.circle(5)
          .center(round(scale(t)), round(levelY(band, 0.5)))
          .fill(PAPER)
          .stroke({ color: colour, width: 1.5 });
    }
  }
}

function drawSwitchLane(ctx: Context, g: G, s: SwitchRow, band: Band, frame: Frame): void {
  const { w, scale } = frame;
  const lg = g.group().attr({ class: 'switch-lane', 'data-switch': s.name });
  const colour = s.phase === null ? INTERNAL : PHASE[s.phase];
  const tint = s.phase === null ? GRID : PHASE_TINT[s.phase];
  const h = barHeight(band);
  const y = band.top + (band.height - h) / 2;
  // Over all corners: the earliest turn-on to the latest turn-off.
  const spread =
    s.windows.length > 0 ? { on: Math.min(...s.windows.map((x) => x.on)), off: Math.max(...s.windows.map((x) => x.off)) } : null;
  const busy = spread
    ? PERIOD_COPIES.map((k) => ({ xa: scale(spread.on + k * ctx.d.period), xb: scale(spread.off + k * ctx.d.period) }))
    : [];
  drawOffIntervals(ctx, lg, s, band, frame, busy);
  if (!spread) return;
  const wide = { on: Math.max(...s.windows.map((x) => x.on)), off: Math.min(...s.windows.map((x) => x.off)) };
  const narrow = { on: Math.max(...s.windows.map((x) => x.onLatest)), off: Math.min(...s.windows.map((x) => x.offEarliest)) };
  for (const k of PERIOD_COPIES) {
    const shift = k * ctx.d.period;
    const bar = (a: number, b: number, fill: string, cls: string, dasharray?: string) => {
      const span = clipToWindow(scale, w, a + shift, b + shift);
      if (!span) return;
      const { xa, xb } = span;
      lg.rect(round(xb - xa), round(h))
        .move(round(xa), round(y))
        .fill(fill)
        .stroke({ color: colour, width: 1, dasharray })
        .attr({ class: cls });
    };
    // Over all corners: a dashed outline where only some corners conduct, then what every corner shares.
    if (spread.on < wide.on || spread.off > wide.off) bar(spread.on, spread.off, PAPER, 'conduction-spread', '3 2');
    if (wide.off > wide.on) bar(wide.on, wide.off, tint, 'conduction-wide');
    if (narrow.off > narrow.on) bar(narrow.on, narrow.off, colour, 'conduction-narrow');
  }
}

/** Height of a conduction (or failing off-state) bar in a switch lane, px. */
function barHeight(band: Band): number {
  return Math.min(12, band.height * 0.55);
}

/** The pixels from time a to time b, cut to the window with 2 px to spare either side; null when nothing is left. */
function clipToWindow(scale: ScaleLinear<number, number>, w: TimeWindow, a: number, b: number): { xa: number; xb: number } | null {
  const xa = Math.max(scale(w.from) - 2, scale(a));
  const xb = Math.min(scale(w.to) + 2, scale(b));
  return xb <= xa ? null : { xa, xb };
}

/**
 * Along a switch's lane, a thin strip over every interval in which it must be off: grey where its
 * gate holds it off against both terminals, a full-height hatched bar where it does not (the
 * off-state check), with the verdict and margin written in the widest interval that has room.
 */
function drawOffIntervals(
  ctx: Context,
  g: G,
  s: SwitchRow,
  band: Band,
  { w, scale, kind }: Frame,
  busy: ReadonlyArray<{ xa: number; xb: number }>,
): void {
  const off = s.offState;
  if (!off) return;
  const og = g.group().attr({
    class: off.pass ? 'off-state' : 'off-state fail',
    'data-margin': String(off.margin),
    'data-corner': off.corner,
    'data-phase': off.phase,
  });
  const h = off.pass ? 3 : barHeight(band);
  const y = band.top + (band.height - h) / 2;
  const spans: Array<{ xa: number; xb: number }> = [];
  for (const k of PERIOD_COPIES) {
    const shift = k * ctx.d.period;
    for (const i of off.intervals) {
      const span = clipToWindow(scale, w, i.start + shift, i.end + shift);
      if (!span) continue;
      const { xa, xb } = span;
      og.rect(round(xb - xa), round(h))
        .move(round(xa), round(y))
        .fill(off.pass ? FAINT : ctx.hatch)
        .stroke({ color: off.pass ? MUTED : FAIL, width: 0.5 })
        .attr({ class: 'off-interval', 'data-state': i.state });
      spans.push({ xa, xb });
    }
  }
  // Adjacent intervals (a phase and the dead time after it) make one run for the label.
  spans.sort((a, b) => a.xa - b.xa);
  let widest: { xa: number; xb: number } | null = null;
  let run: { xa: number; xb: number } | null = null;
  for (const span of withoutBusy(spans, busy)) {
    run = run && span.xa <= run.xb + 1 ? { xa: run.xa, xb: Math.max(run.xb, span.xb) } : { ...span };
    if (widest === null || run.xb - run.xa > widest.xb - widest.xa) widest = run;
  }
  const text = offStateText(s);
  const width = textWidth(text, SIZE.small, !off.pass);
  // Clear of the conduction bars at both ends of the run.
  if (kind.offStateLabels && widest && width + 2 * OFF_LABEL_GAP + 8 <= widest.xb - widest.xa) {
    og.rect(round(width + 8), 13)
      .move(round(widest.xa + OFF_LABEL_GAP), round(band.top + band.height / 2 - 6.5))
      .fill(PAPER)
      .attr({ class: 'off-state-label-ground' });
    drawText(og, text, widest.xa + OFF_LABEL_GAP + 4, band.top + band.height / 2 + 4, {
      size: SIZE.small,
      fill: off.pass ? MUTED : FAIL,
      bold: !off.pass,
      className: 'off-state-label',
    });
  }
}

/** The parts of `spans` outside every `busy` interval (where the lane draws a conduction bar). */
export function withoutBusy(
  spans: ReadonlyArray<{ xa: number; xb: number }>,
  busy: ReadonlyArray<{ xa: number; xb: number }>,
): Array<{ xa: number; xb: number }> {
  let out = spans.map((x) => ({ ...x }));
  for (const b of busy) {
    out = out.flatMap((x) => {
      if (b.xb <= x.xa || b.xa >= x.xb) return [x];
      return [
        { xa: x.xa, xb: b.xa },
        { xa: b.xb, xb: x.xb },
      ].filter((p) => p.xb > p.xa);
    });
  }
  return out.sort((a, b) => a.xa - b.xa);
}

/** The off-state verdict in a switch's lane: `off: holds +55.0 mV` or `off: FAILS -1.53 V in p2, reverse conduction`. */
export function offStateText(s: SwitchRow): string {
  const off = s.offState;
  if (!off) return '';
  const volts = off.margin === null ? 'n/a' : `${off.margin < 0 ? '-' : '+'}${formatEngineering(Math.abs(off.margin), 'V')}`;
  return off.pass
    ? `off: holds ${volts}`
    : `${GLYPH.fail} off: FAILS ${volts} in ${off.phase.replace(/^phase /, '')}${/reverse conduction/.test(off.detail) ? ', reverse conduction' : ''}`;
}

function markX(mark: SpanMark, w: TimeWindow, period: number, scale: ScaleLinear<number, number>): { xs: number; xe: number } | null {
  const start = inWindow(mark.start, w, period);
  if (start === null) return null;
  return { xs: scale(start), xe: scale(start + mark.end - mark.start) };
}

/** From the top of the higher band to the bottom of the lower, px. */
function spanOf(a: Band, b: Band): { top: number; bottom: number } {
  return { top: Math.min(a.top, b.top), bottom: Math.max(a.top + a.height, b.top + b.height) };
}

function rowIndex(d: Diagram, net: string): number {
  return d.rows.findIndex((r) => r.net === net);
}

function drawDeadZones(ctx: Context, g: G, { w, scale, layout }: Frame): void {
  for (const dt of ctx.d.deadTimes) {
    const mark = dt.marks[0];
    if (!mark) continue;
    const x = markX(mark, w, ctx.d.period, scale);
    if (!x) continue;
    const a = layout.signal[rowIndex(ctx.d, dt.from)];
    const b = layout.signal[rowIndex(ctx.d, dt.to)];
    if (!a || !b) continue;
    const { top, bottom } = spanOf(a, b);
    const lo = Math.min(x.xs, x.xe);
    const fail = dt.marks.some((m) => !m.pass);
    g.rect(round(Math.max(1, Math.abs(x.xe - x.xs))), round(bottom - top))
      .move(round(lo), round(top))
      .fill(fail ? ctx.hatch : DEAD_ZONE)
      .attr({ class: fail ? 'dead-zone fail' : 'dead-zone' });
  }
}

function clampCentre(text: string, centre: number, size: number, scale: ScaleLinear<number, number>, bold = false): number {
  const [px0, px1] = scale.range() as [number, number];
  const half = textWidth(text, size, bold) / 2;
  return Math.min(px1 - half, Math.max(px0 + half, centre));
}

/** A small note under a dimension, wrapped to the panel width (two lines at most fit a lane). */
function drawNote(g: G, note: string, centre: number, y: number, scale: ScaleLinear<number, number>, pass: boolean): void {
  const [px0, px1] = scale.range() as [number, number];
  wrapLines(note, SIZE.small, px1 - px0 - 4)
    .slice(0, 2)
    .forEach((line, i) => {
      drawText(g, line, clampCentre(line, centre, SIZE.small, scale), y + i * 14, {
        size: SIZE.small,
        anchor: 'middle',
        fill: pass ? MUTED : FAIL,
        className: 'mark-note',
        ground: true,
      });
    });
}

function roleWord(mark: SpanMark): string {
  return mark.role === 'least' ? 'least ' : mark.role === 'most' ? 'most ' : '';
}

function drawDeadMarks(ctx: Context, g: G, { w, scale, layout }: Frame, labels: G): void {
  if (!layout.dead) return;
  for (const dt of ctx.d.deadTimes) {
    const fromBand = layout.signal[rowIndex(ctx.d, dt.from)];
    const toBand = layout.signal[rowIndex(ctx.d, dt.to)];
    if (!fromBand || !toBand) continue;
    dt.marks.forEach((mark, k) => {
      const x = markX(mark, w, ctx.d.period, scale);
      if (!x) return;
      const laneTop = layout.dead!.top + k * DEAD_LANE;
      const lineY = laneTop + 24;
      const mg = g
        .group()
        .attr({ class: 'dead-time-mark', 'data-from': dt.from, 'data-to': dt.to, 'data-corner': mark.corner, 'data-role': mark.role });
      dimensionMark(mg, { x: x.xs, y: levelY(fromBand, 0.5) }, { x: x.xe, y: levelY(toBand, 0.5) }, lineY, !mark.pass);
      const value = `${roleWord(mark)}dead time ${psText(mark.value)}${mark.pass ? '' : ` ${GLYPH.fail} FAIL`}`;
      const centre = (x.xs + x.xe) / 2;
      const style = { size: SIZE.annotation, anchor: 'middle' as const, bold: true, fill: mark.pass ? INK : FAIL, ground: true };
      drawText(labels, value, clampCentre(value, centre, SIZE.annotation, scale, true), lineY - 6, {
        ...style,
        className: 'dead-time-label',
        data: { from: dt.from, to: dt.to, corner: mark.corner, value: String(mark.value) },
      });
      const second = mark.pass
        ? mark.role === 'most'
          ? mark.corner
          : `${mark.role === 'least' ? `${mark.corner} · ` : ''}clean gap ${psText(dt.gap)}`
        : `${mark.role === 'single' ? '' : `${mark.corner}: `}${mark.reason}`;
      drawNote(labels, second, centre, lineY + 18, scale, mark.pass);
    });
  }
}

function drawBbmMarks(ctx: Context, g: G, { w, scale, layout }: Frame, labels: G): void {
  for (const bbm of ctx.d.breakBeforeMake) {
    const lane = layout.bbm.get(bbm.name);
    const fromIndex = ctx.d.switches.findIndex((s) => s.name === bbm.from);
    const toIndex = ctx.d.switches.findIndex((s) => s.name === bbm.to);
    const fromBand = layout.switches[fromIndex];
    const toBand = layout.switches[toIndex];
    if (!lane || !fromBand || !toBand) continue;
    for (const mark of bbm.marks) {
      const x = markX(mark, w, ctx.d.period, scale);
      if (!x) continue;
      const lineY = lane.top + 22;
      const mg = g.group().attr({ class: 'bbm-mark', 'data-from': bbm.from, 'data-to': bbm.to, 'data-corner': mark.corner });
      // The guard (or an order's minimum) may reach past the panel: clip the zones to it.
      const [panelLeft, panelRight] = scale.range() as [number, number];
      const gx = Math.min(scale(mark.start + bbm.guard), panelRight) - x.xs;
      if (gx > 0)
        mg.rect(round(gx), 8)
          .move(round(x.xs), round(lineY - 4))
          .fill(FAINT)
          .attr({ 'fill-opacity': 0.55, class: 'guard' });
      if (!mark.pass) {
        const lo = Math.max(panelLeft, Math.min(x.xs, x.xe, x.xs + gx));
        const hi = Math.min(panelRight, Math.max(x.xs, x.xe, x.xs + gx));
        const { top, bottom } = spanOf(fromBand, toBand);
        // Stripes without a ground, so the overlapping bars it marks stay visible beneath.
        mg.rect(round(Math.max(2, hi - lo)), round(bottom - top))
          .move(round(lo), round(top))
          .fill(ctx.openHatch)
          .stroke({ color: FAIL, width: 1.5 })
          .attr({ class: 'bbm-fail' });
      }
      const from = { x: x.xs, y: fromBand.top + fromBand.height / 2 };
      dimensionMark(mg, from, { x: x.xe, y: toBand.top + toBand.height / 2 }, lineY, !mark.pass);
      const centre = (x.xs + x.xe) / 2;
      const label = `${bbm.from} ${bbm.fromEvent} to ${bbm.to} ${bbm.toEvent} ${psText(mark.value)}${mark.pass ? '' : ` ${GLYPH.fail} FAIL`}`;
      drawText(labels, label, clampCentre(label, centre, SIZE.annotation, scale, true), lineY - 7, {
        size: SIZE.annotation,
        anchor: 'middle',
        bold: true,
        fill: mark.pass ? INK : FAIL,
        className: 'bbm-label',
        ground: true,
        data: { from: bbm.from, to: bbm.to, corner: mark.corner, value: String(mark.value), margin: String(mark.margin) },
      });
      const overlap =
        mark.value >= 0
          ? ''
          : bbm.kind === 'order'
            ? `reversed by ${psText(-mark.value)} · `
            : `both conduct for ${psText(-mark.value)} · `;
      const limit = bbm.kind === 'order' ? `at least ${psText(bbm.guard)}` : `guard ${psText(bbm.guard)}`;
      // The band the check takes off too, so the margin adds up from the figures shown.
      const required = mark.modelError >= 0.05e-12 ? `${limit} + model error ${psText(mark.modelError)}` : limit;
      const note = `${overlap}margin ${signedPs(mark.margin)} (${required})${ctx.d.mode === 'all' ? ` · worst at ${mark.corner}` : ''}`;
      drawNote(labels, note, centre, lineY + 18, scale, mark.pass);
    }
  }
}

function drawRowLabels(ctx: Context, layout: Layout, x: number, kind: PanelKind, panelWidth = Infinity): void {
  const g = ctx.root.group().attr({ class: `row-labels ${kind.name}` });
  const room = LABEL_COLUMN - 14;
  ctx.d.rows.forEach((row, i) => {
    const band = layout.signal[i]!;
    const text = fitText(row.net, SIZE.label, room, row.role === 'phase');
    drawText(g, text, x, band.top + band.height / 2 + 5, {
      size: SIZE.label,
      anchor: 'end',
      bold: row.role === 'phase',
      fill: row.phase !== null ? PHASE[row.phase] : INK,
      className: 'row-label',
      data: { signal: row.net },
    });
  });
  ctx.d.switches.forEach((s, i) => {
    const band = layout.switches[i]!;
    const text = fitText(`${s.name} (${s.type})`, SIZE.small, room, false);
    drawText(g, text, x, band.top + band.height / 2 + 4, {
      size: SIZE.small,
      anchor: 'end',
      fill: INK,
      className: 'switch-label',
      data: { switch: s.name },
    });

    if (kind.dimensionMarks && s.problems.length > 0) {
      const first = s.problems[0]!;
      const msg = `${GLYPH.fail} does not switch at ${s.problems.length === 1 ? first.corner : `${s.problems.length} corners`}: ${first.detail}`;
      // Kept inside the first panel; the whole text is the element's tooltip and data.
      const shown = fitText(msg, SIZE.small, panelWidth - 24, false);
      drawText(g, shown, x + 20, band.top + band.height / 2 + 4, {
        size: SIZE.small,
        fill: FAIL,
        className: 'switch-problem',
        ground: true,
        data: { full: msg },
      });
      if (shown !== msg) g.last().element('title').words(xmlText(msg));
    }
  });
  // A lane of marks: what it measures (muted), and under it the name of what it measures.
  const laneLabel = (heading: string, name: string, top: number, offset: number, className: string) => {
    drawText(g, heading, x, top + offset, { size: SIZE.small, anchor: 'end', fill: MUTED, className });
    drawText(g, fitText(name, SIZE.small, room), x, top + (offset + 15), { size: SIZE.small, anchor: 'end', fill: INK, className });
  };
  for (const [name, band] of layout.bbm) {
    const check = ctx.d.breakBeforeMake.find((m) => m.name === name)?.kind ?? 'break-before-make';
    laneLabel(check, name, band.top, 20, 'bbm-lane-label');
  }
  if (layout.dead)
    drawText(g, 'dead time', x, layout.dead.top + 22, { size: SIZE.small, anchor: 'end', fill: MUTED, className: 'dead-lane-label' });
  layout.settle.forEach((band, i) => {
    laneLabel('settle', ctx.d.settle[i]!.name, band.top, 16, 'settle-lane-label');
  });
}

interface LegendEntry {
  readonly text: string;
  readonly draw: (g: G, gx: number, y: number) => void;
}

/** The legend's swatches, in reading order; only what the drawing shows. */
function legendEntries(d: Diagram, hatch: string): LegendEntry[] {
  const out: LegendEntry[] = [];
  const swatch = (g: G, gx: number, y: number, height = 10, dy = 3) => g.rect(24, height).move(round(gx), round(y + dy));
  const sample = (colour: string, dasharray?: string) => (g: G, gx: number, y: number) => {
    const l = g.line(round(gx), round(y + 8), round(gx + 24), round(y + 8)).stroke({ color: colour, width: 2 });
    if (dasharray) l.attr('stroke-dasharray', dasharray);
  };
  for (const p of d.rows.filter((r) => r.role === 'phase'))
    out.push({ text: `${p.net}, phase ${(p.phase ?? 0) + 1}`, draw: sample(PHASE[p.phase ?? 0]) });
  if (d.rows.some((r) => r.role === 'complement' || r.role === 'clock-complement'))
    out.push({ text: 'complement', draw: sample(MUTED, '7 4') });
  if (d.rows.some((r) => r.role === 'early')) out.push({ text: 'early phase', draw: sample(MUTED, '2 3') });
  out.push({
    text: `${GLYPH.fail} FAIL (hatched)`,
    draw: (g, gx, y) => {
      swatch(g, gx, y).fill(hatch).stroke({ color: FAIL, width: 1 });
    },
  });
  if (d.switches.length > 0) {
    const all = d.mode === 'all';
    if (all) {
      out.push({
        text: 'switch conducts at some corners only',
        draw: (g, gx, y) => {
          swatch(g, gx, y).fill(PAPER).stroke({ color: PHASE[0], width: 1, dasharray: '3 2' }).attr({ class: 'legend-spread' });
        },
      });
    }
    out.push({
      text: `${all ? 'at every corner, ' : 'switch conducts '}at some signal level`,
      draw: (g, gx, y) => {
        swatch(g, gx, y).fill(PHASE_TINT[0]).stroke({ color: PHASE[0], width: 1 });
      },
    });
    out.push({
      text: `${all ? 'at every corner and ' : 'at every '}signal level`,
      draw: (g, gx, y) => {
        swatch(g, gx, y).fill(PHASE[0]);
      },
    });
    out.push({
      text: 'guard time',
      draw: (g, gx, y) => {
        swatch(g, gx, y, 8, 4).fill(FAINT).attr({ 'fill-opacity': 0.55 });
      },
    });
    if (d.switches.some((s) => s.offState)) {
      out.push({
        text: 'must be off: the gate holds it off against both terminals',
        draw: (g, gx, y) => {
          swatch(g, gx, y, 3, 7).fill(FAINT).stroke({ color: MUTED, width: 0.5 });
        },
      });
    }
  }
  out.push(...circuitLegendEntries(d.circuit));
  if (d.mode === 'all') {
    out.push({
      text: `edge band: earliest to latest corner; line: ${d.referenceCorner}`,
      draw: (g, gx, y) => {
        g.polygon(
          points([
            [gx, y + 14],
            [gx + 10, y + 2],
            [gx + 24, y + 2],
            [gx + 14, y + 14],
          ]),
        )
          .fill(PHASE_TINT[0])
          .stroke({ color: PHASE[0], width: 0.8 });
      },
    });
  }
  return out;
}

const LEGEND_ROW = 30;

/** Left edge and row of each entry, wrapping to a new row at `width`. */
function legendLayout(entries: readonly LegendEntry[], width: number): Array<{ dx: number; row: number }> {
  let dx = 0;
  let row = 0;
  return entries.map((e) => {
    const w = 30 + textWidth(e.text, SIZE.small);
    if (dx > 0 && dx + w > width) {
      dx = 0;
      row++;
    }
    const at = { dx, row };
    dx += w + 22;
    return at;
  });
}

function legendNotes(d: Diagram): string[] {
  const notes: string[] = [];
  if (d.excluded.length > 0) notes.push(`left out (no steady state): ${d.excluded.map((e) => e.corner).join(', ')}`);
  notes.push('Model estimate from a gate-level timing model; sign-off needs transistor-level simulation and silicon validation.');
  return notes;
}

/** Height the legend takes, px. */
function legendHeight(d: Diagram, width: number, hatch: string): number {
  const places = legendLayout(legendEntries(d, hatch), width);
  const rows = 1 + Math.max(0, ...places.map((p) => p.row));
  return rows * LEGEND_ROW + 10 + legendNotes(d).length * 16;
}

function drawLegend(ctx: Context, x: number, y: number, width: number): void {
  const g = ctx.root.group().attr({ class: 'legend' });
  g.line(round(x), round(y - 8), round(x + width), round(y - 8)).stroke({ color: GRID, width: 1 });
  const entries = legendEntries(ctx.d, ctx.hatch);
  const places = legendLayout(entries, width);
  entries.forEach((e, i) => {
    const { dx, row } = places[i]!;
    const ey = y + row * LEGEND_ROW;
    e.draw(g, x + dx, ey);
    drawText(g, e.text, x + dx + 30, ey + 12, { size: SIZE.small, fill: INK, className: 'legend-label' });
  });
  const rows = 1 + Math.max(0, ...places.map((p) => p.row));
  legendNotes(ctx.d).forEach((n, i) => {
    drawText(g, n, x, y + rows * LEGEND_ROW + 6 + i * 16, { size: SIZE.small, fill: MUTED, className: 'legend-note' });
  });
}
