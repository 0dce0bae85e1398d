/**
 * The trade-off tune chooses from: every searched chain as a point, its fast-corner margin (least
 * margin over the corners) across and its slow-corner waste (largest dead time beyond the
 * requirement) up; the proposals and the design as it stands get their own marker shapes, named
 * in a legend (shape, not colour, tells them apart; no label sits on the crowded points).
 */
import type { G } from '@svgdotjs/svg.js';
import { scaleLinear } from 'd3-scale';
import { createCanvas, round } from './canvas.js';
import { drawMarker } from './markers.js';
import { drawText } from './text.js';
import { drawTimeAxis, drawValueAxis, timeTicks } from './axis.js';
import { CORNER_COLOURS, FAINT, INK, MUTED, PAPER, SIZE } from '../palette.js';
import type { TuneCandidateReport, TuneReport } from '../../report/tune-report.js';

const WIDTH = 900;
const HEIGHT = 462;
const PLOT = { left: 90, right: 640, top: 92, bottom: 392 };
const SHAPES = ['circle', 'square', 'triangle', 'diamond', 'nabla'] as const;
type Shape = (typeof SHAPES)[number] | 'cross' | 'dot';

function marker(g: G, shape: Shape, x: number, y: number, colour: string): void {
  if (shape === 'dot') {
    g.circle(5).center(round(x), round(y)).fill(FAINT).attr({ class: 'marker' });
    return;
  }
  drawMarker(g, shape, x, y, { radius: 5.5, colour, fill: PAPER, width: 1.6, crossWidth: 2 });
}

interface Point {
  readonly x: number;
  readonly y: number;
}

function plotted(c: TuneCandidateReport): Point | null {
  const x = c.limiting?.margin;
  return x === null || x === undefined || c.waste === null || !Number.isFinite(x) ? null : { x, y: c.waste };
}

/** The chart as an SVG document, or null when no candidate has both figures. */
export function renderTuneChart(t: TuneReport, idPrefix = 'tune'): string | null {
  const named: Array<{ label: string; shape: Shape; colour: string; p: Point }> = [];
  const current = plotted(t.current);
  if (current) named.push({ label: 'this design', shape: 'cross', colour: INK, p: current });
  t.proposals.slice(0, SHAPES.length).forEach((c, i) => {
    const p = plotted(c);
    if (p) named.push({ label: `proposal ${i + 1}`, shape: SHAPES[i]!, colour: CORNER_COLOURS[(i + 1) % CORNER_COLOURS.length]!, p });
  });
  const others = t.candidates.map(plotted).filter((p): p is Point => p !== null);
  const all = [...others, ...named.map((n) => n.p)];
  if (all.length === 0) return null;
  const span = (v: number[]) => {
    const lo = Math.min(...v);
    const hi = Math.max(...v);
    const pad = Math.max((hi - lo) * 0.08, Math.abs(hi) * 0.02, 1e-12);
    return [lo - pad, hi + pad] as const;
  };
  const x = scaleLinear()
    .domain(span(all.map((p) => p.x)))
    .range([PLOT.left, PLOT.right]);
  const y = scaleLinear()
    .domain(span(all.map((p) => p.y)))
    .range([PLOT.bottom, PLOT.top]);
  const title = `${t.design}: searched delay chains`;
  const canvas = createCanvas(WIDTH, HEIGHT, title);
  const root = canvas.root;
  root.attr({ id: `${idPrefix}-chart` });
  root.rect(WIDTH, HEIGHT).fill(PAPER);
  drawText(root.group(), title, PLOT.left, 30, { size: SIZE.title, bold: true });
  drawText(
    root.group(),
    `${all.length} passing chains: fast-corner margin against slow-corner waste (largest dead time beyond the requirement)`,
    PLOT.left,
    52,
    { size: SIZE.subtitle, fill: MUTED },
  );
  const axes = root.group().attr({ class: 'axes' });
  drawTimeAxis(axes, x, PLOT.bottom, PLOT.top, 6);
  drawText(axes, 'least margin over the corners (fast corner)', (PLOT.left + PLOT.right) / 2, PLOT.bottom + 42, {
    size: SIZE.label,
    anchor: 'middle',
    fill: INK,
  });
  drawValueAxis(axes, y, timeTicks(y, 5), PLOT.left, PLOT.right);
  drawText(axes, 'slow-corner waste', PLOT.left, PLOT.top - 8, { size: SIZE.label, fill: INK });
  const dots = root.group().attr({ class: 'candidates' });
  for (const p of others) marker(dots, 'dot', x(p.x), y(p.y), FAINT);
  const marks = root.group().attr({ class: 'named' });
  for (const n of named) marker(marks.group().attr({ 'data-label': n.label }), n.shape, x(n.p.x), y(n.p.y), n.colour);
  const legend = root.group().attr({ class: 'legend' });
  const lx = PLOT.right + 40;
  [...named, { label: 'other searched chains', shape: 'dot' as Shape, colour: FAINT, p: { x: 0, y: 0 } }].forEach((n, i) => {
    const ly = PLOT.top + 10 + i * 26;
    marker(legend, n.shape, lx, ly, n.colour);
    drawText(legend, n.label, lx + 16, ly + 4, { size: SIZE.label, fill: INK });
  });
  return canvas.finish();
}
