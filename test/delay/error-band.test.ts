import { describe, expect, it } from 'vitest';
import { processCard } from '../helpers.js';
import { loadProcess } from '../../src/cli/load.js';
import { ERROR_BANDS, GAP_BANDS, deadTimeBand, errorBand, errorBandText, gapBand } from '../../src/delay/error-band.js';

// Measured with the decks of test/bench/accuracy.bench.ts (ngspice-39, Debian package, time step at
// most 10 ps) on generic180's 10 shipped designs at all 45 corners, with the card's alpha-power law
// fitted to its transistor models, bent below full drive, with their saturation voltage (vdsatRatio)
// each drain's overlap on its net and each driving edge from its driver's own devices: analytic
// 0.65 % median / 2.80 % worst (-2.80..+2.33 %, ends rounded outward to -2.9 / +2.4; -2.8..+2.2 %
// with each driving edge solved as a like gate's; 1.1 % /
// 2.5 % with x^alpha below full drive, no drain overlap and the prefactor scaled by 0.955; 1.6 % /
// 4.6 % with the saturation voltage at alpha - 1 as well); the shipped tables 5.2 % / 7.1 % (every
// one short: -7.1..-3.5 %, -185..-17 ps). lp-netlist (80 fF chain loads) at its 45 corners, on its
// card's fitted law: analytic 1.6 % / 5.0 % (-3.58..+5.00 %, most optimistic at fs/1V/-40C; 1.5 % /
// 4.2 % with each driving edge solved as a like gate's; 2.3 % / 6.4 % before the bend and the
// overlap), the card's wide-grid tables 1.2 % / 2.7 % (-2.7..+2.4 %).
describe('errorBand', () => {
  it('holds the measured dead-time errors per model and card', () => {
    expect(errorBand('analytic', 'generic180')).toMatchObject({ count: 900, median: 0.007, worst: 0.029, low: -0.029, high: 0.024 });
    expect(errorBand('table', 'generic180')).toMatchObject({ count: 900, median: 0.052, worst: 0.072, low: -0.072, high: -0.035 });
    expect(errorBand('analytic', 'generic-lp')).toMatchObject({ count: 90, median: 0.016, worst: 0.051, low: -0.036, high: 0.051 });
    expect(errorBand('table', 'generic-lp')).toMatchObject({ count: 90, median: 0.012, worst: 0.028, low: -0.028, high: 0.025 });
    expect(errorBand('table', 'ref18')).toBeUndefined();
  });

  it('ranks the analytic model ahead of the shipped tables on generic180 by median and by worst error', () => {
    const a = errorBand('analytic', 'generic180')!;
    const t = errorBand('table', 'generic180')!;
    expect(a.median).toBeLessThan(t.median);
    expect(a.worst).toBeLessThan(t.worst);
  });

  it('ranks the shipped generic-lp tables ahead of the analytic model by median and by worst error, so that card names them', () => {
    const a = errorBand('analytic', 'generic-lp')!;
    const t = errorBand('table', 'generic-lp')!;
    expect(t.median).toBeLessThan(a.median);
    expect(t.worst).toBeLessThan(a.worst);
    expect(loadProcess(processCard('generic-lp')).tables).toBe('../tables/generic-lp.json');
    expect(loadProcess(processCard('generic180')).tables).toBeUndefined();
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
      "model error: dead time -2.9 % to +2.4 % of ngspice (median |error| 0.7 %, 900 dead times on the shipped designs); the gap checks take its measured gap error, 2.5 % of the dead time, off the model's gap; read small margins against it",
    );
    expect(errorBandText('table', 'ref18')).toMatch(/not measured for the table model on card ref18/);
    // A model and card whose gap error was never measured are told the gap checks take the worst measured.
    expect(errorBandText('table', 'ref18')).toContain(
      "its gap error is not measured: the gap checks take the worst measured, 4.4 % of the dead time, off the model's gap",
    );
  });
});

// Measured with test/bench/accuracy.bench.ts (ngspice-39): the model's clean gap less ngspice's, over
// the model's dead time, at all 45 corners; generic180 -3.30..+2.44 % on the 10 shipped designs
// (most optimistic on too-tight at sf/1.98V/-40C; -3.3..+2.2 % with each driving edge solved as a
// like gate's; -4.0..+1.6 % with x^alpha below full drive, no
// drain overlap and the prefactor scaled by 0.955; -0.8..+9.1 % with the saturation voltage at
// alpha - 1, when too-tight's long phase edges came out short), its tables -7.6..-0.1 % (always
// short); lp-netlist with four delay-chain loads (36..80 fF, by `confirm --set`) -9.72..+4.35 %
// (-10.7..+3.6 % before), its tables -3.4..+3.1 %. The largest optimistic end measured on any is
// generic-lp's analytic 4.4 %.
describe('gapBand and deadTimeBand', () => {
  it('give the measured optimistic ends for the model and card, and for a card never measured the largest measured on any', () => {
    expect(gapBand('analytic', 'generic180')).toBe(0.025);
    // The generic180 tables' gaps were all short: nothing to take off.
    expect(gapBand('table', 'generic180')).toBe(0);
    expect(gapBand('analytic', 'generic-lp')).toBe(0.044);
    expect(gapBand('table', 'generic-lp')).toBe(0.031);
    expect(gapBand('analytic', 'ref18')).toBe(Math.max(...GAP_BANDS.map((b) => b.high)));
    expect(gapBand('analytic', 'ref18')).toBe(0.044);
    expect(deadTimeBand('analytic', 'generic180')).toBe(0.029);
    expect(deadTimeBand('analytic', 'ref18')).toBe(0.072);
  });

  it('takes both ends of the dead-time band: the generic180 tables, short at every dead time measured, get their 7.2 %', () => {
    // A dead time read short passes a maximum wrongly, so the headroom on every margin is the largest |error|.
    expect(errorBand('table', 'generic180')!.high).toBeLessThan(0);
    expect(deadTimeBand('table', 'generic180')).toBe(0.072);
    expect(gapBand('table', 'generic180')).toBeGreaterThanOrEqual(0);
  });
});
