import { describe, expect, it } from 'vitest';
import { cliAsync, design } from '../helpers.js';

describe('phasegap mc', () => {
  // The demo's least dead time is 966 ps (ff/1.98V/-40C); with a 964 ps minimum 31 of 40 dies pass (seed 1, measured).
  const tight = ['--samples', '40', '--seed', '1', '--workers', '1', '--set', 'requirements.deadTime.min=964ps'];

  it('exits 1 when the yield misses requirements.minYield and 0 when it meets it', async () => {
    const missed = await cliAsync('mc', design('doubler'), ...tight, '--set', 'requirements.minYield=0.99');
    expect(missed.code).toBe(1);
    expect(missed.stdout).toMatch(/^yield at every corner: 77\.500 % .*, required 99\.000 %$/m);
    expect(missed.stdout).toMatch(/^verdict: FAIL$/m);
    const met = await cliAsync('mc', design('doubler'), ...tight, '--set', 'requirements.minYield=0.6');
    expect(met.code).toBe(0);
    expect(met.stdout).toMatch(/^verdict: PASS$/m);
  });
});
