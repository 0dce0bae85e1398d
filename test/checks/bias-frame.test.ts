import { describe, it, expect } from 'vitest';
import { BiasChecker } from '../../src/checks/bias-frame.js';
import { biasChecks } from '../../src/checks/bias-checks.js';
import { devicesAtCorner } from '../../src/process/device.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { loadDesign } from '../../src/cli/load.js';
import { design } from '../helpers.js';

/** A reproducible spread of threshold shifts, V (a fixed linear congruential sequence). */
function shifts(plans: ReturnType<typeof resolveDesign>['switches'], seed: number): Float64Array[] {
  let x = seed;
  const next = () => {
    x = (x * 1103515245 + 12345) % 2147483648;
    return (x / 2147483648 - 0.5) * 0.1;
  };
  return plans.map((p) => Float64Array.from(p.devices, () => next()));
}

describe('BiasChecker.run', () => {
  it.each(['doubler', 'doubler-unboosted', 'sc-integrator', 'lp-netlist'])(
    'gives exactly the checks of biasChecks at every corner of %s, with and without mismatch',
    (name) => {
      const { design: d, card } = loadDesign(design(name));
      const resolved = resolveDesign(d, card);
      const checker = new BiasChecker(resolved.switches, resolved.bias, resolved.biasNames);
      resolved.corners.forEach(({ corner }, i) => {
        const devices = devicesAtCorner(card, corner);
        for (const mismatch of [undefined, shifts(resolved.switches, i + 1), shifts(resolved.switches, i + 100)]) {
          const fast = checker.run(devices, mismatch, []);
          const reference = biasChecks(resolved.switches, devices, mismatch, resolved.bias, resolved.biasNames);
          expect(fast).toEqual(reference);
        }
      });
    },
  );
});
