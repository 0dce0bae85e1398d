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
import { formatPsShort } from '../../units/format.js';

export interface HistogramInput {
  readonly title: string;
  readonly subtitle: string;
  readonly series: ReadonlyArray<{ readonly label: string; readonly histogram: StreamingHistogram }>;
  /** Smallest and largest allowed dead time, s, if the design sets them. */
  readonly requirement?: number;
  readonly maximum?: number;
}

/** How far outside the data a requirement may be and still be drawn to scale, in data ranges. */
const NEAR = 1.5;

const WIDTH = 900;
const PANEL = 260;
const MARGIN = { left: 70, right: 30, top: 70, bottom: 50 };
const BINS = 40;
/** Room above the bars for the series name and off-scale notes, px. */
const PLOT_TOP = 60;

interface Bar { readonly x0: number; readonly x1: number; readonly length: number }

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

const psLabel = formatPsShort;

export function renderHistogram(input: HistogramInput): string {
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
    // A requirement near the data is drawn to scale; a far one is named at the edge with its distance.
    const limits = [
      { value: input.requirement, label: 'required >=', lower: true },
      { value: input.maximum, label: 'required <=', lower: false },
    ].filter((l): l is { value: number; label: string; lower: boolean } => l.value !== undefined);
    const near = limits.filter((l) => l.value > lo - NEAR * spread && l.value < hi + NEAR * spread);
    for (const l of near) { lo = Math.min(lo, l.value); hi = Math.max(hi, l.value); }
    const far = limits.filter((l) => !near.includes(l));
    const pad = Math.max(hi - lo, 1e-12) * 0.08;
    const x = scaleLinear().domain([lo - pad, hi + pad]).range([MARGIN.left, WIDTH - MARGIN.right]);
    const bins = bars(h, x.domain() as [number, number]);
    const most = Math.max(1, ...bins.map((b) => b.length));
    const y = scaleLinear().domain([0, most]).range([top + PANEL, top + PLOT_TOP]);
    for (const t of y.ticks(4)) {
      g.line(MARGIN.left, round(y(t)), WIDTH - MARGIN.right, round(y(t))).stroke({ color: GRID, width: 1 });
      drawText(g, String(t), MARGIN.left - 8, y(t) + 4, { size: SIZE.tick, anchor: 'end', fill: MUTED });
    }
    for (const b of bins) {
      if (b.length === 0) continue;
      const x0 = x(b.x0);
      const x1 = x(b.x1);
      const below = limits.some((l) => (l.lower ? b.x1 <= l.value : b.x0 >= l.value));
      g.rect(round(Math.max(1, x1 - x0 - 1)), round(y(0) - y(b.length))).move(round(x0), round(y(b.length)))
        .fill(below ? `url(#${hatch})` : PHASE_TINT[k % 2]!).stroke({ color: below ? FAIL : PHASE[k % 2]!, width: 1 })
        .attr({ class: 'bar', 'data-count': b.length, 'data-fails': below ? 1 : 0 });
    }
    for (const t of x.ticks(6)) {
      g.line(round(x(t)), top + PANEL, round(x(t)), top + PANEL + 5).stroke({ color: INK, width: 1 });
      drawText(g, psLabel(t), x(t), top + PANEL + 19, { size: SIZE.tick, anchor: 'middle', fill: MUTED });
    }
    g.line(MARGIN.left, top + PANEL, WIDTH - MARGIN.right, top + PANEL).stroke({ color: INK, width: 1 });
    drawText(g, `${series.label}  (${h.count} dies)`, MARGIN.left, top + 10, { size: SIZE.label, bold: true, fill: PHASE[k % 2]! });
    for (const l of near) {
      g.line(round(x(l.value)), top + PLOT_TOP, round(x(l.value)), top + PANEL).stroke({ color: FAIL, width: 2, dasharray: '6 4' });
      const right = x(l.value) < (MARGIN.left + WIDTH) / 2;
      drawText(g, `${l.label} ${psLabel(l.value)}`, x(l.value) + (right ? 6 : -6), top + PLOT_TOP + 14, { size: SIZE.annotation, fill: FAIL, halo: true, anchor: right ? 'start' : 'end' });
    }
    far.forEach((l, j) => {
      const below = l.value < lo;
      const distance = below ? (lo0 ?? 0) - l.value : l.value - (hi0 ?? 0);
      const text = `${below ? '\u25c2 ' : ''}${l.label} ${psLabel(l.value)}: off scale, ${psLabel(distance)} ${below ? 'below the least' : 'above the most'} die${below ? '' : ' \u25b8'}`;
      drawText(g, text, below ? MARGIN.left : WIDTH - MARGIN.right, top + 28 + 16 * j, { size: SIZE.annotation, fill: FAIL, halo: true, anchor: below ? 'start' : 'end' });
    });
  });
  return canvas.finish();
}
