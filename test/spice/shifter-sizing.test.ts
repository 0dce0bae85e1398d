import { describe, expect, it } from 'vitest';
import { loadDesign, loadProcess } from '../../src/cli/load.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { nominalTransitions } from '../../src/spice/shifter-sizing.js';
import { nominalCorner } from '../../src/switches/shifter-sizing.js';
import { design, processCard } from '../helpers.js';

const card = loadProcess(processCard('generic180'));

describe('nominalTransitions', () => {
  it("gives the gate nets' transitions at tt, the nominal supply and t0, whatever corners the design lists", () => {
    expect(nominalCorner(card, 0.5)).toEqual({ name: 'tt/1.8V/27C', process: 'tt', vdd: 1.8, temperature: 27, duty: 0.5 });
    const { design: d, card: c } = loadDesign(design('doubler'));
    const transition = nominalTransitions(resolveDesign(d, c))!;
    // The phase nets drive their switches' drivers: a few hundred ps, both edges averaged.
    expect(transition('p1')).toBeGreaterThan(50e-12);
    expect(transition('p1')).toBeLessThan(1e-9);
  });
});
