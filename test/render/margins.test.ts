import { describe, expect, it } from 'vitest';
import { evaluateAll } from '../../src/analysis/evaluate.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { loadDesign } from '../../src/cli/load.js';
import { marginRows, processOrder } from '../../src/render/margins.js';
import { marginChartInput } from '../../src/render/report-model.js';
import { decadeTicks, marginTickLabel, renderMarginSvg, voltTickLabel } from '../../src/render/svg/margins.js';
import { design } from '../helpers.js';
import { all, parseSvg } from './svg-dom.js';

const { design: d, card } = loadDesign(design('too-tight'));
const resolved = resolveDesign(d, card);
const results = evaluateAll(resolved);

describe('marginRows', () => {
  it('has one row per check with one point per corner, counting failures', () => {
    const rows = marginRows(results);
    const names = [...new Set(results.flatMap((r) => r.checks.map((c) => c.name)))];
    expect(rows.map((r) => r.name)).toEqual(names);
    for (const row of rows) {
      const checks = results.flatMap((r) => r.checks.filter((c) => c.name === row.name));
      expect(row.corners).toBe(checks.length);
      expect(row.failing).toBe(checks.filter((c) => !c.pass).length);
      expect(row.points.length + row.unmeasured.length).toBe(checks.length);
      expect(row.worst?.margin).toBe(Math.min(...checks.map((c) => c.margin ?? Infinity)));
    }
  });

  it('lists process corners in the order the corners do', () => {
    expect(processOrder(results)).toEqual(['tt', 'ss', 'ff', 'fs', 'sf']);
  });
});

describe('decadeTicks', () => {
  it('puts zero and whole decades from 10 ps inside the domain', () => {
    expect(decadeTicks(-150e-12, 2e-9).map(marginTickLabel)).toEqual(['-100 ps', '-10 ps', '0', '+10 ps', '+100 ps', '+1 ns']);
  });
});

describe('renderMarginSvg', () => {
  const svg = parseSvg(renderMarginSvg(marginChartInput(resolved, results)));

  it('draws one marker per measured margin and rings the worst of each row', () => {
    const rows = marginRows(results);
    const groups = all(svg, 'g.margin-row');
    expect(groups.map((g) => g.getAttribute('data-check'))).toEqual(rows.map((r) => r.name));
    groups.forEach((g, i) => {
      expect(all(g, '.marker').length).toBe(rows[i]!.points.length);
      expect(all(g, '.worst-ring').length).toBe(rows[i]!.worst ? 1 : 0);
    });
  });

  it('says FAIL in words on every failing row and marks the zero line as the requirement', () => {
    const rows = marginRows(results);
    const verdicts = all(svg, 'text.verdict-label').map((t) => t.textContent ?? '');
    rows.forEach((r, i) => {
      expect(verdicts[i]).toBe(r.failing > 0 ? `\u2715 FAIL at ${r.failing}/${r.corners}` : `\u2713 holds at all ${r.corners}`);
    });
    // One zero line per block: the timing checks and the switch bias checks.
    expect(all(svg, 'line.zero-line').length).toBe(2);
    expect(all(svg, 'text.zero-label')[0]!.textContent).toBe('requirement (margin 0)');
  });

  it('places the zero line where the axis puts a zero margin', () => {
    const zero = all(svg, 'line.zero-line')[0]!;
    const tick = all(svg, 'text.tick-label').find((t) => t.textContent === '0')!;
    expect(Number(zero.getAttribute('x1'))).toBe(Number(tick.getAttribute('x')));
  });
});

describe('renderMarginSvg: switch bias block', () => {
  const svg = parseSvg(renderMarginSvg(marginChartInput(resolved, results)));

  it('puts the volt-margin checks (off-state, on-state, stress) in their own block on a volt axis', () => {
    const blocks = all(svg, 'g.margin-block');
    expect(blocks.map((b) => b.getAttribute('data-unit'))).toEqual(['s', 'V']);
    const kinds = all(blocks[1]!, 'g.margin-row').map((g) => g.getAttribute('data-kind'));
    expect(new Set(kinds)).toEqual(new Set(['off-state', 'on-state', 'stress']));
    expect(all(blocks[0]!, 'g.margin-row').some((g) => ['off-state', 'on-state', 'stress'].includes(g.getAttribute('data-kind') ?? ''))).toBe(false);
    const ticks = all(blocks[1]!, 'text.tick-label').map((t) => t.textContent);
    expect(ticks).toContain('+100 mV');
    expect(ticks).toContain('+1 V');
  });

  it('writes each bias row\'s worst margin in volts', () => {
    const rows = marginRows(results).filter((r) => r.kind === 'off-state');
    const labels = all(svg, 'g.margin-row[data-kind="off-state"] text.worst-label').map((t) => t.textContent);
    // 55 mV: V_T 0.292 V at ff/125C less two decades at n = 1.5 (see test/checks/bias-checks.test.ts for the rule).
    expect(labels).toEqual(rows.map((r) => `+${Math.round(r.worst!.margin * 1e3)} mV at ${r.worst!.corner}`));
  });
});

describe('voltTickLabel', () => {
  it('labels decades in mV below 1 V and in V above', () => {
    expect(decadeTicks(-0.15, 2, [-2, 1]).map(voltTickLabel)).toEqual(['-100 mV', '-10 mV', '0', '+10 mV', '+100 mV', '+1 V']);
  });
});
