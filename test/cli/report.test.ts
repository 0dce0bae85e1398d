import { describe, expect, it } from 'vitest';
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { CAUTIONS } from '../../src/report/cautions.js';
import { cli, design, tempDir, cliAsync } from '../helpers.js';
import { parseSvg } from '../render/svg-dom.js';
import { requireTool } from '../tools.js';

requireTool('ngspice', 'ngspice');

describe('phasegap report', () => {
  it('writes one self-contained HTML page with the four drawings inline and the cautions', async () => {
    const dir = tempDir();
    const file = join(dir, 'r.html');
    const run = await cliAsync('report', design('doubler'), '-o', file);
    expect(run.code).toBe(0);
    const html = readFileSync(file, 'utf8');
    expect(html.startsWith('<!DOCTYPE html>')).toBe(true);
    // Worst corner, all corners, margins and the chart of the searched delay chains.
    expect(html.match(/<svg /g)?.length).toBe(4);
    for (const c of CAUTIONS) expect(html).toContain(c.replace(/'/g, '&#39;'));
    // Nothing that would make a browser fetch: no external scripts, styles, images or links.
    expect(html).not.toMatch(/<script|<link|<img|@import|url\(http|src=/i);
    expect(html).toContain('@media print');
    expect(html).toMatch(/fmax \d/);
    expect(html).not.toMatch(/NaN|undefined/);
    // Each inline drawing is well-formed XML on its own and uses ids of its own.
    const svgs = [...html.matchAll(/<svg [\s\S]*?<\/svg>/g)].map((m) => m[0]);
    const ids = svgs.flatMap((s) => [...s.matchAll(/ id="([^"]+)"/g)].map((m) => m[1]));
    expect(new Set(ids).size).toBe(ids.length);
    for (const s of svgs) expect(() => parseSvg(s)).not.toThrow();
  });

  it('lists the node voltages per phase, written and in volts at the nominal supply, with the switches on each node', async () => {
    const run = await cliAsync('report', design('doubler'), '-o', '-', '--no-tune');
    const section = run.stdout.slice(run.stdout.indexOf('<section id="nodes">')).split('</section>')[0]!;
    expect(section).toContain('<th>node</th><th>phase p1</th><th>phase p2</th><th>dead time</th><th>switches</th>');
    // top plate: VDD in p1, 1.6..2 VDD in p2 (2.88..3.60 V at 1.8 V), either in the dead time.
    expect(section).toContain(
      '<tr><td>top</td><td>vdd (1.80 V)</td><td>1.6vdd .. 2vdd (2.88 .. 3.60 V)</td><td>vdd .. 2vdd (1.80 .. 3.60 V)</td><td class="verdict-cell">s_chg, s_out</td></tr>',
    );
    expect(section).toContain(
      '<tr><td>bottom</td><td>0 V</td><td>vdd (1.80 V)</td><td>0 V .. vdd (0.00 .. 1.80 V)</td><td class="verdict-cell">s_gnd, s_vdd</td></tr>',
    );
    expect(run.stdout).not.toContain('id="warnings"');
  });

  it('shows the off-state failure of the unboosted doubler in volts among the worst cases', async () => {
    const run = await cliAsync('report', design('doubler-unboosted'), '-o', '-', '--no-tune');
    expect(run.code).toBe(1);
    expect(run.stdout).toMatch(
      /<tr class="fail"><td>off-state<\/td><td>s_chg holds off<\/td><td class="num">-1\.96 V<\/td><td>ff\/1\.98V\/125C<\/td>/,
    );
  });

  it('lists every corner in the corner table and exits 1 when the design fails', async () => {
    const run = await cliAsync('report', design('too-tight'), '--no-fmax', '-o', '-');
    expect(run.code).toBe(1);
    expect(run.stdout).toContain('fmax not computed (skipped with --no-fmax)');
    const rows =
      run.stdout
        .slice(run.stdout.indexOf('id="corners"'))
        .split('</table>')[0]!
        .match(/<tr( class="fail")?><td>/g) ?? [];
    expect(rows.length).toBe(45);
    expect(rows.filter((r) => r.includes('fail')).length).toBeGreaterThan(0);
  });

  it('proposes the same delay chains as phasegap tune, and leaves them out with --no-tune or for a free-form netlist', async () => {
    const run = await cliAsync('report', design('too-tight'), '--no-fmax', '-o', '-');
    const section = run.stdout.slice(run.stdout.indexOf('<section id="tune">')).split('</section>')[0]!;
    // The page's proposals are not simulated (it says so), so they match tune without ngspice confirmation.
    const tune = JSON.parse(cli('tune', design('too-tight'), '--top', '3', '--json', '--no-confirm').stdout);
    const best = tune.proposals[0];
    expect(section).toContain(`${best.stages} stages of size ${best.stageSize} with ${best.overrides[2].split('=')[1]} per node`);
    // Each option of the command line stays on one line (white-space: nowrap).
    expect(section).toContain(best.overrides.map((o: string) => `<span class="option">--set ${o}</span>`).join(' '));
    // This design plus three proposals.
    expect(section.match(/<tr( class="fail")?><td>/g)?.length).toBe(4);
    expect(section).toMatch(/<tr class="fail"><td>this design<\/td>/);
    const skipped = await cliAsync('report', design('too-tight'), '--no-fmax', '--no-tune', '-o', '-');
    expect(skipped.stdout).not.toContain('id="tune"');
    const netlist = await cliAsync('report', design('lp-netlist'), '--no-fmax', '-o', '-');
    expect(netlist.stdout).not.toContain('id="tune"');
  });

  it('adds ngspice against the model with --confirm (Debian package ngspice), and needs ngspice for it', async () => {
    const run = await cliAsync('report', design('doubler'), '--no-fmax', '--no-tune', '--confirm', 'worst', '-o', '-');
    expect(run.code).toBe(0);
    const section = run.stdout.slice(run.stdout.indexOf('<section id="confirm">')).split('</section>')[0]!;
    expect(section).toMatch(/<h2>Transistor-level confirmation \(ngspice-\S+\)<\/h2>/);
    expect(section).toMatch(
      /The analytic model against ngspice-\S+ at 2 corners: dead times, gaps and widths within 10\.0 % at 2 of 2, break-before-make verdicts alike for 4 of 4 pairs; largest difference/,
    );
    // The two extreme corners: two dead times, two gaps and two widths each, then the two
    // break-before-make pairs of the demo at each.
    const rows = section.match(/<tr( class="fail")?><td>/g) ?? [];
    expect(rows.length).toBe(2 * 6 + 2 * 2);
    const dir = tempDir();
    const out = join(dir, 'r.html');
    const missing = await cliAsync(
      'report',
      design('doubler'),
      '--no-fmax',
      '--confirm',
      'worst',
      '--ngspice',
      '/nonexistent/ngspice',
      '-o',
      out,
    );
    expect(missing.code).toBe(2);
    expect(missing.stderr).toMatch(/apt-get install ngspice/);
    const unknown = await cliAsync('report', design('doubler'), '--no-fmax', '--confirm', 'xx/1V/0C', '-o', out);
    expect(unknown.code).toBe(2);
    expect(unknown.stderr).toMatch(/^phasegap: error: --confirm: "xx\/1V\/0C" is not a corner of the design/);
    expect(readdirSync(dir)).toEqual([]);
  });

  // The demo's least dead time is 983.1 ps (ff/1.98V/-40C, measured): a 979.5 ps minimum holds at every
  // corner but not on every die. Chosen 3.6 ps below it so that, with seed 1, 30 of 40 dies pass: the
  // yield is strictly between 0 and 1 and below the 99 % required (980 ps gives 29 of 40, 979 ps 33 of 40).
  const missesYield = ['--mc', '40', '--seed', '1', '--set', 'requirements.deadTime.min=979.5ps', '--set', 'requirements.minYield=0.99'];

  it('exits 1 and heads the page FAIL when Monte Carlo misses requirements.minYield while every corner passes', async () => {
    const run = await cliAsync('report', design('doubler'), '--no-fmax', '--no-tune', ...missesYield, '-o', '-');
    expect(run.code).toBe(1);
    const head = run.stdout.slice(run.stdout.indexOf('<header>'), run.stdout.indexOf('</header>'));
    expect(head).toContain(
      '<div class="verdict fail" data-verdict="fail"><strong>✕ FAIL</strong><span>fails: Monte Carlo yield; 45 of 45 corners pass;',
    );
    expect(head).toMatch(/<li data-part="corner checks" data-verdict="pass">corner checks: ✓ pass: 45 of 45 corners pass; /);
    expect(head).toContain(
      '<li data-part="Monte Carlo yield" data-verdict="fail"><strong>Monte Carlo yield: ✕ FAIL: yield 75.0 % over 40 dies at every corner, below the 99.0 % required</strong></li>',
    );
    expect(head).toContain(
      '<li data-part="simulator agreement" data-verdict="not-run">simulator agreement: not run (add --confirm worst to run it)</li>',
    );
    // Without a yield requirement every die must pass, as in phasegap mc: 10 of the 40 fail, so the run fails.
    const free = await cliAsync(
      'report',
      design('doubler'),
      '--no-fmax',
      '--no-tune',
      '--mc',
      '40',
      '--seed',
      '1',
      '--set',
      'requirements.deadTime.min=979.5ps',
      '-o',
      '-',
    );
    expect(free.code).toBe(1);
    expect(free.stdout).toContain('data-verdict="fail"><strong>✕ FAIL</strong><span>fails: Monte Carlo yield;');
    expect(free.stdout).toContain('no requirements.minYield, so every die must pass (10 fail)');
    const mc = await cliAsync(
      'mc',
      design('doubler'),
      '--samples',
      '40',
      '--seed',
      '1',
      '--workers',
      '1',
      '--set',
      'requirements.deadTime.min=979.5ps',
    );
    expect(mc.code).toBe(free.code);
  });

  it('gives the Markdown page the same verdict and parts', async () => {
    const dir = tempDir();
    const file = join(dir, 'review.md');
    const run = await cliAsync('report', design('doubler'), '--format', 'md', '--no-fmax', '--no-tune', ...missesYield, '-o', file);
    expect(run.code).toBe(1);
    const md = readFileSync(file, 'utf8').split('\n');
    const at = md.findIndex((l) => l.startsWith('**✕ FAIL**: fails: Monte Carlo yield; 45 of 45 corners pass'));
    expect(at).toBeGreaterThan(0);
    expect(md[at + 2]).toMatch(/^- corner checks: ✓ pass: 45 of 45 corners pass; /);
    expect(md[at + 3]).toBe('- **Monte Carlo yield: ✕ FAIL: yield 75.0 % over 40 dies at every corner, below the 99.0 % required**');
    expect(md[at + 4]).toBe('- simulator agreement: not run (add --confirm worst to run it)');
  });

  it('exits 1 with the simulator part failing when ngspice (Debian package ngspice) differs beyond --tolerance while every corner passes', async () => {
    const run = await cliAsync(
      'report',
      design('doubler'),
      '--no-fmax',
      '--no-tune',
      '--confirm',
      'tt/1.8V/27C',
      '--tolerance',
      '0.5%',
      '-o',
      '-',
    );
    expect(run.code).toBe(1);
    const head = run.stdout.slice(run.stdout.indexOf('<header>'), run.stdout.indexOf('</header>'));
    expect(head).toContain('<strong>✕ FAIL</strong><span>fails: simulator agreement; 45 of 45 corners pass;');
    expect(head).toMatch(
      /<li data-part="simulator agreement" data-verdict="fail"><strong>simulator agreement: ✕ FAIL: \d+ quantities beyond 0\.5 % \(first: [^)]+ at tt\/1\.8V\/27C\)<\/strong><\/li>/,
    );
  });

  it("shows doubler-pump's circuit against ngspice (Debian package ngspice) with confirm --json's numbers for the same corner", async () => {
    const corner = 'tt/1.8V/27C';
    const run = await cliAsync('report', design('doubler-pump'), '--no-fmax', '--no-tune', '--confirm', corner, '-o', '-');
    const confirm = cli('confirm', design('doubler-pump'), '--corners', corner, '--json');
    const json = JSON.parse(confirm.stdout);
    const figures: Array<{
      figure: string;
      model: number;
      simulator: number | null;
      difference: number | null;
      tolerance: number | null;
      pass: boolean;
    }> = json.corners[0].circuit.figures;
    expect(figures.map((f) => f.figure)).toEqual(['output', 'ripple', 'efficiency', 'lost charge']);
    const section = run.stdout.slice(run.stdout.indexOf('<section id="confirm">')).split('</section>')[0]!;
    expect(section).toContain(`<h3>Circuit against ${json.simulator} at ${corner}</h3>`);
    const table = section.slice(section.indexOf(`<table class="circuit-confirm" data-corner="${corner}"`)).split('</table>')[0]!;
    const si = (v: string) => (v === '' ? null : Number(v));
    const rows = [
      ...table.matchAll(
        /<tr[^>]* data-figure="([^"]+)" data-model="([^"]*)" data-simulator="([^"]*)" data-difference="([^"]*)" data-tolerance="([^"]*)">(.*?)<\/tr>/g,
      ),
    ].map((m) => ({
      figure: m[1],
      model: si(m[2]!),
      simulator: si(m[3]!),
      difference: si(m[4]!),
      tolerance: si(m[5]!),
      verdict: /verdict-cell">([^<]+)</.exec(m[6]!)![1],
    }));
    // Both runs write the same decks, and ngspice gives the same numbers for the same deck.
    expect(rows).toEqual(
      figures.map((f) => ({
        figure: f.figure,
        model: f.model,
        simulator: f.simulator,
        difference: f.difference,
        tolerance: f.tolerance,
        verdict: f.tolerance === null ? 'shown' : f.pass ? 'within' : 'OVER',
      })),
    );
    // The page's simulator part is confirm's own.
    const part = json.run.parts.find((p: { key: string }) => p.key === 'simulator');
    expect(run.stdout).toContain(
      `<li data-part="simulator agreement" data-verdict="${part.verdict}">simulator agreement: ✓ pass: ${part.reason}</li>`,
    );
    expect(run.code).toBe(confirm.code);
  });

  it('writes Markdown with the SVGs beside it with --format md', async () => {
    const dir = tempDir();
    const file = join(dir, 'review.md');
    const run = await cliAsync('report', design('sc-integrator'), '--format', 'md', '--no-fmax', '-o', file);
    expect([0, 1]).toContain(run.code);
    expect(readdirSync(dir).sort()).toEqual(['review-all.svg', 'review-margins.svg', 'review-worst.svg', 'review.md']);
    const md = readFileSync(file, 'utf8');
    expect(md).toContain('![All corners overlaid](review-all.svg)');
    expect(md).toContain('| corner |');
    expect(md).toContain('## Delay chains that pass with the least dead time');
    for (const c of CAUTIONS) expect(md).toContain(c);
  });

  it.each([
    [['--format', 'pdf', '-o', 'x'], '--format: "pdf" is not a report format; allowed: html, md'],
    [['--format', 'md', '-o', '-'], '--out: "-" cannot be stdout for --format md'],
    [[], '--out: is required: name the HTML file to write, or - for stdout'],
  ])('refuses %j with exit 2', async (args, message) => {
    const dir = tempDir();
    const run = await cliAsync('report', design('doubler'), ...args.map((a) => (a === 'x' ? join(dir, 'x') : a)));
    expect(run.code).toBe(2);
    expect(run.stderr).toContain(message);
    expect(readdirSync(dir)).toEqual([]);
    expect(existsSync(join(dir, 'x'))).toBe(false);
  });
});
