import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { cli, design, processCard, ROOT, tempDir } from '../helpers.js';
import { shellQuote } from '../../src/report/shell-quote.js';
import { requireTool } from '../tools.js';

const MAIN = join(ROOT, 'dist', 'src', 'cli', 'main.js');

/** Runs the built CLI on a pseudo-terminal (util-linux `script`, Debian package bsdutils): everything it printed. */
function onTerminal(...args: string[]): { code: number | null; text: string } {
  const env = { ...process.env };
  delete env.CI;
  const command = [process.execPath, MAIN, ...args].map(shellQuote).join(' ');
  const run = spawnSync('script', ['-qec', command, '/dev/null'], { cwd: tempDir(), encoding: 'utf8', env });
  return { code: run.status, text: run.stdout };
}

describe('runDecksWithProgress through confirm and characterize', () => {
  requireTool('ngspice', 'ngspice');
  const corners = 'tt/1.8V/27C,ss/1.62V/125C';

  it('confirm draws a bar that counts the corners on a terminal, one batch of --jobs at a time', () => {
    const run = onTerminal('confirm', design('doubler'), '--corners', corners, '--jobs', '1');
    expect(run.code).toBe(0);
    expect(run.text).toMatch(/confirm .* 50% \| 1\/2 \|/);
    expect(run.text).toMatch(/confirm .* 100% \| 2\/2 \|/);
    expect(run.text).toContain('verdict: AGREE');
  });

  it('confirm stays quiet with --json on a terminal, and off a terminal', () => {
    const json = onTerminal('confirm', design('doubler'), '--corners', corners, '--jobs', '1', '--json');
    expect(json.code).toBe(0);
    expect(json.text).not.toMatch(/\d\/2 \|/);
    expect(JSON.parse(json.text.replace(/\r/g, '')).verdict).toBe('agree');
    const piped = cli('confirm', design('doubler'), '--corners', corners, '--jobs', '2');
    expect(piped.code).toBe(0);
    expect(piped.stderr).toBe('');
  });

  it('characterize counts the corners it has characterized on a terminal', () => {
    const out = join(tempDir(), 't.json');
    const run = onTerminal(
      'characterize',
      processCard('generic180'),
      '--corners',
      corners,
      '--cells',
      'INV',
      '--grid',
      'coarse',
      '--jobs',
      '2',
      '-o',
      out,
    );
    expect(run.code).toBe(0);
    expect(run.text).toMatch(/characterize .* 50% \| 1\/2 \|/);
    expect(run.text).toContain('characterized 2 corners with ngspice');
  });
});
