/**
 * The circuit's node voltages in the timing diagram's whole-period panel, on its time scale: one
 * row per node with its own volt axis (so a ripple of millivolts on volts fills the row), the
 * output's mean and peak-to-peak ripple, and the charge packets that lift it shaded.
 */
import type { G, Svg } from '@svgdotjs/svg.js';
import { scaleLinear, type ScaleLinear } from 'd3-scale';
import type { CircuitWaves, NodeTrace } from '../circuit-waves.js';
import { formatEngineering } from '../../units/format.js';
import { CLOCK, GRID, INK, MUTED, PHASE, PHASE_TINT, SIZE } from '../palette.js';
import { points, round } from './canvas.js';
import { drawText, fitText, textWidth } from './text.js';
import { paddedDomain, voltTicks } from './volt-axis.js';
import { xmlText } from './xml-text.js';

const HEADER = 30;
const ROW = 104;
/** Caption line above each plot, and the plot's top and bottom inside its row, px. */
const CAPTION = 14;
const PLOT_TOP = 26;
const PLOT_BOTTOM = 10;

export function circuitWavesHeight(w: CircuitWaves | null): number {
  return w === null ? 0 : HEADER + w.nodes.length * ROW;
}

export interface CircuitWavesPlace {
  readonly top: number;
  /** Right edge of the label column (volt ticks end here), px. */
  readonly labelRight: number;
  /** Room for a node name in the label column, px. */
  readonly labelWidth: number;
  readonly prefix: string;
  /** The drawing overlays every corner: the circuit is the one of the corner drawn as the line. */
  readonly overlay?: boolean;
}

export function drawCircuitWaves(root: Svg, w: CircuitWaves, scale: ScaleLinear<number, number>, place: CircuitWavesPlace): void {
  const [x0, x1] = scale.range() as [number, number];
  const g = root.group().attr({ class: 'circuit-waves', 'data-corner': xmlText(w.corner) });
  drawText(g, `Circuit at ${w.corner}`, x0, place.top + 20, { size: SIZE.label, bold: true, className: 'circuit-heading' });
  const noteX = x0 + textWidth(`Circuit at ${w.corner}`, SIZE.label, true) + 12;
  const note = `${place.overlay ? 'the corner drawn as the line; ' : ''}one steady-state period on the time scale above; each row on its own volt axis`;
  drawText(g, fitText(note, SIZE.small, x1 - noteX, false), noteX, place.top + 20, {
    size: SIZE.small,
    fill: MUTED,
    className: 'circuit-note',
  });
  w.nodes.forEach((node, i) => {
    const top = place.top + HEADER + i * ROW;
    drawRow(g, w, node, scale, top, place, `${place.prefix}-circuit-${i}`);
    g.line(round(x0), round(top + ROW - 2), round(x1), round(top + ROW - 2)).stroke({ color: GRID, width: 1 });
  });
}

function caption(w: CircuitWaves, node: NodeTrace): string {
  const v = (x: number) => formatEngineering(x, 'V');
  // A plate that swings volts and rests a few nanovolts off ground reads as 0 V.
  const rest = (x: number) => (Math.abs(x) < 1e-4 * (node.max - node.min) ? 0 : x);
  if (node.role !== 'output') return `${node.note} · ${v(rest(node.min))} to ${v(rest(node.max))}`;
  const packets =
    w.packets.length === 0
      ? ''
      : ` · charge packet${w.packets.length > 1 ? 's' : ''} ${w.packets.map((p) => `${p.rise >= 0 ? '+' : '-'}${v(Math.abs(p.rise))}`).join(', ')}`;
  return `output · mean ${v(w.output)} · ripple ${v(w.ripple)} peak to peak${packets}`;
}

