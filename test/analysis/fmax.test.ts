import { describe, it, expect } from 'vitest';
import { findFmax } from '../../src/analysis/fmax.js';
import { loadDesign } from '../../src/cli/load.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { cli, design, expectClose } from '../helpers.js';

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

describe('phasegap fmax', () => {
  it('prints the frequency, the limiting check and corner; --json has fmax in Hz and limiting', () => {
    const text = cli('fmax', design('doubler'));
    expect(text.code).toBe(0);
    expect(text.stdout).toMatch(/fmax \d+\.\d+ MHz/);
    expect(text.stdout).toContain('limited by: flying-cap charge');
    const json = JSON.parse(cli('fmax', design('doubler'), '--json').stdout);
    expect(json.fmax).toBeGreaterThan(20e6);
    expect(json.limiting.corner).toMatch(/^[a-z]+\/[\d.]+V\/-?\d+C$/);
    expect(json.resolution).toBe(0.001);
  });

  it('exits 1 when the design clock is above fmax', () => {
    expect(cli('fmax', design('doubler'), '--set', 'clock.frequency=60MHz').code).toBe(1);
  });

  it('rejects a bad resolution with exit 2 naming the flag', () => {
    const r = cli('fmax', design('doubler'), '--resolution', '2');
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('--resolution');
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

describe('findFmax: circuit requirements', () => {
  it('findFmax on doubler-pump without its settle constraint is set by the efficiency requirement: check passes at fmax and fails efficiency-min at 1.05 fmax', () => {
    const settleless = ['constraints.settle=[]'];
    const { design: d, card } = loadDesign(design('doubler-pump'), settleless);
    const result = findFmax(resolveDesign(d, card), { resolution: 0.01 });
    // measured: 23.53 MHz at 1 % resolution; the clock generator's and level shifters' energy per period times f grows with f while the load's power does not
    expectClose(result.fmax!, 23.53e6, 0.005);
    expect(result.limiting).toMatchObject({ kind: 'efficiency-min', check: 'efficiency >= 40.0 %', corner: 'sf/1.98V/125C' });
    expect(result.note).toBe("the circuit's output requirement efficiency >= 40.0 % sets fmax (the design has no settle constraint)");
    const at = (f: number) =>
      JSON.parse(cli('check', design('doubler-pump'), '--json', '--set', settleless[0]!, '--set', `clock.frequency=${f}`).stdout);
    const pass = at(result.fmax!);
    expect(pass.verdict).toBe('pass');
    const fail = at(1.05 * result.fmax!);
    expect(fail.verdict).toBe('fail');
    const failing = fail.corners.flatMap((c: { checks: { kind: string; pass: boolean }[] }) =>
      c.checks.filter((k) => !k.pass).map((k) => k.kind),
    );
    expect(new Set(failing)).toEqual(new Set(['efficiency-min']));
  });
});
