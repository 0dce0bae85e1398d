import { describe, expect, it } from 'vitest';
import { INSTANT_BANDS, instantBand } from '../../src/switches/instant-band.js';

describe('instantBand', () => {
  it("gives the optimistic end measured for the model and card (analytic on generic180: 3.1 % of a handover's path)", () => {
    expect(instantBand('analytic', 'generic180')).toBe(0.031);
    expect(instantBand('analytic', 'generic-lp')).toBe(0.048);
    expect(instantBand('table', 'generic-lp')).toBe(0.027);
  });

  it('gives a model never measured on a card the largest optimistic end on that card, an unknown card the largest on any', () => {
    expect(instantBand('table', 'generic180')).toBe(0.031);
    expect(instantBand('analytic', 'elsewhere')).toBe(Math.max(...INSTANT_BANDS.map((b) => b.high)));
    expect(instantBand('analytic', 'elsewhere')).toBe(0.048);
  });
});
