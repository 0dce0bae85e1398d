/**
 * The circuit against the clock frequency: mean output above, efficiency below, on one log
 * frequency axis, a series per corner (told apart by marker shape and dash as well as colour),
 * the requirements as dashed lines, the design's own frequency marked, and every point that
 * misses a circuit requirement crossed out.
 */
import type { G } from '@svgdotjs/svg.js';
import { scaleLinear, scaleLog, type ScaleLinear, type ScaleLogarithmic } from 'd3-scale';
import type { CircuitSweep, SweepPoint } from '../../analysis/circuit-sweep.js';
import { formatEngineering } from '../../units/format.js';
import { CORNER_COLOURS, FAIL, GLYPH, GRID, INK, MUTED, PAPER, SIZE } from '../palette.js';
import { createCanvas, points, round } from './canvas.js';
import { drawValueAxis } from './axis.js';
import { drawText, textWidth } from './text.js';
import { paddedDomain, voltTicks } from './volt-axis.js';
import { xmlText } from './xml-text.js';

const WIDTH = 1000;
const HEIGHT = 600;
const LEFT = 96;
const RIGHT = 700;
const OUT = { top: 118, bottom: 318 } as const;
const EFF = { top: 370, bottom: 530 } as const;
const SHAPES = ['circle', 'square'] as const;
const DASHES = ['7 4', '2 3'] as const;
const COLOURS = [CORNER_COLOURS[1], CORNER_COLOURS[2]] as const;

export interface SweepChartInput {
  readonly design: string;
  /** The output node's name, as the design file writes it. */
  readonly output: string;
  readonly sweep: CircuitSweep;
}

/** Frequency ticks: the 1, 2 and 5 of each decade inside the domain, in the unit of the design frequency. */
function frequencyTicks(x: ScaleLogarithmic<number, number>, reference: number): Array<{ value: number; label: string }> {
  const [lo, hi] = x.domain() as [number, number];
  const unit =
    reference >= 1e9
      ? ([1e9, 'GHz'] as const)
      : reference >= 1e6
        ? ([1e6, 'MHz'] as const)
        : reference >= 1e3
          ? ([1e3, 'kHz'] as const)
          : ([1, 'Hz'] as const);
  const out: Array<{ value: number; label: string }> = [];
  for (let decade = Math.floor(Math.log10(lo)); decade <= Math.ceil(Math.log10(hi)); decade++) {
    for (const m of [1, 2, 5]) {
      const value = m * 10 ** decade;
      if (value >= lo && value <= hi) out.push({ value, label: `${Number((value / unit[0]).toPrecision(3))} ${unit[1]}` });
    }
  }
  return out;
}

function marker(g: G, shape: (typeof SHAPES)[number], x: number, y: number, colour: string, fail: boolean): void {
  const r = 5;
  const stroke = { color: colour, width: 1.6 };
  if (shape === 'circle')
    g.circle(2 * r)
      .center(round(x), round(y))
      .fill(PAPER)
      .stroke(stroke)
      .attr({ class: 'marker' });
  else
    g.rect(2 * r * 0.85, 2 * r * 0.85)
      .center(round(x), round(y))
      .fill(PAPER)
      .stroke(stroke)
      .attr({ class: 'marker' });
  if (fail) {
    const c = r + 2.5;
    g.line(round(x - c), round(y - c), round(x + c), round(y + c))
      .stroke({ color: FAIL, width: 2 })
      .attr({ class: 'fail-cross' });
    g.line(round(x - c), round(y + c), round(x + c), round(y - c)).stroke({ color: FAIL, width: 2 });
  }
}

type Value = (p: SweepPoint) => number | null;
type Verdict = (p: SweepPoint) => boolean | null;

function drawSeries(
  g: G,
  sweep: CircuitSweep,
  x: ScaleLogarithmic<number, number>,
  y: ScaleLinear<number, number>,
  value: Value,
  verdict: Verdict,
  quantity: string,
  text: (v: number) => string,
): void {
  sweep.series.forEach((s, i) => {
    const sg = g.group().attr({ class: `series series-${quantity}`, 'data-corner': xmlText(s.corner) });
    const colour = COLOURS[i % 2]!;
    let run: Array<[number, number]> = [];
    const flush = () => {
      if (run.length > 1)
        sg.polyline(points(run))
          .fill('none')
          .stroke({ color: colour, width: 1.5, dasharray: i === 0 ? undefined : '5 3' });
      run = [];
    };
    for (const p of s.points) {
      const v = value(p);
      if (v === null) {
        flush();
        continue;
      }
      run.push([x(p.frequency), y(v)]);
    }
    flush();
    for (const p of s.points) {
      const v = value(p);
      if (v === null) continue;
      const pass = verdict(p);
      const pg = sg
        .group()
        .attr({ class: 'point', 'data-frequency': String(p.frequency), [`data-${quantity}`]: String(v), 'data-pass': String(pass) });
      marker(pg, SHAPES[i % 2]!, x(p.frequency), y(v), colour, pass === false);
      pg.element('title').words(
        xmlText(
          `${s.corner}, ${formatEngineering(p.frequency, 'Hz')}: ${text(v)}${pass === false ? ` ${GLYPH.fail} misses its requirement` : ''}`,
        ),
      );
    }
  });
}

