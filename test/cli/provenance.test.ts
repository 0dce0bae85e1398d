import { describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { cliWith, design, processCard, ROOT, tempDir } from '../helpers.js';

const now = () => new Date(Date.UTC(2026, 2, 4, 5, 6, 7));
const DATE = '2026-03-04T05:06:07.000Z';
const sha = (path: string) => createHash('sha256').update(readFileSync(path)).digest('hex');
const version = JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')).version as string;

describe('provenance in every output', () => {
  it('check text ends with version, frozen date, command line and the hashes of design and card', async () => {
    const run = await cliWith({ now }, 'check', design('doubler'));
    expect(run.code).toBe(0);
    const tail = run.stdout.trimEnd().split('\n').slice(-5);
    expect(tail).toEqual([
      `provenance: phasegap ${version}, ${DATE}`,
      `provenance: command: phasegap check ${design('doubler')}`,
      expect.stringMatching(new RegExp(`^provenance: design: .*doubler\\.yaml sha256 ${sha(design('doubler'))}$`)),
      expect.stringMatching(new RegExp(`^provenance: process card: .*generic180\\.yaml sha256 ${sha(processCard('generic180'))}$`)),
      // The band measured for the analytic model on generic180 (src/delay/error-band.ts).
      'provenance: delay model: analytic, measured error within 2.9 % (dead time against ngspice on 900 dead times of the shipped designs, test/bench/accuracy.bench.ts)',
    ]);
  });

  it('check --json carries the run verdict and the provenance', async () => {
    const run = await cliWith({ now }, 'check', design('doubler'), '--json');
    const data = JSON.parse(run.stdout);
    expect(Object.keys(data).slice(0, 2)).toEqual(['tool', 'run']);
    expect(data.run.verdict).toBe('pass');
    expect(data.run.parts.map((p: { key: string; verdict: string }) => `${p.key}:${p.verdict}`)).toEqual([
      'corners:pass',
      'montecarlo:not-run',
      'simulator:not-run',
    ]);
    expect(data.provenance).toMatchObject({
      tool: 'phasegap',
      version,
      date: DATE,
      command: ['check', design('doubler'), '--json'],
      simulator: null,
    });
    expect(data.provenance.inputs[0]).toEqual({ role: 'design', path: design('doubler'), sha256: sha(design('doubler')) });
  });

  it('the HTML and Markdown reports, their SVGs, VCD, SPICE deck and Verilog header record it', async () => {
    const dir = tempDir();
    const html = await cliWith({ now }, 'report', design('doubler'), '--no-fmax', '--no-tune', '-o', '-');
    expect(html.stdout).toMatch(new RegExp(`<footer>phasegap ${version.replace(/\./g, '\\.')} ·`));
    expect(html.stdout).toContain(`<li>phasegap ${version}, ${DATE}</li>`);
    expect(html.stdout).toContain(`sha256 ${sha(design('doubler'))}</li>`);
    // Each of the three drawings carries a metadata element with the verdict and the record.
    expect(html.stdout.match(/<metadata data-verdict="pass" data-sha256="[0-9a-f]{64}">\nverdict: PASS\n/g)).toHaveLength(3);
    await cliWith({ now }, 'report', design('doubler'), '--no-fmax', '--no-tune', '--format', 'md', '-o', join(dir, 'r.md'));
    expect(readFileSync(join(dir, 'r.md'), 'utf8')).toContain(`- phasegap ${version}, ${DATE}`);
    expect(readFileSync(join(dir, 'r-worst.svg'), 'utf8')).toContain(`phasegap ${version}, ${DATE}`);
    const vcd = await cliWith({ now }, 'waves', design('doubler'), '-o', '-');
    expect(vcd.stdout).toContain(`$version phasegap ${version} $end`);
    expect(vcd.stdout).toContain(`phasegap ${version}, ${DATE}; command: phasegap waves`);
    const deck = await cliWith({ now }, 'spice', design('doubler'), '--corner', 'tt/1.8V/27C', '-o', '-');
    const lines = deck.stdout.split('\n');
    expect(lines[1]).toBe(`* phasegap ${version}, ${DATE}`);
    expect(lines.some((l) => /^\* SPICE models: .*sha256 [0-9a-f]{64}$/.test(l))).toBe(true);
    const verilog = await cliWith({ now }, 'verilog', design('doubler'), '--corner', 'tt/1.8V/27C', '-o', '-');
    expect(verilog.stdout).toContain(`// phasegap ${version}, ${DATE}`);
    const svg = await cliWith({ now }, 'draw', design('doubler'), '-o', '-');
    expect(svg.stdout).toContain(`<metadata data-verdict="pass" data-sha256="${sha(design('doubler'))}">`);
    expect(readdirSync(dir).sort()).toEqual(['r-all.svg', 'r-margins.svg', 'r-worst.svg', 'r.md']);
  });

  it("the version has one source: phasegap --version prints package.json's", async () => {
    const run = await cliWith({}, '--version');
    expect(run.stdout.trim()).toBe(version);
  });
});

describe('sourceDate', () => {
  it('takes SOURCE_DATE_EPOCH (reproducible-builds.org) when it is whole seconds, else the clock', async () => {
    const { sourceDate } = await import('../../src/cli/io.js');
    expect(sourceDate({ SOURCE_DATE_EPOCH: '1700000000' }).toISOString()).toBe('2023-11-14T22:13:20.000Z');
    const before = Date.now();
    expect(sourceDate({ SOURCE_DATE_EPOCH: 'yesterday' }).getTime()).toBeGreaterThanOrEqual(before);
  });
});
