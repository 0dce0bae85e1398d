import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { cliAsync, design, expectClose, tempDir, withoutRunRecord } from '../helpers.js';

describe('phasegap mc', () => {
  // The demo's least dead time is 983.1 ps (ff/1.98V/-40C); a minimum a few ps below it, 979.5 ps, lets
  // mismatch push some dies under it: 30 of 40 dies pass (seed 1, measured).
  const tight = ['--samples', '40', '--seed', '1', '--workers', '1', '--set', 'requirements.deadTime.min=979.5ps'];

  it('exits 1 when the yield misses requirements.minYield and 0 when it meets it', async () => {
    const missed = await cliAsync('mc', design('doubler'), ...tight, '--set', 'requirements.minYield=0.99');
    expect(missed.code).toBe(1);
    expect(missed.stdout).toMatch(/^yield at every corner: 75\.0 % .*, required 99\.0 %$/m);
    expect(missed.stdout).toMatch(/^verdict: FAIL$/m);
    const met = await cliAsync('mc', design('doubler'), ...tight, '--set', 'requirements.minYield=0.6');
    expect(met.code).toBe(0);
    expect(met.stdout).toMatch(/^verdict: PASS$/m);
  });
});

describe('phasegap mc verdict and JUnit', () => {
  // As above: 979.5 ps, a few ps below the demo's least dead time of 983.1 ps, so 30 of 40 dies pass.
  const tight = ['--samples', '40', '--seed', '1', '--workers', '1', '--set', 'requirements.deadTime.min=979.5ps'];

  it('heads the text with the combined verdict, fails without a minYield when a die fails, and writes JUnit that says why', async () => {
    const file = join(tempDir(), 'mc.xml');
    const run = await cliAsync('mc', design('doubler'), ...tight, '--junit', file);
    expect(run.code).toBe(1);
    expect(run.stdout.split('\n').slice(0, 3)).toEqual([
      'verdict: FAIL (fails: Monte Carlo yield)',
      '  Monte Carlo yield: FAIL: yield 75.0 % over 40 dies at every corner; no requirements.minYield, so every die must pass (10 fail)',
      '  not run here: corner checks, simulator agreement',
    ]);
    const xml = readFileSync(file, 'utf8');
    expect(xml).toContain('<testcase classname="phasegap.mc.yield" name="yield at every corner">');
    expect(xml).toContain('<failure message="yield 75.0 % over 40 dies; every die must pass (no requirements.minYield)"/>');
    // 8 of the 40 dies break dead p1->p2 >= 979.5 ps at ff/1.98V/-40C (measured, seed 1; 3 break p2->p1 there,
    // one of them also p1->p2: 10 fail in all).
    expect(xml).toMatch(
      /<testcase classname="phasegap.mc.dead-time-min" name="dead p1->p2 >= 979.5 ps">\s*<failure message="8 of 40 dies fail it at ff\/1\.98V\/-40C"\/>/,
    );
    expect(xml).toMatch(/<testcase classname="phasegap.mc.dead-time-max" name="dead p1->p2 &lt;= 4.00 ns">\s*<system-out>/);
  });
});

