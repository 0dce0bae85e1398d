import { describe, expect, it } from 'vitest';
import { evaluateAll } from '../../src/analysis/evaluate.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { loadDesign } from '../../src/cli/load.js';
import { marginRows, processOrder } from '../../src/render/margins.js';
import { marginChartInput } from '../../src/render/report-model.js';
import {
  chargeTickLabel,
  decadeTicks,
  fractionTickLabel,
  marginTickLabel,
  renderMarginSvg,
  voltTickLabel,
} from '../../src/render/svg/margins.js';
import { textWidth } from '../../src/render/svg/text.js';
import { modelErrorText } from '../../src/report/model-error.js';
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

  it('wraps the title note with the whole model-error statement inside the page, under the verdict box, and draws below it', () => {
    const width = Number(svg.getAttribute('width'));
    const lines = all(svg, '.title-block text.subtitle').slice(1);
    // The note carries the band and its gap sentence in full (it ran off the page on one line).
    expect(lines.length).toBe(3);
    expect(lines.map((t) => t.textContent).join(' ')).toContain(modelErrorText('analytic', 'generic180', true));
    for (const t of lines) expect(16 + textWidth(t.textContent ?? '', 11)).toBeLessThanOrEqual(width - 16);
    // The verdict box ends above the first note line's cap height (11 px text at y 76).
    const box = svg.querySelector('.title-block rect')!;
    expect(Number(box.getAttribute('y')) + Number(box.getAttribute('height'))).toBeLessThan(76 - 0.75 * 11);
    // The rule under the title sits below the last note line, and the chart's first row below the rule.
    const rule = svg.querySelector('.title-block line')!;
    expect(Number(rule.getAttribute('y1'))).toBeGreaterThan(Number(lines[1]!.getAttribute('y')));
    const label = all(svg, 'text.zero-label')[0]!;
    expect(Number(label.getAttribute('y'))).toBeGreaterThan(Number(rule.getAttribute('y1')) + 11);
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
    expect(
      all(blocks[0]!, 'g.margin-row').some((g) => ['off-state', 'on-state', 'stress'].includes(g.getAttribute('data-kind') ?? '')),
    ).toBe(false);
    const ticks = all(blocks[1]!, 'text.tick-label').map((t) => t.textContent);
    expect(ticks).toContain('+100 mV');
    expect(ticks).toContain('+1 V');
  });

  it("writes each bias row's worst margin in volts", () => {
    const rows = marginRows(results).filter((r) => r.kind === 'off-state');
    const labels = all(svg, 'g.margin-row[data-kind="off-state"] text.worst-label').map((t) => t.textContent);
    // +38 mV (s_low) and +15 mV (s_high) at ff/1.62V/125C: V_T 0.251 V (n) and 0.229 V (p) there, the card's triode
    // threshold law (SPICE level 3's, which ngspice-39 gives as 0.3114 / 0.2887 V at tt/125C: test/process/device.test.ts),
    // less the 1.8 decades too-tight accepts at n = 1.5, 213 mV (see test/checks/bias-checks.test.ts for the rule).
    expect(labels).toEqual(rows.map((r) => `+${Math.round(r.worst!.margin * 1e3)} mV at ${r.worst!.corner}`));
    expect(labels).toEqual(['+38 mV at ff/1.62V/125C', '+15 mV at ff/1.62V/125C']);
  });
});

describe('voltTickLabel', () => {
  it('labels decades in mV below 1 V and in V above', () => {
    expect(decadeTicks(-0.15, 2, [-2, 1]).map(voltTickLabel)).toEqual(['-100 mV', '-10 mV', '0', '+10 mV', '+100 mV', '+1 V']);
  });
});

