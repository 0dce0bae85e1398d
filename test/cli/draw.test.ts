import { describe, expect, it } from 'vitest';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { cli, design, tempDir, cliAsync, ROOT } from '../helpers.js';
import { all, parseSvg } from '../render/svg-dom.js';

describe('phasegap draw', () => {
  it('writes the worst corner by default, named in the title block', async () => {
    const dir = tempDir();
    const file = join(dir, 'd.svg');
    const check = JSON.parse(cli('check', design('doubler'), '--json').stdout) as { limiting: { corner: string } };
    const run = await cliAsync('draw', design('doubler'), '-o', file);
    expect(run.code).toBe(0);
    const svg = parseSvg(readFileSync(file, 'utf8'));
    expect(all(svg, '.title-block text.subtitle')[0]!.getAttribute('data-corner')).toBe(check.limiting.corner);
  });

  it('draws a named corner, applies --set, and exits 1 when that corner fails', async () => {
    const run = await cliAsync(
      'draw',
      design('doubler'),
      '--corner',
      'ff/1.98V/-40C',
      '--set',
      'requirements.deadTime.min=1100ps',
      '-o',
      '-',
    );
    expect(run.code).toBe(1);
    const svg = parseSvg(run.stdout);
    expect(all(svg, 'text.verdict')[0]!.textContent).toBe('\u2715 FAIL');
    expect(all(svg, 'text.dead-time-label').some((t) => t.textContent!.includes('FAIL'))).toBe(true);
  });

  it('overlays all corners with --corner all', async () => {
    const run = await cliAsync('draw', design('sc-integrator'), '--corner', 'all', '-o', '-');
    expect([0, 1]).toContain(run.code);
    const svg = parseSvg(run.stdout);
    expect(all(svg, 'polygon.edge-band').length).toBeGreaterThan(0);
    expect(all(svg, '.title-block text.subtitle')[0]!.getAttribute('data-corner')).toBe('all 45 corners');
  });

  it('draws the margin chart with --chart margins', async () => {
    const run = await cliAsync('draw', design('too-tight'), '--chart', 'margins', '-o', '-');
    expect(run.code).toBe(1);
    const svg = parseSvg(run.stdout);
    expect(all(svg, 'g.margin-row').length).toBeGreaterThan(0);
    expect(run.stdout).not.toMatch(/NaN|undefined/);
  });

  it.each([
    [['--corner', 'tt/9V/27C'], '--corner: "tt/9V/27C" is not a corner of this design; allowed: worst, all, or one of tt/1.62V/-40C'],
    [['--chart', 'pie'], '--chart: "pie" is not a chart; allowed: timing, margins'],
    [['--nets', 'most'], '--nets: "most" is not a net selection; allowed: phases, all'],
    [['--set', 'clock.frequency=fast'], 'clock.frequency'],
  ])('refuses %j with exit 2 and writes nothing', async (args, message) => {
    const dir = tempDir();
    const file = join(dir, 'd.svg');
    const run = await cliAsync('draw', design('doubler'), ...args, '-o', file);
    expect(run.code).toBe(2);
    expect(run.stderr).toContain(message);
    expect(existsSync(file)).toBe(false);
  });

  it('refuses a missing -o with exit 2', async () => {
    const run = await cliAsync('draw', design('doubler'));
    expect(run.code).toBe(2);
    expect(run.stderr).toBe('phasegap: error: --out: is required: name the SVG file to write, or - for stdout\n');
  });

  it('stays bounded when the clock transition is far longer than the period (1 s at 20 MHz), within a 512 MB heap', () => {
    const dir = tempDir();
    const file = join(dir, 'slow.svg');
    const r = spawnSync(
      process.execPath,
      [
        '--max-old-space-size=512',
        join(ROOT, 'dist/src/cli/main.js'),
        'draw',
        design('doubler'),
        '--set',
        'clock.transition=1s',
        '-o',
        file,
      ],
      { encoding: 'utf8', timeout: 30_000 },
    );
    expect(r.signal).toBeNull();
    if (r.status === 2) {
      expect(r.stderr).toContain('clock.transition');
    } else {
      expect(r.status).toBe(1);
      expect(all(parseSvg(readFileSync(file, 'utf8')), 'text.verdict')[0]!.textContent).toBe('\u2715 FAIL');
    }
  }, 40_000);
});
