import { describe, expect, it } from 'vitest';
import { runMonteCarlo } from '../../src/analysis/montecarlo.js';
import { evaluateCorner } from '../../src/analysis/evaluate.js';
import { resolveDesign, type ResolvedDesign } from '../../src/analysis/resolve.js';
import { loadDesign } from '../../src/cli/load.js';
import { design } from '../helpers.js';
import { figureErrorFor } from '../../src/circuit/figure-error.js';

/**
 * The demo doubler pump at one corner, its ripple requirement set exactly at the corner's nominal
 * ripple as the check reads it: the model's ripple over 1 + the most negative ripple error measured
 * against ngspice (circuit-checks.ts).
 */
function pumpAtItsRippleLimit(): { resolved: ResolvedDesign; nominalRipple: number } {
  const { design: d, card } = loadDesign(design('doubler-pump'));
  const whole = resolveDesign(d, card);
  const corners = whole.corners.filter(({ corner }) => corner.name === 'tt/1.8V/27C');
  const nominalRipple = evaluateCorner({ ...whole, corners }, corners[0]!.corner).circuit!.ripple;
  const read = nominalRipple / (1 + Math.min(0, figureErrorFor(card.name).ripple[0]));
  const circuit = d.circuit!;
  const tight = { ...d, circuit: { ...circuit, requirements: { ...circuit.requirements, ripple: { max: read } } } };
  return { resolved: { ...resolveDesign(tight, card), corners }, nominalRipple };
}

describe('runMonteCarlo on a design with a circuit', () => {
  const { resolved, nominalRipple } = pumpAtItsRippleLimit();
  const dies = 80;

  it('counts the circuit requirements in each die: at a ripple limit equal to the nominal ripple, some dies fail it', () => {
    const mc = runMonteCarlo(resolved, dies, 1);
    const corner = mc.corners[0]!;
    const ripple = corner.quantities.find((q) => q.kind === 'ripple-max')!;
    // Mismatch moves each die's ripple a little either side of the nominal one.
    expect(ripple.failures).toBeGreaterThan(dies * 0.1);
    expect(ripple.failures).toBeLessThan(dies * 0.9);
    expect(corner.passes).toBe(dies - ripple.failures!);
    expect(Math.abs(ripple.mean)).toBeLessThan(3 * ripple.sigma);
    expect(nominalRipple).toBeGreaterThan(0.01);
  });

  it('leaves the circuit out when asked, and then every die passes the timing and switch checks', () => {
    const mc = runMonteCarlo(resolved, dies, 1, { circuit: false });
    expect(mc.corners[0]!.passes).toBe(dies);
    expect(mc.corners[0]!.quantities.some((q) => q.kind === 'ripple-max')).toBe(false);
  });
});
