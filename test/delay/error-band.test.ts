import { describe, expect, it } from 'vitest';
import { ERROR_BANDS, errorBand, errorBandText } from '../../src/delay/error-band.js';

// Measured with the decks of test/bench/accuracy.bench.ts (ngspice, Debian package) on generic180's
// 10 shipped designs at tt/1.8V/27C, ss/1.62V/125C, ff/1.98V/-40C, on the card's transistor-model
// capacitances (gate 1.92, drain 1.2 fF/um) with driven edges shaped by their drivers, Meyer
// channel charge, the opposing device's Miller charge, fanout pins as charged to the 50 % point and
// the kickback on driven inputs: analytic 2.3 % median / 5.3 % worst (-5.3..+3.9 %); the shipped
// tables 5.6 % / 6.3 % (every one short: -6.3..-4.8 %, -185..-18 ps). lp-netlist: analytic 5.8 % /
// 26.9 %, tables 8.1 % / 27.3 %.
describe('errorBand', () => {
  it('holds the measured dead-time errors per model and card', () => {
    expect(errorBand('analytic', 'generic180')).toMatchObject({ count: 60, median: 0.023, worst: 0.053, low: -0.053, high: 0.039 });
    expect(errorBand('table', 'generic180')).toMatchObject({ count: 60, median: 0.056, worst: 0.063, low: -0.063, high: -0.047 });
    expect(errorBand('analytic', 'generic-lp')?.worst).toBe(0.269);
    expect(errorBand('table', 'generic-lp')).toMatchObject({ count: 6, median: 0.081, worst: 0.273 });
    expect(errorBand('table', 'ref18')).toBeUndefined();
  });

  it('ranks the analytic model ahead of the shipped tables on both cards by median and by worst error', () => {
    for (const card of ['generic180', 'generic-lp']) {
      const a = errorBand('analytic', card)!;
      const t = errorBand('table', card)!;
      expect(a.median, card).toBeLessThan(t.median);
      expect(a.worst, card).toBeLessThan(t.worst);
    }
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
      'model error: dead time -5.3 % to +3.9 % of ngspice (median |error| 2.3 %, 60 dead times on the shipped designs); read small margins against it',
    );
    expect(errorBandText('table', 'ref18')).toMatch(/not measured for the table model on card ref18/);
  });
});
