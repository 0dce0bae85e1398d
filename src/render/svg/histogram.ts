/**
 * Dead-time histograms of one corner's Monte Carlo dies, one panel per dead time, with the
 * requirement drawn as a labelled dashed line (colour is never the only cue: the line is dashed
 * and named, bars below the requirement are hatched).
 */
import { bisectRight, ticks } from 'd3-array';
import { scaleLinear } from 'd3-scale';
import { createCanvas, round } from './canvas.js';
import { drawText } from './text.js';
import { defineFailHatch } from './patterns.js';
import { FAIL, GRID, INK, MUTED, PHASE, PHASE_TINT, SIZE } from '../palette.js';
import { binEdges, type StreamingHistogram } from '../../variation/histogram.js';
import { formatEngineering } from '../../units/format.js';

/** The unit of the values a histogram counts: seconds, volts, coulombs or a plain fraction. */
export type HistogramUnit = 's' | 'V' | 'C' | '';

export interface HistogramSeries {
  readonly label: string;
  readonly histogram: StreamingHistogram;
  /** Mean and sample standard deviation of the values, in the axis unit; estimated from the bins when absent. */
  readonly mean?: number;
  readonly sigma?: number;
}

export interface HistogramInput {
  readonly title: string;
  readonly subtitle: string;
  readonly series: readonly HistogramSeries[];
  /** Smallest and largest allowed value (s or V), if there are any. */
  readonly requirement?: number;
  readonly maximum?: number;
  /** What the horizontal axis measures, e.g. `50 % dead time`. */
  readonly axis?: string;
  /** Unit of the values: seconds (drawn in ps) or volts (drawn in mV). */
  readonly unit?: HistogramUnit;
}

/** How far outside the data a requirement may be and still be drawn to scale, in data ranges. */
const NEAR = 1.5;

const WIDTH = 900;
const PANEL = 260;
const MARGIN = { left: 80, right: 30, top: 70, bottom: 64 };
const BINS = 40;
/** Room above the bars for the series name, off-scale notes and marker names, px. */
const PLOT_TOP = 66;
/** Width kept at a side for a requirement drawn beyond an axis break, px. */
const EDGE = 52;

interface Bar {
  readonly x0: number;
  readonly x1: number;
  readonly length: number;
}

/**
 * The drawn bars: about BINS bins at round thresholds over the domain (as d3's bin would choose),
 * each collecting the fine bins whose centre falls in it, so every die is counted once.
 */
function bars(h: StreamingHistogram, domain: readonly [number, number]): Bar[] {
  const [x0, x1] = domain;
  const inner = ticks(x0, x1, BINS).filter((t) => t > x0 && t < x1);
  const edges = [x0, ...inner, x1];
  const counts = new Array<number>(edges.length - 1).fill(0);
  h.counts.forEach((c, k) => {
    if (c === 0) return;
    const [a, b] = binEdges(h, k);
    const at = Math.min(counts.length - 1, Math.max(0, bisectRight(edges, (a + b) / 2) - 1));
    counts[at]! += c;
  });
  return counts.map((length, i) => ({ x0: edges[i]!, x1: edges[i + 1]!, length }));
}

/**
 * A value label: times in ps and volts in mV to a tenth; charge with an engineering prefix and a
 * fraction in percent, each with enough digits to tell ticks `step` apart (a die-to-die spread of
 * an efficiency can be a millionth).
 */
function valueLabel(value: number, unit: HistogramUnit, step: number): string {
  if (unit === 's') return `${Math.round(value * 1e13) / 10} ps`;
  if (unit === 'V') return `${Math.round(value * 1e4) / 10} mV`;
  if (value === 0) return unit === 'C' ? '0 C' : '0 %';
  const fine = step > 0 ? Math.ceil(-Math.log10(step)) : 0;
  if (unit === 'C') {
    const digits = Math.min(9, Math.max(3, fine + Math.floor(Math.log10(Math.max(Math.abs(value), step))) + 1));
    return formatEngineering(value, 'C', digits);
  }
  return `${(value * 100).toFixed(Math.min(6, Math.max(1, fine - 2)))} %`;
}

/** Default axis title per unit. */
const AXIS_TITLE: Record<HistogramUnit, string> = { s: '50 % dead time', V: 'volts', C: 'charge', '': 'fraction' };

