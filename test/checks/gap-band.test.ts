/**
 * The gap checks' band against ngspice (Debian package ngspice, fixtures/models/generic-lp.lib) on
 * lp-netlist.yaml with the 36 fF chain loads it first shipped with: there ngspice has the phases
 * overlapping below 10 % of the swing at sf/0.9V/125C while the model's clean gap is positive, and
 * `check` passed every corner while it took a fixed 3 % of the dead time off the gap. With the
 * card's measured gap band (src/delay/error-band.ts) the non-overlap check fails there.
 * Measured (ngspice-39): model gap +8.1 ps both ways, ngspice +3.1 ps (p1->p2) and -43.0 ps
 * (p2->p1); model dead time 247.3 ps; check margin -100.9 ps. (With the card's earlier hand-set
 * law the model's gap was +37.3 ps, its dead time 215.6 ps.) The fixed 3 % leaves +0.7 ps.
 */
import { describe, expect, it } from 'vitest';
import { gapBand } from '../../src/delay/error-band.js';
import { cli, design } from '../helpers.js';
import { requireTool } from '../tools.js';

requireTool('ngspice', 'ngspice');

const FIRST_LOADS = ['loads.d1a', 'loads.d1b', 'loads.d2a', 'loads.d2b'].flatMap((key) => ['--set', `${key}=36fF`]);
const CORNER = 'sf/0.9V/125C';

interface Quantity {
  quantity: string;
  kind: string;
  model: number;
  simulator: number | null;
}

describe('the non-overlap check with the measured gap band, against ngspice on lp-netlist at 36 fF', () => {
  const confirm = cli('confirm', design('lp-netlist'), ...FIRST_LOADS, '--corners', CORNER, '--json', '--jobs', '1');
  const gaps = (JSON.parse(confirm.stdout).corners[0].quantities as Quantity[]).filter((q) => q.kind === 'gap');
  const check = JSON.parse(cli('check', design('lp-netlist'), ...FIRST_LOADS, '--json').stdout);
  const corner = check.corners.find((c: { name: string }) => c.name === CORNER);

  it('ngspice has the phases overlapping at sf/0.9V/125C where the model’s clean gap is positive', () => {
    const back = gaps.find((q) => q.quantity === 'gap p2->p1')!;
    expect(back.simulator!).toBeLessThan(-30e-12);
    expect(back.model).toBeGreaterThan(5e-12);
  });

  it('fails the non-overlap check there: the model gap less the card’s band, not the gap alone', () => {
    const overlap = corner.checks.find((c: { kind: string }) => c.kind === 'non-overlap');
    expect(overlap.pass).toBe(false);
    const band = gapBand('analytic', 'generic-lp');
    for (const d of corner.deadTimes as Array<{ t50: number; gap: number }>) {
      expect(d.gap).toBeGreaterThan(0);
      expect(overlap.margin).toBeLessThanOrEqual(d.gap - band * d.t50 + 1e-15);
    }
    // The fixed 3 % it replaced would have passed this corner.
    const fixed = Math.min(...(corner.deadTimes as Array<{ t50: number; gap: number }>).map((d) => d.gap - 0.03 * d.t50));
    expect(fixed).toBeGreaterThan(0);
  });
});