function drawRow(
  g: G,
  w: CircuitWaves,
  node: NodeTrace,
  scale: ScaleLinear<number, number>,
  top: number,
  place: CircuitWavesPlace,
  clipId: string,
): void {
  const [x0, x1] = scale.range() as [number, number];
  const plotTop = top + PLOT_TOP;
  const plotBottom = top + ROW - PLOT_BOTTOM;
  const [lo, hi] = paddedDomain(node.min, node.max);
  const y = scaleLinear().domain([lo, hi]).range([plotBottom, plotTop]);
  const output = node.role === 'output';
  const rg = g.group().attr({
    class: `circuit-row ${node.role}`,
    'data-node': xmlText(node.node),
    'data-domain': `${lo} ${hi}`,
    'data-plot': `${round(plotBottom)} ${round(plotTop)}`,
    'data-min': String(node.min),
    'data-max': String(node.max),
    'data-mean': String(node.mean),
  });
  g.root()
    .defs()
    .element('clipPath')
    .attr({ id: clipId })
    .element('rect')
    .attr({ x: round(x0), y: round(plotTop - 2), width: round(x1 - x0), height: round(plotBottom - plotTop + 4) });
  const ticks = voltTicks(y, 4);
  const axis = rg.group().attr({ class: 'volt-axis' });
  for (const t of ticks) {
    const ty = y(t.value);
    axis.line(round(x0), round(ty), round(x1), round(ty)).stroke({ color: GRID, width: 1 });
    axis.line(round(x0 - 4), round(ty), round(x0), round(ty)).stroke({ color: MUTED, width: 1 });
    drawText(axis, t.label, place.labelRight - 6, ty + 4, { size: SIZE.tick, anchor: 'end', fill: MUTED, className: 'volt-tick' });
  }
  axis.line(round(x0), round(plotTop), round(x0), round(plotBottom)).stroke({ color: MUTED, width: 1 });
  const shown = fitText(node.node, SIZE.label, place.labelWidth, output);
  drawText(rg, shown, place.labelRight - 6, top + CAPTION, {
    size: SIZE.label,
    anchor: 'end',
    bold: output,
    fill: output ? INK : CLOCK,
    className: 'circuit-label',
    data: { node: node.node },
  });
  if (shown !== node.node) rg.last().element('title').words(xmlText(node.node));
  drawText(rg, fitText(caption(w, node), SIZE.small, x1 - x0 - 8, false), x0 + 4, top + CAPTION, {
    size: SIZE.small,
    fill: MUTED,
    className: 'circuit-caption',
  });
  const body = rg.group().attr({ 'clip-path': `url(#${clipId})` });
  if (output) drawPackets(body, w, scale, plotTop, plotBottom);
  if (output) {
    body
      .line(round(x0), round(y(node.mean)), round(x1), round(y(node.mean)))
      .stroke({ color: MUTED, width: 1, dasharray: '6 4' })
      .attr({ class: 'mean-line' });
  }
  body
    .polyline(points(node.points.map(([t, v]) => [scale(t), y(v)] as [number, number])))
    .fill('none')
    .stroke({ color: output ? INK : CLOCK, width: output ? 2 : 1.5, linejoin: 'round' })
    .attr({ class: 'node-wave', 'data-node': xmlText(node.node) });
  if (output && w.ripple > 0) rippleMark(rg, x1 - 8, y(node.max), y(node.min), w.ripple);
}

function drawPackets(g: G, w: CircuitWaves, scale: ScaleLinear<number, number>, plotTop: number, plotBottom: number): void {
  for (const p of w.packets) {
    for (const k of [-1, 0]) {
      const a = Math.max(0, p.start + k * w.period);
      const b = Math.min(w.period, p.end + k * w.period);
      if (b <= a) continue;
      g.rect(round(Math.max(1, scale(b) - scale(a))), round(plotBottom - plotTop))
        .move(round(scale(a)), round(plotTop))
        .fill(PHASE_TINT[1])
        .attr({ class: 'charge-packet', 'fill-opacity': 0.8, 'data-rise': String(p.rise) });
    }
  }
}

/** A vertical dimension from the output's least to its greatest value, arrowheads inward. */
function rippleMark(g: G, x: number, yTop: number, yBottom: number, ripple: number): void {
  const m = g.group().attr({ class: 'ripple-mark', 'data-ripple': String(ripple) });
  const stroke = { color: INK, width: 1 };
  m.line(round(x - 5), round(yTop), round(x + 5), round(yTop)).stroke(stroke);
  m.line(round(x - 5), round(yBottom), round(x + 5), round(yBottom)).stroke(stroke);
  m.line(round(x), round(yTop), round(x), round(yBottom)).stroke(stroke);
  if (yBottom - yTop >= 12) {
    m.polygon(
      points([
        [x, yTop],
        [x - 2.7, yTop + 6],
        [x + 2.7, yTop + 6],
      ]),
    ).fill(INK);
    m.polygon(
      points([
        [x, yBottom],
        [x - 2.7, yBottom - 6],
        [x + 2.7, yBottom - 6],
      ]),
    ).fill(INK);
  }
}

export interface CircuitLegendEntry {
  readonly text: string;
  readonly draw: (g: G, gx: number, y: number) => void;
}

/** Legend swatches for the circuit rows; none without them. */
export function circuitLegendEntries(w: CircuitWaves | null): CircuitLegendEntry[] {
  if (w === null) return [];
  const out: CircuitLegendEntry[] = [
    {
      text: 'node voltage (circuit)',
      draw: (g, gx, y) => {
        g.line(round(gx), round(y + 8), round(gx + 24), round(y + 8)).stroke({ color: INK, width: 2 });
      },
    },
    {
      text: 'mean output',
      draw: (g, gx, y) => {
        g.line(round(gx), round(y + 8), round(gx + 24), round(y + 8)).stroke({ color: MUTED, width: 1, dasharray: '6 4' });
      },
    },
  ];
  if (w.packets.length > 0) {
    out.push({
      text: 'charge packet into the output',
      draw: (g, gx, y) => {
        g.rect(24, 12)
          .move(round(gx), round(y + 2))
          .fill(PHASE_TINT[1])
          .stroke({ color: PHASE[1], width: 0.5 });
      },
    });
  }
  return out;
}
