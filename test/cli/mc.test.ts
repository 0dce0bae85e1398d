import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { cliAsync, design, tempDir } from '../helpers.js';

describe('phasegap mc', () => {
  // The demo's least dead time is 966 ps (ff/1.98V/-40C); with a 964 ps minimum 31 of 40 dies pass (seed 1, measured).
  const tight = ['--samples', '40', '--seed', '1', '--workers', '1', '--set', 'requirements.deadTime.min=964ps'];

  it('exits 1 when the yield misses requirements.minYield and 0 when it meets it', async () => {
    const missed = await cliAsync('mc', design('doubler'), ...tight, '--set', 'requirements.minYield=0.99');
    expect(missed.code).toBe(1);
    expect(missed.stdout).toMatch(/^yield at every corner: 77\.5 % .*, required 99\.0 %$/m);
    expect(missed.stdout).toMatch(/^verdict: FAIL$/m);
    const met = await cliAsync('mc', design('doubler'), ...tight, '--set', 'requirements.minYield=0.6');
    expect(met.code).toBe(0);
    expect(met.stdout).toMatch(/^verdict: PASS$/m);
  });
});

describe('phasegap mc verdict and JUnit', () => {
  const tight = ['--samples', '40', '--seed', '1', '--workers', '1', '--set', 'requirements.deadTime.min=964ps'];

  it('heads the text with the combined verdict, fails without a minYield when a die fails, and writes JUnit that says why', async () => {
    const file = join(tempDir(), 'mc.xml');
    const run = await cliAsync('mc', design('doubler'), ...tight, '--junit', file);
    expect(run.code).toBe(1);
    expect(run.stdout.split('\n').slice(0, 3)).toEqual([
      'verdict: FAIL (fails: Monte Carlo yield)',
      '  Monte Carlo yield: FAIL: yield 77.5 % over 40 dies at every corner; no requirements.minYield, so every die must pass (9 fail)',
      '  not run here: corner checks, simulator agreement',
    ]);
    const xml = readFileSync(file, 'utf8');
    expect(xml).toContain('<testcase classname="phasegap.mc.yield" name="yield at every corner">');
    expect(xml).toContain('<failure message="yield 77.5 % over 40 dies; every die must pass (no requirements.minYield)"/>');
    // 5 of the 40 dies break dead p1->p2 >= 964 ps at ff/1.98V/-40C (measured, seed 1).
    expect(xml).toMatch(
      /<testcase classname="phasegap.mc.dead-time-min" name="dead p1->p2 >= 964 ps">\s*<failure message="8 of 40 dies fail it at ff\/1\.98V\/-40C"\/>/,
    );
    expect(xml).toMatch(/<testcase classname="phasegap.mc.dead-time-max" name="dead p1->p2 &lt;= 4.00 ns">\s*<system-out>/);
  });
});
