import { describe, expect, it } from 'vitest';
import { spawn, spawnSync } from 'node:child_process';
import { closeSync, openSync } from 'node:fs';
import { join } from 'node:path';
import { design, ROOT } from '../helpers.js';

const MAIN = join(ROOT, 'dist/src/cli/main.js');

describe('phasegap main', () => {
  it('ends with one line and exit 2 when stdout cannot be written (/dev/full: ENOSPC on Linux)', () => {
    const full = openSync('/dev/full', 'w');
    try {
      const r = spawnSync(process.execPath, [MAIN, 'check', design('doubler')], { stdio: ['ignore', full, 'pipe'], encoding: 'utf8' });
      expect(r.status).toBe(2);
      expect(r.stderr).toBe('phasegap: cannot write to standard output (ENOSPC)\n');
    } finally {
      closeSync(full);
    }
  });

  it('ends quietly when the reader closes the pipe early, as head does', async () => {
    const child = spawn(process.execPath, [MAIN, 'check', design('doubler'), '--json'], { stdio: ['ignore', 'pipe', 'pipe'] });
    let stderr = '';
    child.stderr.on('data', (d) => {
      stderr += String(d);
    });
    child.stdout.once('data', () => child.stdout.destroy());
    const code = await new Promise<number | null>((resolve) => child.on('exit', resolve));
    expect(stderr).toBe('');
    expect(code).toBe(0);
  });
});