function requirementLine(g: G, x0: number, x1: number, y: number, dash: string, colour: string, cls: string, value: number): void {
  g.line(round(x0), round(y), round(x1), round(y))
    .stroke({ color: colour, width: 1.2, dasharray: dash })
    .attr({ class: cls, 'data-value': String(value) });
}

export function renderCircuitSweepChart(input: SweepChartInput, idPrefix = 'sweep'): string {
  const { sweep } = input;
  const all = sweep.series.flatMap((s) => s.points);
  const freqs = all.map((p) => p.frequency);
  const x = scaleLog()
    .domain([Math.min(...freqs) / 1.12, Math.max(...freqs) * 1.12])
    .range([LEFT, RIGHT]);
  const outputs = [...all.map((p) => p.output), ...sweep.series.flatMap((s) => [s.outputMin, s.outputMax])].filter(
    (v): v is number => v !== null,
  );
  const [olo, ohi] = outputs.length > 0 ? paddedDomain(Math.min(...outputs), Math.max(...outputs)) : [0, 1];
  const yOut = scaleLinear().domain([olo, ohi]).range([OUT.bottom, OUT.top]).nice(5);
  const effs = [...all.map((p) => p.efficiency), sweep.efficiencyMin].filter((v): v is number => v !== null).map((v) => v * 100);
  const elo = effs.length > 0 ? Math.max(0, Math.min(...effs) - 5) : 0;
  const ehi = effs.length > 0 ? Math.min(100, Math.max(...effs) + 5) : 100;
  const yEff = scaleLinear()
    .domain([elo, Math.max(ehi, elo + 1)])
    .range([EFF.bottom, EFF.top])
    .nice(5);

  const title = `${input.design}: output and efficiency against clock frequency`;
  const canvas = createCanvas(WIDTH, HEIGHT, title);
  const root = canvas.root;
  root.attr({ id: `${idPrefix}-chart` });
  root.rect(WIDTH, HEIGHT).fill(PAPER);
  drawText(root.group(), title, 16, 30, { size: SIZE.title, bold: true, className: 'title' });
  const f0 = formatEngineering(sweep.designFrequency, 'Hz');
  const count = sweep.series[0]?.points.length ?? 0;
  drawText(
    root.group(),
    `${count} clock frequencies from ${formatEngineering(Math.min(...freqs), 'Hz')} to ${formatEngineering(Math.max(...freqs), 'Hz')} (design: ${f0}), log axis; each point re-simulates the generator and solves the circuit`,
    16,
    54,
    { size: SIZE.subtitle, fill: MUTED, className: 'subtitle' },
  );
  const missing = sweep.series.flatMap((s) =>
    s.points.filter((p) => p.output === null).map((p) => `${formatEngineering(p.frequency, 'Hz')} at ${s.corner}`),
  );
  if (missing.length > 0) {
    drawText(root.group(), `no steady state (not drawn): ${missing.join(', ')}`, 16, 74, {
      size: SIZE.small,
      fill: FAIL,
      className: 'missing-note',
    });
  }

  const axes = root.group().attr({ class: 'axes' });
  const ticks = frequencyTicks(x, sweep.designFrequency);
  for (const band of [OUT, EFF]) {
    for (const t of ticks) axes.line(round(x(t.value)), band.top, round(x(t.value)), band.bottom).stroke({ color: GRID, width: 1 });
  }
  drawValueAxis(axes.group().attr({ class: 'volt-axis' }), yOut, voltTicks(yOut, 5), LEFT, RIGHT);
  drawValueAxis(
    axes.group().attr({ class: 'percent-axis' }),
    yEff,
    yEff.ticks(5).map((v) => ({ value: v, label: `${v} %` })),
    LEFT,
    RIGHT,
  );
  for (const t of ticks) {
    axes.line(round(x(t.value)), EFF.bottom, round(x(t.value)), EFF.bottom + 5).stroke({ color: MUTED, width: 1 });
    drawText(axes, t.label, x(t.value), EFF.bottom + 19, { size: SIZE.tick, anchor: 'middle', fill: MUTED, className: 'tick-label' });
  }
  axes.line(LEFT, EFF.bottom, RIGHT, EFF.bottom).stroke({ color: MUTED, width: 1 });
  drawText(axes, 'clock frequency', (LEFT + RIGHT) / 2, EFF.bottom + 42, { size: SIZE.label, anchor: 'middle', className: 'axis-title' });
  drawText(axes, `mean output V(${input.output})`, LEFT, OUT.top - 12, { size: SIZE.label, bold: true, className: 'axis-title' });
  drawText(axes, 'efficiency (output power over input power, the clock generator included)', LEFT, EFF.top - 12, {
    size: SIZE.label,
    bold: true,
    className: 'axis-title',
  });

  const reqs = root.group().attr({ class: 'requirements' });
  sweep.series.forEach((s, i) => {
    for (const [v, cls] of [
      [s.outputMin, 'output-min'],
      [s.outputMax, 'output-max'],
    ] as const) {
      if (v !== null) requirementLine(reqs, LEFT, RIGHT, yOut(v), DASHES[i % 2]!, COLOURS[i % 2]!, cls, v);
    }
  });
  if (sweep.efficiencyMin !== null)
    requirementLine(reqs, LEFT, RIGHT, yEff(sweep.efficiencyMin * 100), DASHES[0], INK, 'efficiency-min', sweep.efficiencyMin);

  const design = root.group().attr({ class: 'design-frequency', 'data-frequency': String(sweep.designFrequency) });
  const xd = x(sweep.designFrequency);
  for (const band of [OUT, EFF])
    design.line(round(xd), band.top, round(xd), band.bottom).stroke({ color: INK, width: 1.5, dasharray: '4 3' });
  const label = `design ${f0}`;
  const lx = Math.min(RIGHT - textWidth(label, SIZE.small, true) / 2, xd);
  drawText(design, label, lx, OUT.top - 12, {
    size: SIZE.small,
    bold: true,
    anchor: 'middle',
    ground: true,
    className: 'design-frequency-label',
  });

  const data = root.group().attr({ class: 'data' });
  drawSeries(
    data,
    sweep,
    x,
    yOut,
    (p) => p.output,
    (p) => p.outputPass,
    'output',
    (v) => formatEngineering(v, 'V'),
  );
  drawSeries(
    data,
    sweep,
    x,
    yEff,
    (p) => (p.efficiency === null ? null : p.efficiency * 100),
    (p) => p.efficiencyPass,
    'efficiency',
    (v) => `${v.toFixed(1)} %`,
  );
  drawLegend(root.group().attr({ class: 'legend' }), input);
  return canvas.finish();
}

