/** A time axis with SI ticks (ps, ns, us) from a d3 linear scale. */
import type { G } from '@svgdotjs/svg.js';
import type { ScaleLinear } from 'd3-scale';
import { GRID, MUTED, SIZE } from '../palette.js';
import { round } from './canvas.js';
import { drawText, textWidth } from './text.js';
import { prefixedUnits } from '../../units/format.js';

export interface Tick {
  /** Time, s. */
  readonly value: number;
  readonly label: string;
}

const UNITS = prefixedUnits('s', 1e-6, 1e-15);

/** Ticks of a time scale labelled in one unit chosen for the domain, with the decimals the step needs. */
export function timeTicks(scale: ScaleLinear<number, number>, count: number): Tick[] {
  const values = scale.ticks(count);
  const [d0, d1] = scale.domain() as [number, number];
  const magnitude = Math.max(Math.abs(d0), Math.abs(d1));
  const [unit, name] = UNITS.find(([u]) => magnitude >= u * 0.999) ?? UNITS[UNITS.length - 1]!;
  const step = values.length > 1 ? values[1]! - values[0]! : magnitude;
  const decimals = Math.max(0, Math.min(4, Math.ceil(-Math.log10(step / unit) - 1e-9)));
  const zero = (0).toFixed(decimals);
  return values.map((value) => {
    const text = (value / unit).toFixed(decimals);
    return { value, label: `${text === `-${zero}` ? zero : text} ${name}` };
  });
}

/**
 * Axis line at y, ticks and labels below it, light grid lines up to `top`. A label that would
 * stick out past the ends of the axis is left off (its grid line stays).
 */
export function drawTimeAxis(g: G, scale: ScaleLinear<number, number>, y: number, top: number, count: number): void {
  const [x0, x1] = scale.range() as [number, number];
  const axis = g.group().attr({ class: 'time-axis' });
  for (const tick of timeTicks(scale, count)) {
    const x = scale(tick.value);
    axis.line(round(x), round(top), round(x), round(y)).stroke({ color: GRID, width: 1 });
    axis.line(round(x), round(y), round(x), round(y + 5)).stroke({ color: MUTED, width: 1 });
    const half = textWidth(tick.label, SIZE.tick) / 2;
    if (x - half < x0 - 2 || x + half > x1 + 2) continue;
    drawText(axis, tick.label, x, y + 18, { size: SIZE.tick, anchor: 'middle', fill: MUTED, className: 'tick-label' });
  }
  axis.line(round(x0), round(y), round(x1), round(y)).stroke({ color: MUTED, width: 1 });
}

/**
 * A value axis up the left edge at x0: a light grid line across to x1 and a label left of the axis
 * for each tick, then the axis line over the scale's range.
 */
export function drawValueAxis(
  g: G,
  scale: ScaleLinear<number, number>,
  ticks: ReadonlyArray<{ readonly value: number; readonly label: string }>,
  x0: number,
  x1: number,
): void {
  const [bottom, top] = scale.range() as [number, number];
  for (const t of ticks) {
    const y = scale(t.value);
    g.line(x0, round(y), x1, round(y)).stroke({ color: GRID, width: 1 });
    drawText(g, t.label, x0 - 8, y + 4, { size: SIZE.tick, anchor: 'end', fill: MUTED, className: 'tick-label' });
  }
  g.line(x0, round(top), x0, round(bottom)).stroke({ color: MUTED, width: 1 });
}
