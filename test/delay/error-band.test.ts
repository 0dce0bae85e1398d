import { describe, expect, it } from 'vitest';
import { ERROR_BANDS, GAP_BANDS, deadTimeBand, errorBand, errorBandText, gapBand } from '../../src/delay/error-band.js';

// Measured with the decks of test/bench/accuracy.bench.ts (ngspice-39, Debian package) on generic180's
// 10 shipped designs at all 45 corners, with the card's alpha-power law fitted to its transistor
// models: analytic 1.6 % median / 5.1 % worst (-2.4..+5.1 %); the shipped tables 5.3 % / 7.3 %
// (every one short: -7.3..-3.5 %, -185..-17 ps). lp-netlist (80 fF chain loads) at its 45 corners,
// on its card's fitted law: analytic 2.6 % / 13.0 % (-7.3..+13.0 %), tables 3.4 % / 12.2 %
// (-7.6..+12.2 %, extrapolated past their 36 fF load axis).
describe('errorBand', () => {
  it('holds the measured dead-time errors per model and card', () => {
    expect(errorBand('analytic', 'generic180')).toMatchObject({ count: 900, median: 0.016, worst: 0.051, low: -0.025, high: 0.051 });
    expect(errorBand('table', 'generic180')).toMatchObject({ count: 900, median: 0.053, worst: 0.073, low: -0.073, high: -0.035 });
    expect(errorBand('analytic', 'generic-lp')).toMatchObject({ count: 90, median: 0.026, worst: 0.13, low: -0.073, high: 0.13 });
    expect(errorBand('table', 'generic-lp')).toMatchObject({ count: 90, median: 0.034, worst: 0.122, low: -0.077, high: 0.122 });
    expect(errorBand('table', 'ref18')).toBeUndefined();
  });

  it('ranks the analytic model ahead of the shipped tables on generic180 by median and by worst error', () => {
    const a = errorBand('analytic', 'generic180')!;
    const t = errorBand('table', 'generic180')!;
    expect(a.median).toBeLessThan(t.median);
    expect(a.worst).toBeLessThan(t.worst);
  });

  it('ranks the analytic model ahead of the shipped generic-lp tables by median error, so the card names no tables', () => {
    // On lp-netlist (80 fF chain nodes, past the tables' 36 fF axis) the tables' worst is a little
    // lower (12.2 against 13.0 %) but their median higher, and they extrapolate.
    const a = errorBand('analytic', 'generic-lp')!;
    const t = errorBand('table', 'generic-lp')!;
    expect(a.median).toBeLessThan(t.median);
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
      "model error: dead time -2.5 % to +5.1 % of ngspice (median |error| 1.6 %, 900 dead times on the shipped designs); the gap checks take its measured gap error, 9.4 % of the dead time, off the model's gap; read small margins against it",
    );
    expect(errorBandText('table', 'ref18')).toMatch(/not measured for the table model on card ref18/);
    // A model and card whose gap error was never measured are told the gap checks take the worst measured.
    expect(errorBandText('table', 'generic-lp')).toContain(
      "its gap error is not measured: the gap checks take the worst measured, 44.1 % of the dead time, off the model's gap",
    );
  });
});

// Measured with test/bench/accuracy.bench.ts (ngspice-39): the model's clean gap less ngspice's, over
// the model's dead time, at all 45 corners; generic180 -0.8..+9.4 % on the 10 shipped designs
// (too-tight's long phase edges), its tables -7.7..+0.2 %; lp-netlist with four delay-chain loads
// (36..80 fF, by `confirm --set`) -16.6..+44.1 %.
describe('gapBand and deadTimeBand', () => {
  it('give the measured optimistic ends for the model and card, and for a card never measured the largest measured on any', () => {
    expect(gapBand('analytic', 'generic180')).toBe(0.094);
    expect(gapBand('table', 'generic180')).toBe(0.002);
    expect(gapBand('analytic', 'generic-lp')).toBe(0.441);
    expect(gapBand('analytic', 'ref18')).toBe(0.441);
    expect(gapBand('table', 'generic-lp')).toBe(Math.max(...GAP_BANDS.map((b) => b.high)));
    expect(deadTimeBand('analytic', 'generic180')).toBe(0.051);
    expect(deadTimeBand('analytic', 'ref18')).toBe(0.13);
  });

  it('takes both ends of the dead-time band: the generic180 tables, short at every dead time measured, get their 7.3 %', () => {
    // A dead time read short passes a maximum wrongly, so the headroom on every margin is the largest |error|.
    expect(errorBand('table', 'generic180')!.high).toBeLessThan(0);
    expect(deadTimeBand('table', 'generic180')).toBe(0.073);
    expect(gapBand('table', 'generic180')).toBeGreaterThanOrEqual(0);
  });
});
