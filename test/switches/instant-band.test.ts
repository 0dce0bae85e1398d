import { describe, expect, it } from 'vitest';
import { INSTANT_BANDS, instantBand } from '../../src/switches/instant-band.js';

describe('instantBand', () => {
  it("gives the optimistic end measured for the model and card (analytic on generic180: 8.6 % of a handover's path)", () => {
    expect(instantBand('analytic', 'generic180')).toBe(0.086);
    expect(instantBand('analytic', 'generic-lp')).toBe(0.049);
  });

  it('gives a model and card never measured the largest optimistic end measured on any', () => {
    expect(instantBand('table', 'generic180')).toBe(Math.max(...INSTANT_BANDS.map((b) => b.high)));
    expect(instantBand('table', 'generic180')).toBe(0.086);
  });
});