function drawLegend(g: G, input: SweepChartInput): void {
  const lx = RIGHT + 36;
  let ly = OUT.top;
  const line = (text: string, size = SIZE.small, fill = INK) => {
    drawText(g, text, lx + 34, ly + 4, { size, fill, className: 'legend-label' });
    ly += 24;
  };
  input.sweep.series.forEach((s, i) => {
    const colour = COLOURS[i % 2]!;
    g.line(lx, round(ly), lx + 26, round(ly)).stroke({ color: colour, width: 1.5, dasharray: i === 0 ? undefined : '5 3' });
    marker(g, SHAPES[i % 2]!, lx + 13, ly, colour, false);
    drawText(g, s.corner, lx + 34, ly + 4, { size: SIZE.label, bold: true, fill: INK, className: 'legend-label' });
    ly += 18;
    drawText(
      g,
      `${s.role === 'typical' ? 'typical corner' : s.role === 'worst' ? 'least circuit margin' : 'typical, least circuit margin'}`,
      lx + 34,
      ly + 4,
      { size: SIZE.small, fill: MUTED, className: 'legend-label' },
    );
    ly += 18;
    if (s.outputMin !== null || s.outputMax !== null) {
      g.line(lx, round(ly), lx + 26, round(ly)).stroke({ color: colour, width: 1.2, dasharray: DASHES[i % 2] });
      line(
        `output ${[s.outputMin !== null ? `min ${formatEngineering(s.outputMin, 'V')}` : '', s.outputMax !== null ? `max ${formatEngineering(s.outputMax, 'V')}` : ''].filter((t) => t).join(', ')}`,
      );
    }
    ly += 8;
  });
  if (input.sweep.efficiencyMin !== null) {
    g.line(lx, round(ly), lx + 26, round(ly)).stroke({ color: INK, width: 1.2, dasharray: DASHES[0] });
    line(`efficiency min ${(input.sweep.efficiencyMin * 100).toFixed(1)} %`);
  }
  marker(g, 'circle', lx + 13, ly, MUTED, true);
  line(`${GLYPH.fail} misses its requirement`);
  ly -= 8;
  line('(output max: at the lighter load)', SIZE.small, MUTED);
  g.line(lx + 13, round(ly - 9), lx + 13, round(ly + 9)).stroke({ color: INK, width: 1.5, dasharray: '4 3' });
  line("the design's clock frequency");
}
