import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { cli, design, tempDir } from '../helpers.js';

describe('phasegap spice -o FILE', () => {
  it('prints a run command that /bin/sh runs as it stands, for a deck in a folder with spaces and quotes (ngspice)', () => {
    const dir = join(tempDir(), `it's "odd" $HOME`);
    mkdirSync(dir);
    const out = join(dir, 'my deck.cir');
    const run = cli('spice', design('doubler'), '--corner', 'tt/1.8V/27C', '-o', out);
    expect(run.code).toBe(0);
    const command = /run: (.*)\n$/.exec(run.stderr)![1]!;
    expect(command).toBe(`ngspice -b '${out.replace(/'/g, `'\\''`)}'`);
    const sim = spawnSync('/bin/sh', ['-c', command], { encoding: 'utf8', cwd: dir });
    expect(sim.status).toBe(0);
    expect(`${sim.stdout}${sim.stderr}`).toMatch(/^dead_1\s*=\s*\d/m);
  });
});
