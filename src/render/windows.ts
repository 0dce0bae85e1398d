/**
 * The two handover windows of a period. The clock's edges split the period in two halves; each
 * half holds one handover and every edge it causes. A window spans the ramps whose 50 % points
 * fall in its half, padded; both windows get the same length so their scales match.
 */
import { wrapTime } from '../measure/wrap-time.js';

export interface TimeWindow {
  /** Start and end, s, relative to the period start; may run past either end of the period. */
  readonly from: number;
  readonly to: number;
  /** 0: the half after the clock's rising edge; 1: after its falling edge. */
  readonly half: 0 | 1;
}

export interface TimedEvent {
  /** Instant that decides the half it belongs to, s. */
  readonly t: number;
  /** Extent drawn, s. */
  readonly lo: number;
  readonly hi: number;
}

/** Least window length, s, so that a window around a lone clock edge still shows something. */
const MIN_SPAN = 200e-12;

export function handoverWindows(period: number, clockFall: number, events: readonly TimedEvent[]): [TimeWindow, TimeWindow] {
  const halves: Array<{ start: number; length: number; lo: number; hi: number }> = [
    { start: 0, length: clockFall, lo: Infinity, hi: -Infinity },
    { start: clockFall, length: period - clockFall, lo: Infinity, hi: -Infinity },
  ];
  for (const e of events) {
    if (!Number.isFinite(e.t) || !Number.isFinite(e.lo) || !Number.isFinite(e.hi)) continue;
    // An instant a hair before the period start (rounding) belongs to the start.
    const wrapped = wrapTime(e.t, period);
    const at = wrapped > period * (1 - 1e-9) ? wrapped - period : wrapped;
    const h = at < clockFall - period * 1e-9 ? halves[0]! : halves[1]!;
    // Move the event into the period [0, T) by whole periods.
    const shift = at - e.t;
    h.lo = Math.min(h.lo, e.lo + shift);
    h.hi = Math.max(h.hi, e.hi + shift);
  }
  const spans = halves.map((h) => {
    const lo = Math.min(Number.isFinite(h.lo) ? h.lo : h.start, h.start);
    const hi = Math.max(Number.isFinite(h.hi) ? h.hi : h.start, h.start + MIN_SPAN);
    return { lo, hi };
  });
  const length = Math.max(...spans.map((s) => s.hi - s.lo));
  const pad = Math.max(0.08 * length, 50e-12);
  return spans.map((s, i) => ({ from: s.lo - pad, to: s.lo - pad + length + 2 * pad, half: i as 0 | 1 })) as [TimeWindow, TimeWindow];
}
