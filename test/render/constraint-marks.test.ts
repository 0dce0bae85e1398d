import { describe, expect, it } from 'vitest';
import { evaluateAll } from '../../src/analysis/evaluate.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { loadDesign } from '../../src/cli/load.js';
import { buildDiagram } from '../../src/render/diagram.js';
import { renderTimingSvg } from '../../src/render/svg/timing.js';
import { design } from '../helpers.js';
import { all, parseSvg } from './svg-dom.js';

/** One corner of a demo design drawn, with that corner's results (the design narrowed to that corner). */
function drawCorner(name: string, corner: string, overrides: string[] = []) {
  const [process, vdd, temperature] = corner.split('/') as [string, string, string];
  const only = [`corners.process=[${process}]`, `corners.vdd=[${vdd}]`, `corners.temperature=[${temperature.replace('C', '')}]`];
  const { design: d, card } = loadDesign(design(name), [...only, ...overrides]);
  const resolved = resolveDesign(d, card);
  const results = evaluateAll(resolved);
  const index = results.findIndex((r) => r.corner.name === corner);
  return { result: results[index]!, svg: parseSvg(renderTimingSvg(buildDiagram(resolved, results, { kind: 'corner', index }, 'phases'))) };
}

const drawn = (overrides: string[] = []) => drawCorner('sc-integrator', 'ff/1.98V/-40C', overrides);

describe('order marks on the timing diagram', () => {
  it("label the bottom-plate order with the time between the two events, its margin equal to the check's", () => {
    const { result, svg } = drawn();
    const check = result.checks.find((c) => c.kind === 'order')!;
    const label = all(svg, 'text.bbm-label').find((l) => l.getAttribute('data-from') === 's1e' && l.getAttribute('data-to') === 's1')!;
    expect(label.textContent).toBe(`s1e off to s1 off ${Math.round((check.margin! + 50e-12) * 1e12)} ps`);
    expect(Number(label.getAttribute('data-margin'))).toBeCloseTo(check.margin!, 18);
    expect(all(svg, 'text.bbm-lane-label').some((t) => t.textContent === 'order')).toBe(true);
  });

  it('hatch and flag an order that is not met', () => {
    const { result, svg } = drawn(['constraints.order[0].min=2ns']);
    expect(result.checks.find((c) => c.kind === 'order')!.pass).toBe(false);
    const label = all(svg, 'text.bbm-label').find((l) => l.getAttribute('data-from') === 's1e' && l.getAttribute('data-to') === 's1')!;
    expect(label.textContent!.endsWith('\u2715 FAIL')).toBe(true);
    expect(all(svg, 'rect.bbm-fail').length).toBeGreaterThan(0);
  });
});

describe('settle marks on the whole-period panel', () => {
  const doubler = (overrides: string[] = []) => drawCorner('doubler', 'ss/1.62V/125C', overrides);

  it("carry the check's margin and name the path, the common on-time and the time needed", () => {
    const { result, svg } = doubler();
    const check = result.checks.find((c) => c.kind === 'settle')!;
    const mark = all(svg, 'g.settle-mark')[0]!;
    expect(mark.getAttribute('data-path')).toBe('flying-cap charge');
    expect(Number(mark.getAttribute('data-margin'))).toBeCloseTo(check.margin!, 18);
    const label = all(svg, 'text.settle-label')[0]!.textContent!;
    expect(label).toMatch(
      /^flying-cap charge: on together [\d.]+ ns \([\d.]+ ns at the worst duty\), needs [\d.]+ ns, margin \+[\d.]+ ns$/,
    );
  });

  it('hatch and flag a path that cannot settle', () => {
    const { result, svg } = doubler(['constraints.settle[0].capacitance=40pF']);
    expect(result.checks.find((c) => c.kind === 'settle')!.pass).toBe(false);
    expect(all(svg, 'text.settle-label')[0]!.textContent!.endsWith('\u2715 FAIL')).toBe(true);
    expect(all(svg, 'rect.settle-needed').some((r) => (r.getAttribute('fill') ?? '').startsWith('url('))).toBe(true);
  });
});
