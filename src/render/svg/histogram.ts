/**
 * Dead-time histograms of one corner's Monte Carlo dies, one panel per dead time, with the
 * requirement drawn as a labelled dashed line (colour is never the only cue: the line is dashed
 * and named, bars below the requirement are hatched).
 */
import { bin, extent } from 'd3-array';
import { scaleLinear } from 'd3-scale';
import { createCanvas, round } from './canvas.js';
import { drawText } from './text.js';
import { defineFailHatch } from './patterns.js';
import { FAIL, GRID, INK, MUTED, PHASE, PHASE_TINT, SIZE } from '../palette.js';

export interface HistogramInput {
  readonly title: string;
  readonly subtitle: string;
  readonly series: ReadonlyArray<{ readonly label: string; readonly values: Float64Array }>;
  /** Smallest allowed dead time, s, if the design sets one. */
  readonly requirement?: number;
}

const WIDTH = 900;
const PANEL = 230;
const MARGIN = { left: 70, right: 30, top: 70, bottom: 50 };
const BINS = 40;

export function renderHistogram(input: HistogramInput): string {
  const height = MARGIN.top + input.series.length * (PANEL + MARGIN.bottom);
  const canvas = createCanvas(WIDTH, height, input.title);
  const root = canvas.root;
  root.rect(WIDTH, height).fill('#ffffff');
  const hatch = defineFailHatch(root, 'hist');
  drawText(root.group(), input.title, MARGIN.left, 30, { size: SIZE.title, bold: true });
  drawText(root.group(), input.subtitle, MARGIN.left, 52, { size: SIZE.subtitle, fill: MUTED });
  input.series.forEach((series, k) => {
    const values = Array.from(series.values).filter((v) => Number.isFinite(v));
    const top = MARGIN.top + k * (PANEL + MARGIN.bottom);
    const g = root.group().attr({ class: 'histogram-panel', 'data-series': series.label });
    const [lo0, hi0] = extent(values) as [number | undefined, number | undefined];
    const req = input.requirement;
    let lo = Math.min(lo0 ?? 0, req ?? Infinity);
    let hi = Math.max(hi0 ?? 1e-12, req ?? -Infinity);
    if (hi <= lo) { lo -= 1e-12; hi += 1e-12; }
    const pad = (hi - lo) * 0.05;
    const x = scaleLinear().domain([lo - pad, hi + pad]).range([MARGIN.left, WIDTH - MARGIN.right]);
    const bins = bin().domain(x.domain() as [number, number]).thresholds(BINS)(values);
    const most = Math.max(1, ...bins.map((b) => b.length));
    const y = scaleLinear().domain([0, most]).range([top + PANEL, top + 16]);
    for (const t of y.ticks(4)) {
      g.line(MARGIN.left, round(y(t)), WIDTH - MARGIN.right, round(y(t))).stroke({ color: GRID, width: 1 });
      drawText(g, String(t), MARGIN.left - 8, y(t) + 4, { size: SIZE.tick, anchor: 'end', fill: MUTED });
    }
    for (const b of bins) {
      if (b.length === 0) continue;
      const x0 = x(b.x0!);
      const x1 = x(b.x1!);
      const below = req !== undefined && b.x1! <= req;
      g.rect(round(Math.max(1, x1 - x0 - 1)), round(y(0) - y(b.length))).move(round(x0), round(y(b.length)))
        .fill(below ? `url(#${hatch})` : PHASE_TINT[k % 2]!).stroke({ color: below ? FAIL : PHASE[k % 2]!, width: 1 });
    }
    for (const t of x.ticks(6)) {
      g.line(round(x(t)), top + PANEL, round(x(t)), top + PANEL + 5).stroke({ color: INK, width: 1 });
      drawText(g, `${Math.round(t * 1e13) / 10} ps`, x(t), top + PANEL + 19, { size: SIZE.tick, anchor: 'middle', fill: MUTED });
    }
    g.line(MARGIN.left, top + PANEL, WIDTH - MARGIN.right, top + PANEL).stroke({ color: INK, width: 1 });
    drawText(g, `${series.label}  (${values.length} dies)`, MARGIN.left, top + 10, { size: SIZE.label, bold: true, fill: PHASE[k % 2]! });
    if (req !== undefined) {
      g.line(round(x(req)), top + 16, round(x(req)), top + PANEL).stroke({ color: FAIL, width: 2, dasharray: '6 4' });
      drawText(g, `required >= ${Math.round(req * 1e13) / 10} ps`, x(req) + 6, top + 30, { size: SIZE.annotation, fill: FAIL, halo: true });
    }
  });
  return canvas.finish();
}
