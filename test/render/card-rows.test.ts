import { describe, expect, it } from 'vitest';
import { cardRows } from '../../src/render/report-text.js';
import { loadProcess } from '../../src/cli/load.js';
import { processCard } from '../helpers.js';

describe('cardRows', () => {
  const card = loadProcess(processCard('generic180'));
  const row = (c: typeof card, name: string) => cardRows(c).rows.find((r) => r[0] === name);

  it("names the switches' threshold law beside the fit's tempco, and 2 phiF at the card's t0", () => {
    expect(row(card, 'threshold tempco')).toEqual(['threshold tempco', '1.56 mV/K', '1.78 mV/K']);
    expect(row(card, 'switch threshold law')).toEqual([
      'switch threshold law',
      'SPICE level 1-3 (2 phiF, band gap)',
      'SPICE level 1-3 (2 phiF, band gap)',
    ]);
    expect(row(card, '2 phiF at t0')).toEqual(['2 phiF at t0', '700 mV', '700 mV']);
  });

  it('gives a stated fall per kelvin, and the fit tempco where the card states no triode law', () => {
    const straight = { ...card, n: { ...card.n, triode: { vthTempco: 0.00136 } }, p: { ...card.p, triode: undefined } };
    expect(row(straight, 'switch threshold law')).toEqual(['switch threshold law', '1.36 mV/K', '1.78 mV/K']);
  });
});