describe('phasegap mc seeds, threads, timings and replay', () => {
  it('writes byte-identical JSON for the same seed, on one thread and on two', async () => {
    const one = await cliAsync('mc', design('doubler'), '--samples', '200', '--seed', '3', '--workers', '1', '--json');
    const two = await cliAsync('mc', design('doubler'), '--samples', '200', '--seed', '3', '--workers', '2', '--json');
    const again = await cliAsync('mc', design('doubler'), '--samples', '200', '--seed', '3', '--workers', '2', '--json');
    expect(one.code).toBe(0);
    // Identical but for the run record (its date, and the command line naming --workers).
    expect(withoutRunRecord(two.stdout)).toBe(withoutRunRecord(one.stdout));
    expect(withoutRunRecord(again.stdout)).toBe(withoutRunRecord(one.stdout));
    const other = await cliAsync('mc', design('doubler'), '--samples', '200', '--seed', '4', '--workers', '1', '--json');
    expect(withoutRunRecord(other.stdout)).not.toBe(withoutRunRecord(one.stdout));
    // Four runs of 9000 evaluations each: 27-31 s on this 2-core machine beside other work (measured).
    // The system project's 120 s limit is a hang guard; npm run bench measures speed.
  });

  it('prints its setup, evaluation and report times on stderr with --timings, and leaves the report alone', async () => {
    const plain = await cliAsync('mc', design('doubler'), '--samples', '100', '--seed', '3', '--workers', '1', '--json');
    const timed = await cliAsync('mc', design('doubler'), '--samples', '100', '--seed', '3', '--workers', '1', '--json', '--timings');
    expect(withoutRunRecord(timed.stdout)).toBe(withoutRunRecord(plain.stdout));
    expect(plain.stderr).toBe('');
    const m =
      /^phasegap: timings: setup ([\d.]+) s, evaluation ([\d.]+) s \((\d+) evaluations on 1 thread, (\d+)\/s\), report ([\d.]+) s\n$/.exec(
        timed.stderr,
      );
    expect(m).not.toBeNull();
    // 100 dies at each of the demo's 45 corners.
    expect(Number(m![3])).toBe(100 * 45);
    // The rate is computed from the unrounded time; the printed time is rounded to 1 ms.
    expectClose(Number(m![4]), (100 * 45) / Number(m![2]), 0.05);
  });

  it('replays the worst die: its least margin at that corner equals the one Monte Carlo found', async () => {
    const mc = JSON.parse((await cliAsync('mc', design('doubler'), '--samples', '300', '--seed', '9', '--json')).stdout);
    const corner = mc.corners.find((c: { name: string }) => c.name === mc.worstCorner);
    const replay = JSON.parse(
      (await cliAsync('mc', design('doubler'), '--seed', '9', '--replay', String(corner.worstSample.index), '--json')).stdout,
    );
    const same = replay.corners.find((c: { name: string }) => c.name === mc.worstCorner);
    const least = Math.min(...same.checks.map((k: { margin: number }) => k.margin));
    expectClose(least, corner.worstSample.leastMargin, 1e-15, 'abs');
  });

  it('fails the yield requirement when a die fails, and rejects a bad sample count with exit 2', async () => {
    const tight = await cliAsync('mc', design('too-tight'), '--samples', '50', '--workers', '1', '--json');
    expect(tight.code).toBe(1);
    expect(JSON.parse(tight.stdout).yield.value).toBeLessThan(1);
    const bad = await cliAsync('mc', design('doubler'), '--samples', '0');
    expect(bad.code).toBe(2);
    expect(bad.stderr).toContain('--samples');
  });
});

describe('phasegap mc on a design with a circuit', () => {
  const oneCorner = ['--set', 'corners.process=[tt]', '--set', 'corners.vdd=[1.8V]', '--set', 'corners.temperature=[27]'];
  const args = ['mc', design('doubler-pump'), '--samples', '12', '--workers', '1', ...oneCorner];

  it('checks the circuit requirements on every die and picks the worst die by timing margin, not by a passing charge or efficiency margin', async () => {
    const full = JSON.parse((await cliAsync(...args, '--json')).stdout);
    const timingOnly = JSON.parse((await cliAsync(...args, '--json', '--skip-circuit')).stdout);
    const names = full.corners[0].quantities.map((q: { kind: string }) => q.kind);
    expect(names).toEqual(expect.arrayContaining(['output-min', 'ripple-max', 'efficiency-min', 'lost-charge-max']));
    expect(full.run.parts.map((p: { key: string }) => p.key)).not.toContain('circuit');
    expect(timingOnly.run.parts.map((p: { key: string }) => p.key)).toContain('circuit');
    expect(full.corners[0].worstSample.index).toBe(timingOnly.corners[0].worstSample.index);
  });

  it('says in the verdict that --skip-circuit left the circuit requirements out of the yield', async () => {
    const run = await cliAsync(...args, '--skip-circuit');
    expect(run.code).toBe(0);
    expect(run.stdout).toContain('not run here: corner checks, simulator agreement, circuit requirements on the dies');
  });
});
