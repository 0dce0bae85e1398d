import { describe, expect, it } from 'vitest';
import { FIGURE_ERRORS, figureErrorText } from '../../src/circuit/figure-error.js';
import { cli, design, TYPICAL_ONLY } from '../helpers.js';

describe('figureErrorText', () => {
  it("states generic180's measured circuit error (confirm --corners all on five circuits, ngspice-39) and asks for confirm elsewhere", () => {
    expect(figureErrorText('generic180')).toBe(
      'circuit model error against ngspice (225 corners of the shipped circuits): output -0.3 % to +0.2 % of VDD, ripple -4.7 % to +3.9 %, efficiency -1.9 % to +2.7 %; the circuit checks take it off their margins',
    );
    expect(figureErrorText('generic-lp')).toBe(
      'circuit model error: not measured on card generic-lp; the circuit checks take the widest measured off their margins; run phasegap confirm before trusting a small circuit margin',
    );
    for (const e of FIGURE_ERRORS) for (const band of [e.output, e.ripple, e.efficiency]) expect(band[0]).toBeLessThanOrEqual(band[1]);
  });

  it("is printed by check right under the circuit table's title", () => {
    const lines = cli('check', design('doubler-pump'), ...TYPICAL_ONLY).stdout.split('\n');
    const title = lines.findIndex((l) => l.startsWith('circuit figures ('));
    expect(lines[title + 1]).toBe(figureErrorText('generic180'));
  });
});
