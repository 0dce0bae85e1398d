import { describe, it, expect } from 'vitest';
import { renderHistogram } from '../../src/render/svg/histogram.js';
import { histogramOf } from '../../src/variation/histogram.js';
import { all, parseSvg } from './svg-dom.js';
import { cliAsync, design, tempDir } from '../helpers.js';
import { readFileSync, existsSync } from 'node:fs';
import { join } from 'node:path';

const list = (centre: number, n: number) => Float64Array.from({ length: n }, (_, i) => centre + ((i % 21) - 10) * 1e-12);
const values = (centre: number, n: number) => histogramOf(list(centre, n));

describe('renderHistogram', () => {
  it('counts every finite value exactly once across its bars, in one panel per series', () => {
    const a = values(800e-12, 420);
    const b = histogramOf([...list(900e-12, 300), NaN]);
    const svg = parseSvg(renderHistogram({ title: 't', subtitle: 's', series: [{ label: 'dead a', histogram: a }, { label: 'dead b', histogram: b }], requirement: 780e-12 }));
    const panels = all(svg, 'g.histogram-panel');
    expect(panels.map((p) => p.getAttribute('data-series'))).toEqual(['dead a', 'dead b']);
    const counts = panels.map((p) => all(p, 'rect.bar').reduce((n, r) => n + Number(r.getAttribute('data-count')), 0));
    expect(counts).toEqual([420, 300]);
  });

  it('hatches the bars below a requirement drawn to scale and names a far one as off scale', () => {
    const near = renderHistogram({ title: 't', subtitle: 's', series: [{ label: 'd', histogram: values(800e-12, 210) }], requirement: 795e-12 });
    const doc = parseSvg(near);
    expect(all(doc, 'rect.bar').some((r) => r.getAttribute('data-fails') === '1')).toBe(true);
    expect(near).toContain('required &gt;= 795 ps');
    const far = renderHistogram({ title: 't', subtitle: 's', series: [{ label: 'd', histogram: values(2.7e-9, 210) }], requirement: 500e-12, maximum: 4e-9 });
    expect(far).toContain('off scale, 2190 ps below the least die');
    expect(far).toContain('off scale, 1290 ps above the most die');
    expect(far).not.toMatch(/NaN|undefined|Infinity/);
  });
});

describe('histograms from the CLI', () => {
  it('mc --histogram writes the worst corner\'s dead times; report --mc adds a Monte Carlo section', async () => {
    const dir = tempDir();
    const svg = join(dir, 'h.svg');
    const r = await cliAsync('mc', design('doubler'), '--samples', '120', '--workers', '1', '--histogram', svg);
    expect(r.code).toBe(0);
    const doc = parseSvg(readFileSync(svg, 'utf8'));
    expect(all(doc, 'g.histogram-panel')).toHaveLength(2);
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
