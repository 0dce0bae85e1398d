import { describe, it, expect } from 'vitest';
import { cli, design } from '../helpers.js';

interface Report {
  verdict: string;
  corners: Array<{ name: string; deadTimes: Array<{ t50: number }> }>;
}

describe('the free-form netlist demo on the high-threshold card', () => {
  const run = cli('check', design('lp-netlist'), '--json');
  const report = JSON.parse(run.stdout) as Report;
  const dead = (name: string) => report.corners.find((c) => c.name === name)!.deadTimes[0]!.t50;

  it('passes every corner', () => {
    expect(run.code).toBe(0);
    expect(report.verdict).toBe('pass');
    expect(report.corners).toHaveLength(45);
  });

  it('shows temperature inversion at its lowest supply and not at its highest', () => {
    expect(dead('ss/0.9V/-40C')).toBeGreaterThan(dead('ss/0.9V/27C'));
    expect(dead('ss/0.9V/27C')).toBeGreaterThan(dead('ss/0.9V/125C'));
    // At 1.1 V the gate overdrive is larger; the threshold's fall still wins on this card but by less.
    const lowRatio = dead('ss/0.9V/-40C') / dead('ss/0.9V/125C');
    const highRatio = dead('ss/1.1V/-40C') / dead('ss/1.1V/125C');
    expect(lowRatio).toBeGreaterThan(highRatio);
  });
});

describe('every shipped demo design', () => {
  // What each invented scenario is for: the passing designs pass at all 45 corners, the failing
  // ones fail for the reason they were written to show (the limiting check, measured).
  it.each([
    ['doubler', 0, null],
    ['doubler-pump', 0, null],
    ['lp-netlist', 0, null],
    ['sc-integrator', 0, null],
    ['too-tight', 1, 'break-before-make'],
    ['doubler-unboosted', 1, 'stress'],
    ['doubler-unboosted-pump', 1, 'output-min'], // the output collapses: s_out has no overdrive
    ['doubler-diode-pump', 1, 'output-min'],
    ['dickson-pump', 0, null],
    ['negative-pump', 0, null],
    ['sc-integrator-path', 0, null],
  ] as const)(
    '%s exits %i',
    (name, code, kind) => {
      const run = cli('check', design(name), '--json');
      expect(run.code).toBe(code);
      const report = JSON.parse(run.stdout) as { verdict: string; limiting?: { kind: string } | null };
      expect(report.verdict).toBe(code === 0 ? 'pass' : 'fail');
      if (kind !== null) expect(report.limiting?.kind).toBe(kind);
    },
    600_000,
  ); // dickson-pump solves four diodes at 45 corners: about 25 s of CPU, minutes on a loaded machine
});
