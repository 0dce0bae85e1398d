import { describe, it, expect } from 'vitest';
import { spawn } from 'node:child_process';
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { design, ROOT, tempDir } from '../helpers.js';

/** Runs the compiled CLI and interrupts it once its temporary output holds a few rows. */
function interruptedSweep(out: string, workers: string): Promise<{ code: number | null; stderr: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [
      join(ROOT, 'dist/src/cli/main.js'),
      'sweep',
      design('doubler'),
      '--vary',
      'temperature=-40:125:400',
      '--vary',
      'vdd=1.6:2.0:50',
      '--workers',
      workers,
      '-o',
      out,
    ]);
    let stderr = '';
    child.stderr.on('data', (d) => {
      stderr += String(d);
    });
    const dir = join(out, '..');
    const poll = setInterval(() => {
      const temp = readdirSync(dir).find((f) => f.endsWith('.tmp'));
      if (temp && statSync(join(dir, temp)).size > 4096) {
        clearInterval(poll);
        child.kill('SIGINT');
      }
    }, 20);
    child.on('error', reject);
    child.on('exit', (code) => {
      clearInterval(poll);
      resolve({ code, stderr });
    });
  });
}

describe('sweep interrupted with Ctrl-C', () => {
  // One thread runs the points on the main thread, which must still let the signal in between points.
  it.each(['2', '1'])(
    'exits 130 on %s thread(s) and keeps the complete rows written so far, each with every column',
    async (workers) => {
      const dir = tempDir();
      const out = join(dir, 'grid.csv');
      const { code, stderr } = await interruptedSweep(out, workers);
      expect(code).toBe(130);
      expect(stderr).toMatch(/interrupted after \d+ of 20000 points; the rows written are complete/);
      expect(existsSync(out)).toBe(true);
      expect(readdirSync(dir).filter((f) => f.endsWith('.tmp'))).toEqual([]);
      const text = readFileSync(out, 'utf8');
      expect(text.endsWith('\n')).toBe(true);
      const lines = text.trimEnd().split('\n');
      const columns = lines[0]!.split(',').length;
      expect(lines.length).toBeGreaterThan(2);
      expect(lines.length).toBeLessThan(20001);
      for (const line of lines) expect(line.split(',').length).toBe(columns);
      const written = Number(/after (\d+) of/.exec(stderr)![1]);
      expect(lines.length - 1).toBe(written);
    },
    60_000,
  );
});
