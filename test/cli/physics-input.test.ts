/**
 * Physically impossible or overflowing input through the CLI: exit 2 with the field path, the
 * value and the allowed range, before any command writes anything; never Infinity in an output.
 */
import { describe, it, expect } from 'vitest';
import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { cli, cliAsync, design, tempDir, TYPICAL_ONLY } from '../helpers.js';

interface Case {
  readonly what: string;
  readonly set: readonly string[];
  readonly says: readonly string[];
}

const CASES: readonly Case[] = [
  {
    what: 'a quantity string beyond the double range',
    set: ['clock.frequency="1e400"'],
    says: ['clock.frequency: ', '"1e400"', 'is not a finite number'],
  },
  {
    what: 'a plain number beyond the double range',
    set: ['clock.frequency=1e400'],
    says: ['clock.frequency: ', 'Infinity', 'is not a finite number'],
  },
  {
    what: 'a clock transition longer than the shortest half period',
    set: ['clock.transition=30ns'],
    // the demo runs at 20 MHz with duty 0.5 +/- 0.02: the shortest half period is 0.48 * 50 ns
    says: ['clock.transition: ', '30.00 ns', 'shorter than', '24.00 ns', 'duty 0.480'],
  },
  {
    what: "a switch shorter than the card's minimum length",
    set: ['switches[2].l=1e-300'],
    says: ['switches[2].l: ', '1e-300 m', 'minimum length lmin = 180 nm', 'generic180'],
  },
  {
    what: "a temperature below the device models' range",
    set: ['corners.temperature=[-273, 27]'],
    says: ['corners.temperature[0]: ', '-273', 'from -60 to 200'],
  },
  {
    what: "a temperature above the device models' range",
    set: ['corners.temperature=["250C"]'],
    says: ['corners.temperature[0]: ', '"250C"', 'from -60 to 200'],
  },
  {
    what: 'a clock below 1 Hz',
    set: ['clock.frequency=0.5Hz'],
    says: ['clock.frequency: ', '"0.5Hz"', 'at least 1 Hz and at most 100 GHz'],
  },
  { what: 'a clock above 100 GHz', set: ['clock.frequency=200GHz'], says: ['clock.frequency: ', '"200GHz"', 'at most 100 GHz'] },
  { what: 'a load capacitance that would overflow delays', set: ['loads.p1=1e300'], says: ['loads.p1: ', '1e+300', 'at most 0.001 F'] },
  { what: 'a switch width beyond a metre', set: ['switches[0].w=5'], says: ['switches[0].w: ', '5', 'at most 1 m'] },
  {
    what: 'a supply level multiple beyond the double range',
    set: [`switches[0].signal=${'9'.repeat(400)}vdd`],
    says: ['switches[0].signal: ', 'is not a voltage level'],
  },
];

const COMMANDS: ReadonlyArray<readonly [string, ...string[]]> = [
  ['check', '--json'],
  ['spice', '--corner', 'tt/1.8V/27C'],
  ['verilog', '--corner', 'tt/1.8V/27C'],
  ['draw', '--corner', 'worst'],
];

describe('physically impossible input', () => {
  it.each(CASES)('rejects $what with exit 2 and a clear message', ({ set, says }) => {
    const run = cli('check', design('doubler'), ...set.flatMap((s) => ['--set', s]), '--json');
    expect(run.code).toBe(2);
    expect(run.stdout).toBe('');
    expect(run.stderr).toMatch(/^phasegap: error: /);
    for (const text of says) expect(run.stderr).toContain(text);
    expect(run.stderr).not.toMatch(/^\s+at /m);
  });

  it.each(COMMANDS)(
    '%s refuses a clock transition longer than the half period with exit 2 and writes nothing',
    async (command, ...flags) => {
      const dir = tempDir();
      const out = join(dir, 'out.txt');
      const run = await cliAsync(command, design('doubler'), '--set', 'clock.transition=30ns', ...flags, '-o', out);
      expect(run.code).toBe(2);
      expect(run.stderr).toContain('clock.transition: 30.00 ns must be shorter than');
      expect(readdirSync(dir)).toEqual([]);
      expect(existsSync(out)).toBe(false);
    },
  );

  it('accepts the edges of the allowed ranges: -60 C, 200 C, 1 Hz with its 1 s half period', () => {
    const run = cli(
      'check',
      design('doubler'),
      '--set',
      'corners.temperature=[-60, 200]',
      '--set',
      'corners.process=[tt]',
      '--set',
      'corners.vdd=[1.8V]',
      '--json',
    );
    expect(run.stderr).toBe('');
    expect([0, 1]).toContain(run.code);
    const slow = cli('check', design('doubler'), '--set', 'clock.frequency=1Hz', ...TYPICAL_ONLY, '--json');
    expect(slow.stderr).toBe('');
    expect([0, 1]).toContain(slow.code);
    expect(slow.stdout).not.toMatch(/Infinity|NaN/);
  });

  it('writes finite Verilog delays for the demo corner', () => {
    const run = cli('verilog', design('doubler'), '--corner', 'ss/1.62V/125C');
    expect(run.code).toBe(0);
    const delays = [...run.stdout.matchAll(/^\s+(?:not|nand|nor) #\(([^,]+), ([^)]+)\)/gm)].flatMap((m) => [Number(m[1]), Number(m[2])]);
    expect(delays.length).toBeGreaterThan(0);
    for (const d of delays) expect(Number.isFinite(d) && d > 0).toBe(true);
  });
});
