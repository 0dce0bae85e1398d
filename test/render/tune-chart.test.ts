import { describe, it, expect } from 'vitest';
import { defaultSpace, tuneChains } from '../../src/analysis/tune.js';
import { tuneReport } from '../../src/report/tune-report.js';
import { renderTuneChart } from '../../src/render/svg/tune-chart.js';
import { loadDesign } from '../../src/cli/load.js';
import { design } from '../helpers.js';
import { all, parseSvg } from './svg-dom.js';

describe('renderTuneChart', () => {
  const { design: d, card } = loadDesign(design('doubler'));
  const result = tuneChains(d, card, undefined, { ...defaultSpace(d), stages: [2, 4], stageSizes: [1], tapers: [], feedbackTaps: [] });
  const report = tuneReport(d.name, d.clock.frequency, 45, result, 2);

  it('draws one dot per other passing chain and one named marker per proposal and the design, each in the legend', () => {
    const svg = parseSvg(renderTuneChart(report)!);
    expect(all(svg, 'g.candidates .marker').length).toBe(report.candidates.length);
    const named = all(svg, 'g.named > g').map((g) => g.getAttribute('data-label'));
    expect(named).toEqual(['this design', 'proposal 1', 'proposal 2']);
    const legend = all(svg, 'g.legend text').map((t) => t.textContent);
    expect(legend).toEqual(['this design', 'proposal 1', 'proposal 2', 'other searched chains']);
    expect(svg.getAttribute('id')).toBe('tune-chart');
  });

  it('places a proposal with more margin further right and the design, which wastes more, higher', () => {
    const svg = parseSvg(renderTuneChart(report)!);
    const centre = (label: string) => {
      const m = all(svg, `g.named > g[data-label="${label}"] .marker`)[0]!;
      return { x: Number(m.getAttribute('cx')), y: Number(m.getAttribute('cy')) };
    };
    // The design keeps +467 ps at the fast corner and wastes 2.69 ns; proposal 1 keeps about +70 ps and wastes about 1.4 ns.
    const design0 = all(svg, 'g.named > g[data-label="this design"] line')[0]!;
    const dx = (Number(design0.getAttribute('x1')) + Number(design0.getAttribute('x2'))) / 2;
    const dy = (Number(design0.getAttribute('y1')) + Number(design0.getAttribute('y2'))) / 2;
    const p1 = centre('proposal 1');
    expect(dx).toBeGreaterThan(p1.x);
    expect(dy).toBeLessThan(p1.y);
  });

  it('returns null when nothing can be plotted', () => {
    expect(renderTuneChart({ ...report, candidates: [], proposals: [], current: { ...report.current, waste: null } })).toBeNull();
  });
});
