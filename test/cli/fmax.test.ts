import { describe, expect, it } from 'vitest';
import { findFmax } from '../../src/analysis/fmax.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { loadDesign } from '../../src/cli/load.js';
import { fmaxMarginLines } from '../../src/report/fmax-text.js';
import { formatMargin } from '../../src/report/margin-format.js';
import { cli, design } from '../helpers.js';

const fmaxOf = (name: string) => {
  const { design: d, card } = loadDesign(design(name));
  return findFmax(resolveDesign(d, card));
};

describe('findFmax margins', () => {
  const r = fmaxOf('doubler');

  it('keeps the least margin at fmax (passing) apart from the limiting margin at the failing probe just above', () => {
    expect(r.atFmax!.margin!).toBeGreaterThanOrEqual(0);
    expect(r.limiting!.margin!).toBeLessThan(0);
    expect(r.probeFrequency!).toBeGreaterThan(r.fmax!);
    expect((r.probeFrequency! - r.fmax!) / r.fmax!).toBeLessThanOrEqual(r.resolution);
  });

  it('gives the margins check finds at those two frequencies', () => {
    type Report = { corners: Array<{ name: string; checks: Array<{ name: string; margin: number | null }> }> };
    const at = (f: number) => JSON.parse(cli('check', design('doubler'), '--json', '--set', `clock.frequency=${f}Hz`).stdout) as Report;
    const marginOf = (rep: Report, corner: string, check: string) =>
      rep.corners.find((c) => c.name === corner)!.checks.find((c) => c.name === check)!.margin;
    expect(marginOf(at(r.fmax!), r.atFmax!.corner, r.atFmax!.check)).toBeCloseTo(r.atFmax!.margin!, 15);
    expect(marginOf(at(r.probeFrequency!), r.limiting!.corner, r.limiting!.check)).toBeCloseTo(r.limiting!.margin!, 15);
  });
});

describe('phasegap fmax text', () => {
  it('labels each margin with the frequency it belongs to, the negative one as the probe above fmax', () => {
    const run = cli('fmax', design('doubler'));
    expect(run.code).toBe(0);
    const r = fmaxOf('doubler');
    const lines = fmaxMarginLines(r);
    // fmax of the demo is about 25 MHz, limited by settling through the switches' on-resistance (measured).
    expect(lines[0]).toMatch(/^ {2}margin at fmax 25\.\d\d MHz: \+/);
    expect(lines[1]).toMatch(/^ {2}margin at 25\.\d\d MHz \(the first failing probe, 0\.\d\d % above fmax\): -/);
    expect(lines[1]).toContain(formatMargin(r.limiting!.margin!, r.limiting!.kind));
    for (const line of lines) expect(run.stdout).toContain(line);
    expect(run.stdout).not.toMatch(/limited by: .*margin/);
  });

  it('gives the margin at the design clock when no frequency passes', () => {
    const run = cli('fmax', design('too-tight'));
    expect(run.code).toBe(1);
    expect(run.stdout).toMatch(/ {2}margin at 20\.00 MHz \(the design clock\): -\d/);
  });
});
