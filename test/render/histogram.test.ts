import { describe, it, expect } from 'vitest';
import { spawnSync } from 'node:child_process';
import { renderHistogram } from '../../src/render/svg/histogram.js';
import { histogramOf } from '../../src/variation/histogram.js';
import { all, parseSvg } from './svg-dom.js';
import { cliAsync, design, expectClose, tempDir } from '../helpers.js';
import { readFileSync, existsSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { requireTool } from '../tools.js';

requireTool('xmllint', 'libxml2-utils');

const list = (centre: number, n: number) => Float64Array.from({ length: n }, (_, i) => centre + ((i % 21) - 10) * 1e-12);
const values = (centre: number, n: number) => histogramOf(list(centre, n));

describe('renderHistogram', () => {
  it('counts every finite value exactly once across its bars, in one panel per series', () => {
    const a = values(800e-12, 420);
    const b = histogramOf([...list(900e-12, 300), NaN]);
    const svg = parseSvg(
      renderHistogram({
        title: 't',
        subtitle: 's',
        series: [
          { label: 'dead a', histogram: a },
          { label: 'dead b', histogram: b },
        ],
        requirement: 780e-12,
      }),
    );
    const panels = all(svg, 'g.histogram-panel');
    expect(panels.map((p) => p.getAttribute('data-series'))).toEqual(['dead a', 'dead b']);
    const counts = panels.map((p) => all(p, 'rect.bar').reduce((n, r) => n + Number(r.getAttribute('data-count')), 0));
    expect(counts).toEqual([420, 300]);
  });

  it('hatches the bars below a requirement drawn to scale and names a far one as off scale', () => {
    const near = renderHistogram({
      title: 't',
      subtitle: 's',
      series: [{ label: 'd', histogram: values(800e-12, 210) }],
      requirement: 795e-12,
    });
    const doc = parseSvg(near);
    expect(all(doc, 'rect.bar').some((r) => r.getAttribute('data-fails') === '1')).toBe(true);
    expect(near).toContain('required &gt;= 795 ps');
    const far = renderHistogram({
      title: 't',
      subtitle: 's',
      series: [{ label: 'd', histogram: values(2.7e-9, 210) }],
      requirement: 500e-12,
      maximum: 4e-9,
    });
    expect(far).toContain('off scale, 2190 ps below the least die');
    expect(far).toContain('off scale, 1290 ps above the most die');
    expect(far).not.toMatch(/NaN|undefined|Infinity/);
  });

  it('draws the mean and mean ± sigma where they are, and labels both axes', () => {
    const doc = parseSvg(
      renderHistogram({
        title: 't',
        subtitle: 's',
        axis: '50 % dead time',
        series: [{ label: 'd', histogram: values(800e-12, 210), mean: 801e-12, sigma: 4e-12 }],
      }),
    );
    const at = (cls: string) => all(doc, `line.${cls}`).map((l) => Number(l.getAttribute('data-value')));
    expect(at('mean-marker')).toEqual([801e-12]);
    expect(at('sigma-marker')).toEqual([797e-12, 805e-12]);
    const mean = all(doc, 'line.mean-marker')[0]!;
    const [minus, plus] = all(doc, 'line.sigma-marker').map((l) => Number(l.getAttribute('x1')));
    // Equal sigma steps are equal distances on a linear axis.
    expectClose(Number(mean.getAttribute('x1')) - minus!, plus! - Number(mean.getAttribute('x1')), 0.02, 'abs');
    expect(all(doc, 'text.moments')[0]!.textContent).toBe('mean 801 ps \u00b7 \u03c3 4 ps');
    const y = all(doc, 'text.y-label')[0]!;
    expect(y.textContent).toBe('dies per bin');
    expect(y.getAttribute('transform')).toMatch(/^rotate\(-90 /);
    expect(all(doc, 'text.x-label')[0]!.textContent).toBe('50 % dead time');
  });

  it('estimates mean and sigma from the bins when the caller has none', () => {
    const doc = parseSvg(renderHistogram({ title: 't', subtitle: 's', series: [{ label: 'd', histogram: values(800e-12, 210) }] }));
    // list(): i % 21 - 10 steps of 1 ps, each value ten times: mean 800 ps exactly.
    expectClose(Number(all(doc, 'line.mean-marker')[0]!.getAttribute('data-value')), 800e-12, 0.05e-12, 'abs');
  });

  it('always draws the requirement as a dashed line: to scale when near, beyond an axis break when far', () => {
    const near = parseSvg(
      renderHistogram({ title: 't', subtitle: 's', series: [{ label: 'd', histogram: values(800e-12, 210) }], requirement: 795e-12 }),
    );
    expect(all(near, 'line.requirement').map((l) => l.getAttribute('stroke-dasharray'))).toEqual(['6 4']);
    expect(all(near, 'g.axis-break')).toHaveLength(0);
    const far = parseSvg(
      renderHistogram({
        title: 't',
        subtitle: 's',
        series: [{ label: 'd', histogram: values(2.7e-9, 210) }],
        requirement: 500e-12,
        maximum: 4e-9,
      }),
    );
    const lines = all(far, 'line.requirement');
    expect(lines.map((l) => l.getAttribute('data-off-scale'))).toEqual(['1', '1']);
    const xs = lines.map((l) => Number(l.getAttribute('x1')));
    const bars = all(far, 'rect.bar').map((r) => Number(r.getAttribute('x')));
    // The lower limit lies left of every bar and the upper one right of every bar.
    expect(xs[0]!).toBeLessThan(Math.min(...bars));
    expect(xs[1]!).toBeGreaterThan(Math.max(...bars));
    expect(all(far, 'g.axis-break')).toHaveLength(2);
  });

  it('writes a margin histogram in volts that xmllint (libxml2-utils) accepts', () => {
    const file = join(tempDir(), 'h.svg');
    const svg = renderHistogram({
      title: 'v <&>',
      subtitle: 's',
      unit: 'V',
      axis: 'margin',
      requirement: 0,
      series: [{ label: 's1 holds off', histogram: histogramOf(list(0.05, 100).map((v) => v * 1e9)) }],
    });
    expect(svg).toContain('required &gt;= 0 mV');
    writeFileSync(file, svg);
    const lint = spawnSync('xmllint', ['--noout', '--nonet', file], { encoding: 'utf8' });
    expect(lint.stderr).toBe('');
    expect(lint.status).toBe(0);
  });
});

describe('histograms from the CLI', () => {
  it('mc --histogram draws the margin of the check that limits yield at the worst corner by default', async () => {
    const svg = join(tempDir(), 'h.svg');
    const r = await cliAsync('mc', design('too-tight'), '--samples', '120', '--workers', '1', '--histogram', svg, '--json');
    expect(r.code).toBe(1);
    const report = JSON.parse(r.stdout) as {
      worstCorner: string;
      corners: Array<{ name: string; quantities: Array<{ name: string; kind: string; failures?: number }> }>;
    };
    const worst = report.corners.find((c) => c.name === report.worstCorner)!;
    const mostFailing = Math.max(...worst.quantities.filter((q) => q.kind !== 'measure').map((q) => q.failures ?? 0));
    const doc = parseSvg(readFileSync(svg, 'utf8'));
    const panels = all(doc, 'g.histogram-panel');
    expect(panels).toHaveLength(1);
    const check = worst.quantities.find((q) => q.name === panels[0]!.getAttribute('data-series'))!;
    expect(check.failures).toBe(mostFailing);
    expect(mostFailing).toBeGreaterThan(0);
    expect(readFileSync(svg, 'utf8')).toContain(`check margin at ${report.worstCorner}`);
    expect(all(doc, 'rect.bar').reduce((n, b) => n + Number(b.getAttribute('data-count')), 0)).toBe(120);
  });

  it('mc --histogram-corner and --histogram-check choose the corner and the check', async () => {
    const dir = tempDir();
    const svg = join(dir, 'h.svg');
    const r = await cliAsync(
      'mc',
      design('doubler'),
      '--samples',
      '60',
      '--workers',
      '1',
      '--histogram',
      svg,
      '--histogram-corner',
      'TT/1.8V/27C',
      '--histogram-check',
      'dead-times',
    );
    expect(r.code).toBe(0);
    const text = readFileSync(svg, 'utf8');
    expect(text).toContain('dead times at tt/1.8V/27C');
    expect(all(parseSvg(text), 'g.histogram-panel').map((p) => p.getAttribute('data-series'))).toEqual(['dead p1->p2', 'dead p2->p1']);
    expect(
      (await cliAsync('mc', design('doubler'), '--samples', '60', '--workers', '1', '--histogram', svg, '--histogram-check', 'width p2'))
        .code,
    ).toBe(0);
    expect(all(parseSvg(readFileSync(svg, 'utf8')), 'g.histogram-panel').map((p) => p.getAttribute('data-series'))).toEqual([
      'width p2 >= 10.0 ns',
    ]);
  });

  it.each([
    [['--histogram-check', 'width'], '--histogram-check: "width" names 2 checks of this design; write more of one'],
    [['--histogram-check', 'widht'], '--histogram-check: "widht" is not a check of this design; allowed: dead-times, or a check name'],
    [
      ['--histogram-corner', 'xx/1V/0C'],
      '--histogram-corner: "xx/1V/0C" is not a corner of this run; allowed: worst or one of tt/1.62V/-40C',
    ],
  ])('mc %j stops before the run with a message and writes nothing', async (args, message) => {
    const svg = join(tempDir(), 'h.svg');
    const r = await cliAsync('mc', design('doubler'), '--samples', '60', '--workers', '1', '--histogram', svg, ...args);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain(message);
    expect(existsSync(svg)).toBe(false);
  });

  it('mc --histogram-check without --histogram asks for the file', async () => {
    const r = await cliAsync('mc', design('doubler'), '--samples', '10', '--histogram-check', 'dead-times');
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('--histogram-check: "dead-times" chooses what --histogram draws; give --histogram FILE.svg too');
  });

  it('report --mc adds a Monte Carlo section', async () => {
    const dir = tempDir();
    const html = join(dir, 'r.html');
    expect((await cliAsync('report', design('doubler'), '--mc', '60', '--no-fmax', '-o', html)).code).toBe(0);
    const page = readFileSync(html, 'utf8');
    expect(page).toContain('id="montecarlo"');
    expect(page).toContain('60 dies (seed 1) at each of 45 corners');
    const md = join(dir, 'r.md');
    expect((await cliAsync('report', design('doubler'), '--mc', '60', '--no-fmax', '--format', 'md', '-o', md)).code).toBe(0);
    expect(existsSync(join(dir, 'r-histogram.svg'))).toBe(true);
    expect(readFileSync(md, 'utf8')).toContain('](r-histogram.svg)');
  });
});
