import { describe, expect, it } from 'vitest';
import { ERROR_BANDS, GAP_BANDS, deadTimeBand, errorBand, errorBandText, gapBand } from '../../src/delay/error-band.js';

// Measured with the decks of test/bench/accuracy.bench.ts (ngspice-39, Debian package) on generic180's
// 10 shipped designs at tt/1.8V/27C, ss/1.62V/125C, ss/1.62V/-40C, ff/1.98V/-40C, ff/1.98V/125C, with
// the card's alpha-power law fitted to its transistor models: analytic 1.4 % median / 3.5 % worst
// (-2.0..+3.5 %); the shipped tables 5.6 % / 6.8 % (every one short: -6.8..-3.7 %, -185..-21 ps).
// lp-netlist (80 fF chain loads) at the same five corners of its card: analytic 15.3 % / 24.8 %
// (-24.8..+19.3 %), tables 2.1 % / 10.1 % (+0.2..+10.1 %, extrapolated past their 36 fF load axis).
describe('errorBand', () => {
  it('holds the measured dead-time errors per model and card', () => {
    expect(errorBand('analytic', 'generic180')).toMatchObject({ count: 100, median: 0.014, worst: 0.035, low: -0.02, high: 0.035 });
    expect(errorBand('table', 'generic180')).toMatchObject({ count: 100, median: 0.056, worst: 0.068, low: -0.068, high: -0.037 });
    expect(errorBand('analytic', 'generic-lp')).toMatchObject({ count: 10, median: 0.153, worst: 0.248, low: -0.248, high: 0.193 });
    expect(errorBand('table', 'generic-lp')).toMatchObject({ count: 10, median: 0.021, worst: 0.101 });
    expect(errorBand('table', 'ref18')).toBeUndefined();
  });

  it('ranks the analytic model ahead of the shipped tables on generic180 by median and by worst error', () => {
    const a = errorBand('analytic', 'generic180')!;
    const t = errorBand('table', 'generic180')!;
    expect(a.median).toBeLessThan(t.median);
    expect(a.worst).toBeLessThan(t.worst);
  });

  it('records that the shipped generic-lp tables, closer on lp-netlist, were measured past their load axis', () => {
    // Why generic-lp names no tables yet: on lp-netlist (80 fF chain nodes against the tables' 36 fF
    // axis) they measure closer than the analytic model, but by extrapolation.
    const a = errorBand('analytic', 'generic-lp')!;
    const t = errorBand('table', 'generic-lp')!;
    expect(t.median).toBeLessThan(a.median);
    expect(t.high).toBeLessThan(a.high);
  });

  it('never states a band narrower than its own worst error', () => {
    for (const b of ERROR_BANDS) {
      expect(Math.max(-b.low, b.high), `${b.model} ${b.card}`).toBeCloseTo(b.worst, 12);
      expect(b.low, `${b.model} ${b.card}`).toBeLessThanOrEqual(b.high);
    }
  });
});

describe('errorBandText', () => {
  it('prints the band with its source, or says none was measured', () => {
    expect(errorBandText('analytic', 'generic180')).toBe(
      "model error: dead time -2.0 % to +3.5 % of ngspice (median |error| 1.4 %, 100 dead times on the shipped designs); the gap checks take its measured gap error, 9.4 % of the dead time, off the model's gap; read small margins against it",
    );
    expect(errorBandText('table', 'ref18')).toMatch(/not measured for the table model on card ref18/);
    // A model and card whose gap error was never measured are told the gap checks take the worst measured.
    expect(errorBandText('table', 'generic180')).toContain(
      "its gap error is not measured: the gap checks take the worst measured, 53.1 % of the dead time, off the model's gap",
    );
  });
});

// Measured with `phasegap confirm` (ngspice-39): the model's clean gap less ngspice's, over the
// model's dead time; generic180 -0.6..+9.4 % (the shipped designs at five corners, too-tight at all
// 45; its long phase edges), lp-netlist at all 45 corners with four delay-chain loads -36.4..+53.1 %.
describe('gapBand and deadTimeBand', () => {
  it('give the measured optimistic ends for the model and card, and for a card never measured the largest measured on any', () => {
    expect(gapBand('analytic', 'generic180')).toBe(0.094);
    expect(gapBand('analytic', 'generic-lp')).toBe(0.531);
    expect(gapBand('analytic', 'ref18')).toBe(0.531);
    expect(gapBand('table', 'generic180')).toBe(Math.max(...GAP_BANDS.map((b) => b.high)));
    expect(deadTimeBand('analytic', 'generic180')).toBe(0.035);
    expect(deadTimeBand('analytic', 'ref18')).toBe(0.248);
  });

  it('takes both ends of the dead-time band: the generic180 tables, short at every dead time measured, get their 6.8 %', () => {
    // A dead time read short passes a maximum wrongly, so the headroom on every margin is the largest |error|.
    expect(errorBand('table', 'generic180')!.high).toBeLessThan(0);
    expect(deadTimeBand('table', 'generic180')).toBe(0.068);
    expect(gapBand('table', 'generic180')).toBeGreaterThanOrEqual(0);
  });
});
