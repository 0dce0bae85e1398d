/**
 * The gap checks' band against ngspice (Debian package ngspice, fixtures/models/generic-lp.lib) on
 * lp-netlist.yaml with 36 fF on its delay-chain nodes instead of the shipped 80 fF: the lightest
 * load the generic-lp bands were measured at, where the edges are fastest and the clean gaps
 * smallest. At the corners that bound the band (the sf corners at 0.9-1.1 V hot, fs at 0.9 V
 * cold) the clean gap the check reads, the model's gap less the card's measured band times the
 * dead time, must never exceed ngspice's, for the card's default model (its tables) and for the
 * analytic model; and a corner whose check passes must have ngspice's phases clean there too.
 */
import { describe, expect, it } from 'vitest';
import { gapBand } from '../../src/delay/error-band.js';
import { cli, design } from '../helpers.js';
import { requireTool } from '../tools.js';

requireTool('ngspice', 'ngspice');

const LIGHT = ['loads.d1a', 'loads.d1b', 'loads.d2a', 'loads.d2b'].flatMap((key) => ['--set', `${key}=36fF`]);
const CORNERS = ['sf/0.9V/125C', 'sf/1V/125C', 'sf/1.1V/125C', 'fs/0.9V/-40C'];

interface Quantity {
  quantity: string;
  kind: string;
  model: number;
  simulator: number | null;
}
interface ConfirmCorner {
  corner: string;
  quantities: Quantity[];
}

describe.each([
  ['table', []],
  ['analytic', ['--model', 'analytic']],
] as const)('the %s model on lp-netlist at 36 fF, against ngspice', (model, flags) => {
  const confirm = cli(...flags, 'confirm', design('lp-netlist'), ...LIGHT, '--corners', CORNERS.join(','), '--json', '--jobs', '2');
  const corners = JSON.parse(confirm.stdout).corners as ConfirmCorner[];
  const check = JSON.parse(cli(...flags, 'check', design('lp-netlist'), ...LIGHT, '--json').stdout);
  const band = gapBand(model, 'generic-lp');

  it('simulates every corner asked for', () => {
    expect(corners.map((c) => c.corner)).toEqual(CORNERS);
  });

  it('never reads a clean gap longer than ngspice has once the card’s band is taken off', () => {
    for (const c of corners) {
      const q = new Map(c.quantities.map((x) => [x.quantity, x]));
      for (const dir of ['p1->p2', 'p2->p1']) {
        const gap = q.get(`gap ${dir}`)!;
        const dead = q.get(`dead ${dir}`)!;
        expect(gap.simulator, `${c.corner} ${dir}`).not.toBeNull();
        expect(gap.model - band * dead.model, `${c.corner} ${dir}`).toBeLessThanOrEqual(gap.simulator!);
      }
    }
  });

  it('passes the non-overlap check only where ngspice has both gaps clean', () => {
    for (const c of corners) {
      const verdict = check.corners.find((x: { name: string }) => x.name === c.corner);
      const overlap = verdict.checks.find((x: { kind: string }) => x.kind === 'non-overlap');
      const simGaps = c.quantities.filter((x) => x.kind === 'gap').map((x) => x.simulator!);
      if (overlap.pass) expect(Math.min(...simGaps), c.corner).toBeGreaterThan(0);
    }
  });
});