describe('renderMarginSvg: circuit checks', () => {
  const loaded = loadDesign(design('doubler-pump'), ['corners.process=[tt, ss]', 'corners.vdd=[1.8V]', 'corners.temperature=[27]']);
  const pump = resolveDesign(loaded.design, loaded.card);
  const pumpResults = evaluateAll(pump);
  const svg = parseSvg(renderMarginSvg(marginChartInput(pump, pumpResults)));
  const blocks = all(svg, 'g.margin-block');
  const kindsIn = (b: Element) => all(b, 'g.margin-row').map((g) => g.getAttribute('data-kind'));

  it('draws every check of the design, each in the block of its margin unit', () => {
    expect(blocks.map((b) => b.getAttribute('data-unit'))).toEqual(['s', 'V', 'C', '']);
    const names = [...new Set(pumpResults.flatMap((r) => r.checks.map((c) => c.name)))];
    expect(
      all(svg, 'g.margin-row')
        .map((g) => g.getAttribute('data-check'))
        .sort(),
    ).toEqual(names.sort());
    expect(kindsIn(blocks[1]!)).toEqual(expect.arrayContaining(['output-min', 'output-max', 'ripple-max', 'off-state']));
    expect(kindsIn(blocks[2]!)).toEqual(['lost-charge-max']);
    expect(kindsIn(blocks[3]!)).toEqual(['efficiency-min']);
  });

  it('labels the charge block in fC and pC and the efficiency block in %', () => {
    const ticks = (b: Element) => all(b, 'text.tick-label').map((t) => t.textContent);
    expect(ticks(blocks[2]!)).toEqual(expect.arrayContaining(['+10 fC', '+100 fC', '+1 pC']));
    expect(ticks(blocks[3]!)).toEqual(expect.arrayContaining(['-1 %', '0', '+1 %', '+10 %']));
    const worst = (kind: string) => all(svg, `g.margin-row[data-kind="${kind}"] text.worst-label`)[0]!.textContent;
    const margin = (kind: string) => Math.min(...pumpResults.flatMap((r) => r.checks.filter((c) => c.kind === kind).map((c) => c.margin!)));
    expect(worst('efficiency-min')).toMatch(new RegExp(`^\\+${(margin('efficiency-min') * 100).toFixed(1)} % at `));
    expect(worst('lost-charge-max')).toMatch(new RegExp(`^\\+${(margin('lost-charge-max') * 1e12).toFixed(2)} pC at `));
    const heads = all(svg, 'text.column-head').map((t) => t.textContent);
    expect(heads).toEqual(expect.arrayContaining(['voltage checks', 'circuit charge checks', 'circuit efficiency checks']));
  });
});

describe('chargeTickLabel and fractionTickLabel', () => {
  it('label decades in fC, pC and nC, and fractions in percent', () => {
    expect(decadeTicks(-20e-15, 2e-9, [-14, -9]).map(chargeTickLabel)).toEqual([
      '-10 fC',
      '0',
      '+10 fC',
      '+100 fC',
      '+1 pC',
      '+10 pC',
      '+100 pC',
      '+1 nC',
    ]);
    expect(decadeTicks(-0.05, 0.5, [-2, 0]).map(fractionTickLabel)).toEqual(['-1 %', '0', '+1 %', '+10 %']);
  });
});

describe('renderMarginSvg marks for unmeasured checks and named constraints', () => {
  const chart = (name: string, set: string[] = []) => {
    const loaded = loadDesign(design(name), set);
    const r = resolveDesign(loaded.design, loaded.card);
    return parseSvg(renderMarginSvg(marginChartInput(r, evaluateAll(r))));
  };

  it('draws a boxed ? for the corners with no margin, and explains it in the legend', () => {
    // s_chg's gate swing stops at 1.1 VDD: it never turns on, so its pairs cannot be measured anywhere.
    const doc = chart('doubler', ['switches[1].levelShifter.high=1.1vdd']);
    const rows = all(doc, 'g.margin-row').filter((g) => all(g, 'g.unmeasured-mark').length > 0);
    expect(rows.map((g) => g.getAttribute('data-check'))).toEqual([
      's_chg/s_out break-before-make + 100 ps',
      'flying-cap charge settles to 0.001',
    ]);
    for (const row of rows) {
      const mark = all(row, 'g.unmeasured-mark')[0]!;
      expect(mark.getAttribute('data-count')).toBe('45');
      expect(mark.getAttribute('data-corners')!.split(' ')).toHaveLength(45);
      expect(all(mark, 'text')[0]!.textContent).toBe('?');
    }
    const legend = all(doc, 'g.legend text').map((t) => t.textContent);
    expect(legend).toContain('not measured at that corner (counts as failing)');
    expect(all(doc, 'g.legend g.unmeasured-mark')).toHaveLength(1);
  });

  it('leaves the ? out of the legend when every check was measured', () => {
    const doc = chart('doubler');
    expect(all(doc, 'g.unmeasured-mark')).toHaveLength(0);
    expect(all(doc, 'g.legend text').map((t) => t.textContent)).not.toContain('not measured at that corner (counts as failing)');
  });

  it("writes a named order constraint's requirement under its name and no longer claims every name states one", () => {
    const doc = chart('sc-integrator');
    const row = all(doc, 'g.margin-row').find((g) => g.getAttribute('data-check') === 'bottom plate opens first')!;
    expect(all(row, 'text.check-requirement')[0]!.textContent).toBe('s1e off before s1 off by 50.0 ps');
    expect(all(doc, 'text.check-requirement')).toHaveLength(1);
    const note = all(doc, 'g.legend text.legend-note')[0]!.textContent!;
    expect(note).toContain('a named constraint shows its requirement under its name');
    expect(note).not.toContain('each check name states its requirement');
  });
});