/** Mean and sample sigma from the bin centres (each within half a bin of its value). */
export function histogramMoments(h: StreamingHistogram): { mean: number; sigma: number } {
  let n = 0;
  let sum = 0;
  let squares = 0;
  h.counts.forEach((c, k) => {
    if (c === 0) return;
    const [a, b] = binEdges(h, k);
    const centre = (a + b) / 2;
    n += c;
    sum += c * centre;
    squares += c * centre * centre;
  });
  if (n === 0) return { mean: NaN, sigma: NaN };
  const mean = sum / n;
  return { mean, sigma: n > 1 ? Math.sqrt(Math.max(0, (squares - n * mean * mean) / (n - 1))) : 0 };
}

export function renderHistogram(input: HistogramInput): string {
  const unit = input.unit ?? 's';
  const height = MARGIN.top + input.series.length * (PANEL + MARGIN.bottom);
  const canvas = createCanvas(WIDTH, height, input.title);
  const root = canvas.root;
  root.rect(WIDTH, height).fill('#ffffff');
  const hatch = defineFailHatch(root, 'hist');
  drawText(root.group(), input.title, MARGIN.left, 30, { size: SIZE.title, bold: true });
  drawText(root.group(), input.subtitle, MARGIN.left, 52, { size: SIZE.subtitle, fill: MUTED });
  input.series.forEach((series, k) => {
    const h = series.histogram;
    const top = MARGIN.top + k * (PANEL + MARGIN.bottom);
    const g = root.group().attr({ class: 'histogram-panel', 'data-series': series.label });
    const [lo0, hi0] = h.count > 0 ? [h.min, h.max] : [undefined, undefined];
    let lo = lo0 ?? 0;
    let hi = hi0 ?? 1e-12;
    const spread = Math.max(hi - lo, 1e-12);
    // A requirement near the data is drawn to scale; a far one at the edge, beyond an axis break, with its distance.
    const limits = [
      { value: input.requirement, label: 'required >=', lower: true },
      { value: input.maximum, label: 'required <=', lower: false },
    ].filter((l): l is { value: number; label: string; lower: boolean } => l.value !== undefined);
    const near = limits.filter((l) => l.value > lo - NEAR * spread && l.value < hi + NEAR * spread);
    for (const l of near) {
      lo = Math.min(lo, l.value);
      hi = Math.max(hi, l.value);
    }
    const far = limits.filter((l) => !near.includes(l));
    const farBelow = far.some((l) => l.value < lo);
    const farAbove = far.some((l) => l.value > hi);
    const pad = Math.max(hi - lo, 1e-12) * 0.08;
    const left = MARGIN.left + (farBelow ? EDGE : 0);
    const right = WIDTH - MARGIN.right - (farAbove ? EDGE : 0);
    const x = scaleLinear()
      .domain([lo - pad, hi + pad])
      .range([left, right]);
    const xTicks = x.ticks(6);
    const label = (v: number) => valueLabel(v, unit, xTicks.length > 1 ? xTicks[1]! - xTicks[0]! : spread);
    const bins = bars(h, x.domain() as [number, number]);
    const most = Math.max(1, ...bins.map((b) => b.length));
    const y = scaleLinear()
      .domain([0, most])
      .range([top + PANEL, top + PLOT_TOP]);
    for (const t of y.ticks(4)) {
      g.line(MARGIN.left, round(y(t)), WIDTH - MARGIN.right, round(y(t))).stroke({ color: GRID, width: 1 });
      drawText(g, String(t), MARGIN.left - 8, y(t) + 4, { size: SIZE.tick, anchor: 'end', fill: MUTED });
    }
    drawText(g, 'dies per bin', 24, (top + PLOT_TOP + top + PANEL) / 2, {
      size: SIZE.tick,
      anchor: 'middle',
      fill: MUTED,
      rotate: -90,
      className: 'y-label',
    });
    for (const b of bins) {
      if (b.length === 0) continue;
      const x0 = x(b.x0);
      const x1 = x(b.x1);
      const below = limits.some((l) => (l.lower ? b.x1 <= l.value : b.x0 >= l.value));
      g.rect(round(Math.max(1, x1 - x0 - 1)), round(y(0) - y(b.length)))
        .move(round(x0), round(y(b.length)))
        .fill(below ? hatch : PHASE_TINT[k % 2]!)
        .stroke({ color: below ? FAIL : PHASE[k % 2]!, width: 1 })
        .attr({ class: 'bar', 'data-count': b.length, 'data-fails': below ? 1 : 0 });
    }
    for (const t of xTicks) {
      g.line(round(x(t)), top + PANEL, round(x(t)), top + PANEL + 5).stroke({ color: INK, width: 1 });
      drawText(g, label(t), x(t), top + PANEL + 19, { size: SIZE.tick, anchor: 'middle', fill: MUTED });
    }
    g.line(MARGIN.left, top + PANEL, WIDTH - MARGIN.right, top + PANEL).stroke({ color: INK, width: 1 });
    drawText(g, input.axis ?? AXIS_TITLE[unit], (left + right) / 2, top + PANEL + 40, {
      size: SIZE.tick,
      anchor: 'middle',
      fill: MUTED,
      className: 'x-label',
    });
    drawText(g, `${series.label}  (${h.count} dies)`, MARGIN.left, top + 10, { size: SIZE.label, bold: true, fill: PHASE[k % 2]! });
    const moments =
      series.mean !== undefined && series.sigma !== undefined ? { mean: series.mean, sigma: series.sigma } : histogramMoments(h);
    if (Number.isFinite(moments.mean)) {
      const [d0, d1] = x.domain() as [number, number];
      const marks = [{ at: moments.mean, name: 'mean', cls: 'mean-marker', dash: undefined as string | undefined }];
      if (moments.sigma > 0) {
        marks.push({ at: moments.mean - moments.sigma, name: '\u2212\u03c3', cls: 'sigma-marker', dash: '2 3' });
        marks.push({ at: moments.mean + moments.sigma, name: '+\u03c3', cls: 'sigma-marker', dash: '2 3' });
      }
      for (const m of marks.filter((m) => m.at >= d0 && m.at <= d1)) {
        g.line(round(x(m.at)), top + PLOT_TOP - 4, round(x(m.at)), top + PANEL)
          .stroke({ color: INK, width: m.dash ? 1 : 1.5, dasharray: m.dash })
          .attr({ class: m.cls, 'data-value': m.at });
        drawText(g, m.name, x(m.at), top + PLOT_TOP - 8, { size: SIZE.tick, anchor: 'middle', fill: INK, halo: true });
      }
      drawText(g, `mean ${label(moments.mean)} \u00b7 \u03c3 ${label(moments.sigma)}`, WIDTH - MARGIN.right, top + 10, {
        size: SIZE.annotation,
        anchor: 'end',
        fill: INK,
        className: 'moments',
      });
    }
    for (const l of near) {
      g.line(round(x(l.value)), top + PLOT_TOP, round(x(l.value)), top + PANEL)
        .stroke({ color: FAIL, width: 2, dasharray: '6 4' })
        .attr({ class: 'requirement' });
      const toRight = x(l.value) < (MARGIN.left + WIDTH) / 2;
      drawText(g, `${l.label} ${label(l.value)}`, x(l.value) + (toRight ? 6 : -6), top + PLOT_TOP + 14, {
        size: SIZE.annotation,
        fill: FAIL,
        halo: true,
        anchor: toRight ? 'start' : 'end',
      });
    }
    far.forEach((l, j) => {
      const below = l.value < lo;
      const at = below ? MARGIN.left + 12 : WIDTH - MARGIN.right - 12;
      g.line(at, top + PLOT_TOP, at, top + PANEL)
        .stroke({ color: FAIL, width: 2, dasharray: '6 4' })
        .attr({ class: 'requirement', 'data-off-scale': 1 });
      drawText(g, `${l.label} ${label(l.value)}`, at + (below ? 14 : -6), top + PANEL - 6, {
        size: SIZE.annotation,
        fill: FAIL,
        halo: true,
        anchor: 'start',
        rotate: -90,
      });
      const cut = below ? MARGIN.left + EDGE / 2 + 6 : WIDTH - MARGIN.right - EDGE / 2 - 6;
      const brk = g.group().attr({ class: 'axis-break' });
      brk
        .rect(8, 12)
        .move(cut - 4, top + PANEL - 6)
        .fill('#ffffff');
      for (const dx of [-4, 4]) brk.line(cut + dx - 3, top + PANEL + 6, cut + dx + 3, top + PANEL - 6).stroke({ color: INK, width: 1 });
      const distance = below ? (lo0 ?? 0) - l.value : l.value - (hi0 ?? 0);
      const text = `${below ? '\u25c2 ' : ''}${l.label} ${label(l.value)}: off scale, ${label(distance)} ${below ? 'below the least' : 'above the most'} die${below ? '' : ' \u25b8'}`;
      drawText(g, text, below ? MARGIN.left : WIDTH - MARGIN.right, top + 28 + 16 * j, {
        size: SIZE.annotation,
        fill: FAIL,
        halo: true,
        anchor: below ? 'start' : 'end',
      });
    });
  });
  return canvas.finish();
}
