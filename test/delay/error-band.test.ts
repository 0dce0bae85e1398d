import { describe, expect, it } from 'vitest';
import { errorBand, errorBandText } from '../../src/delay/error-band.js';

// Measured with the decks of test/bench/accuracy.bench.ts (ngspice, Debian package) on generic180's
// 10 shipped designs at tt/1.8V/27C, ss/1.62V/125C, ff/1.98V/-40C: analytic 4.0 % median / 8.5 %
// worst (-8.5..+0.6 %) with driven edges shaped by their drivers and the opposing device at its own
// threshold (ramp inputs 3.9 % / 8.8 %, -8.8..-0.2 %; one fitted edge shape 8.6 % / 12.1 % on 7 designs); tables of the earlier characterization 5.6 % / 6.1 %
// (all 5 to 6 % fast: -186..-20 ps); tables of the current one 2.3 % / 6.8 % (-67..+43 ps).
describe('errorBand', () => {
  it('holds the measured dead-time errors per model and card', () => {
    expect(errorBand('analytic', 'generic180')).toMatchObject({ count: 60, median: 0.04, worst: 0.085 });
    expect(errorBand('table', 'generic180')).toMatchObject({ count: 42, median: 0.023, worst: 0.068 });
    expect(errorBand('analytic', 'generic-lp')?.worst).toBe(0.255);
    expect(errorBand('table', 'generic-lp')).toBeUndefined();
  });

  it('ranks the table model ahead of the analytic one on generic180 by median and by signed spread', () => {
    const a = errorBand('analytic', 'generic180')!;
    const t = errorBand('table', 'generic180')!;
    expect(t.median).toBeLessThan(a.median);
    expect(t.high - t.low).toBeLessThan(a.high - a.low);
  });
});

describe('errorBandText', () => {
  it('prints the band with its source, or says none was measured', () => {
    expect(errorBandText('analytic', 'generic180')).toBe(
      'model error: dead time -8.5 % to +0.6 % of ngspice (median |error| 4.0 %, 60 dead times on the shipped designs); read small margins against it',
    );
    expect(errorBandText('table', 'ref18')).toMatch(/not measured for the table model on card ref18/);
  });
});
