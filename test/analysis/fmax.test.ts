import { describe, it, expect } from 'vitest';
import { findFmax } from '../../src/analysis/fmax.js';
import { loadDesign } from '../../src/cli/load.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { cli, design } from '../helpers.js';

function fmaxOf(overrides: string[] = []) {
  const { design: d, card } = loadDesign(design('doubler'), overrides);
  return findFmax(resolveDesign(d, card));
}

describe('findFmax', () => {
  it('is consistent with check: passes at 0.97 fmax and fails at 1.03 fmax', () => {
    const r = fmaxOf();
    expect(r.fmax).not.toBeNull();
    const f = r.fmax!;
    expect(cli('check', design('doubler'), '--set', `clock.frequency=${0.97 * f}`).code).toBe(0);
    expect(cli('check', design('doubler'), '--set', `clock.frequency=${1.03 * f}`).code).toBe(1);
  });

  it('rises when the settle capacitance falls', () => {
    const base = fmaxOf();
    const lighter = fmaxOf(['constraints.settle[0].capacitance=5pF']);
    expect(base.limiting?.kind).toBe('settle');
    expect(lighter.fmax!).toBeGreaterThan(base.fmax!);
  });

  it('reports no frequency when a frequency-independent check fails', () => {
    const r = findFmax(resolveDesign(loadDesign(design('too-tight')).design, loadDesign(design('too-tight')).card));
    expect(r.fmax).toBeNull();
    expect(r.limiting?.kind).toBe('break-before-make');
    expect(r.note).toContain('does not depend on the clock frequency');
  });
});

describe('findFmax: switch bias faults', () => {
  it('stops at the design clock when a switch fails its off-state or stress check: no frequency changes it', () => {
    const { design: d, card } = loadDesign(design('doubler-unboosted'));
    const result = findFmax(resolveDesign(d, card));
    expect(result.fmax).toBeNull();
    expect(result.evaluations).toBe(45);
    expect(result.limiting?.check).toBe('s_chg within ratings');
    expect(result.note).toBe('a switch fails its stress check, which no clock frequency changes');
  });
});
