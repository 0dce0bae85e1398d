import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { cli, design, fixture, tempDir } from '../helpers.js';

// The demo and a shorter chain of the kind tune proposes for it (2 stages of size 2 with 157 fF per node;
// tune's own proposals are 2 stages of size 1 with 64-80.5 fF, about the same least dead time: 554 ps here, 572-574 ps there),
// which trades dead time for speed.
const proposal = ['--set', 'generator.stages=2', '--set', 'generator.stageSize=2', '--set', 'generator.stageLoad=157fF'];

function reports(): { dir: string; old: string; new: string } {
  const dir = tempDir();
  const old = join(dir, 'old.json');
  const now = join(dir, 'new.json');
  expect(cli('check', design('doubler'), '--json', '-o', old).code).toBe(0);
  expect(cli('check', design('doubler'), ...proposal, '--json', '-o', now).code).toBe(0);
  return { dir, old, new: now };
}

describe('phasegap diff', () => {
  it('shows the margin changes between the demo and its tune proposal and exits 1 on the lost margins', () => {
    const r = reports();
    const run = cli('diff', r.old, r.new);
    expect(run.code).toBe(1);
    const lines = run.stdout.split('\n');
    expect(lines[0]).toMatch(/^verdict: FAIL \(\d+ margin losses beyond 1\.00 ps, 1\.00 mV\)$/);
    // The demo's dead p2->p1 margin is +487 ps (check), the proposal's +58.1 ps (measured); the largest loss is at
    // ss/1.62V/125C.
    expect(run.stdout).toMatch(/^dead p2->p1 >= 500 ps +\+487 ps +\+58\.1 ps +-1\.44 ns at ss\/1\.62V\/125C$/m);
    expect(run.stdout).toMatch(/^dead times moved beyond 1\.00 ps \(90\):$/m);
    expect(run.stdout).not.toContain('new failures');
    // Within a loose tolerance nothing is lost.
    expect(cli('diff', r.old, r.new, '--tolerance', '2ns').code).toBe(0);
    expect(cli('diff', r.old, r.old).stdout.split('\n')[0]).toBe('verdict: PASS (no new failure, no margin lost beyond the tolerance)');
  });

  it('--json gives every check at every corner and the lists', () => {
    const r = reports();
    const run = cli('diff', r.old, r.new, '--json', '--tolerance', '5ps');
    expect(run.code).toBe(1);
    const d = JSON.parse(run.stdout);
    expect(d.tolerance).toEqual({ time: 5e-12, voltage: 1e-3 });
    expect(d.changes).toHaveLength(45 * 22);
    expect(d.newFailures).toEqual([]);
    const loss = d.marginLosses[0];
    expect(loss).toMatchObject({ corner: 'ss/1.62V/125C', oldPass: true, newPass: true });
    expect(loss.delta).toBeCloseTo(loss.new - loss.old, 20);
  });

  it('exits 1 with the new failures listed when the new report fails', () => {
    const r = reports();
    const failing = join(r.dir, 'failing.json');
    // A dead-time minimum above the demo's least dead time (983.1 ps, p1->p2 at ff/1.98V/-40C) fails there:
    // 1.05 ns, about 67 ps above it, so both directions at that corner become new failures.
    cli('check', design('doubler'), '--set', 'requirements.deadTime.min=1.05ns', '--json', '-o', failing);
    const run = cli('diff', r.old, failing);
    expect(run.code).toBe(1);
    expect(run.stdout).toMatch(/^new failures \(\d+\):$/m);
  });

  it('refuses a file that is not a check report with exit 2, without quoting it', () => {
    const dir = tempDir();
    const secret = join(dir, 'other.json');
    writeFileSync(secret, JSON.stringify({ password: 'hunter2', user: 'x' }));
    const run = cli('diff', secret, secret);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/^phasegap: error: .*other\.json.* is not a phasegap check report \(the output of check --json\)/);
    expect(run.stderr).not.toContain('hunter2');
    const tables = cli('diff', fixture('tables', 'generic180.json'), secret);
    expect(tables.code).toBe(2);
    const r = reports();
    const broken = join(dir, 'broken.json');
    const data = JSON.parse(readFileSync(r.old, 'utf8'));
    data.corners[2].checks[0].margin = 'wide';
    writeFileSync(broken, JSON.stringify(data));
    const shape = cli('diff', r.old, broken);
    expect(shape.code).toBe(2);
    expect(shape.stderr).toMatch(/broken\.json: corners\[2\]\.checks\[0\]\.margin/);
    expect(shape.stderr).toContain('not a phasegap check report; write one with phasegap check DESIGN --json -o FILE');
    expect(cli('diff', r.old, r.new, '--tolerance', 'soon').code).toBe(2);
    expect(readdirSync(dir).sort()).toEqual(['broken.json', 'other.json']);
  });
});
