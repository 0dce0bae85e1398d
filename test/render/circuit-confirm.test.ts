import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { design, resolveYaml } from '../helpers.js';
import { evaluateAll } from '../../src/analysis/evaluate.js';
import { circuitConfirmTable, circuitConfirmTables } from '../../src/render/circuit-confirm.js';
import { circuitConfirmHtml } from '../../src/render/html/circuit-confirm.js';
import { buildReportModel } from '../../src/render/report-model.js';
import { renderHtmlReport } from '../../src/render/html/report.js';
import { renderMarkdownReport } from '../../src/render/markdown/report.js';
import { renderConfirmText } from '../../src/report/confirm-text.js';
import { verdictOf } from '../../src/report/verdict.js';
import type { CircuitComparison, CircuitFigureComparison, CornerComparison } from '../../src/report/confirm-report.js';

const fig = (
  figure: CircuitFigureComparison['figure'],
  unit: CircuitFigureComparison['unit'],
  model: number,
  simulator: number | null,
  difference: number | null,
  tolerance: number | null,
  pass: boolean,
): CircuitFigureComparison => ({ figure, unit, model, simulator, difference, tolerance, pass });

// Made up: the ripple is 12.7 % under the simulator's, over the 10 % tolerance.
const circuit: CircuitComparison = {
  periods: 75,
  drift: -1.5e-5,
  settled: true,
  pass: false,
  power: { model: { input: 214e-6, generator: 134e-6, output: 167e-6 }, simulator: { input: 225e-6, generator: 172e-6, output: 167e-6 } },
  figures: [
    fig('output', 'V', 3.345, 3.334, 0.0063, 0.02, true),
    fig('ripple', 'V', 0.0199, 0.0228, -0.127, 0.1, false),
    fig('efficiency', '', 0.481, 0.444, 0.082, 0.1, true),
    fig('lost charge', 'C', 0, 271e-15, null, null, true),
  ],
};

const timingOnly = (corner: string): CornerComparison => ({
  corner,
  quantities: [{ quantity: 'dead p1->p2', kind: 'dead', model: 1.0e-9, simulator: 0.98e-9, relativeError: 0.0204, pass: true }],
  breakBeforeMake: [],
  ron: [],
  errors: [],
  pass: true,
});

const comparisons: CornerComparison[] = [{ ...timingOnly('tt/1.8V/27C'), circuit, pass: false }, timingOnly('ss/1.62V/125C')];

describe('circuitConfirmTable', () => {
  it("gives figure, model, simulator, difference, tolerance and verdict per figure, in confirm's words", () => {
    const t = circuitConfirmTable('tt/1.8V/27C', circuit, 'ngspice-42');
    expect(t.title).toBe('Circuit against ngspice-42 at tt/1.8V/27C');
    expect(t.head).toEqual(['figure', 'model', 'ngspice-42', 'difference', 'tolerance', 'verdict']);
    expect(t.rows.map((r) => [...r.cells, r.fail])).toEqual([
      ['output', '3.35 V', '3.33 V', '+0.6 % of VDD', '±2.0 % of VDD', 'within', false],
      ['ripple', '19.9 mV', '22.8 mV', '-12.7 %', '±10.0 %', 'OVER', true],
      ['efficiency', '48.1 %', '44.4 %', '+8.2 %', '±10.0 %', 'within', false],
      ['lost charge', '0 C', '271 fC', '-', 'not judged', 'shown', false],
    ]);
    expect(t.pass).toBe(false);
    expect(t.note).toBe(
      "75 periods from the solver's steady state, settled (drift -15.0 uV per period); model rails 214 uW, generator 134 uW, load 167 uW; ngspice-42 rails 225 uW, generator 172 uW, load 167 uW",
    );
  });

  it('shows the same rows as the confirm command prints, less the corner column', () => {
    const text = renderConfirmText({ design: 'pump', model: 'analytic', simulator: 'ngspice-42', tolerance: 0.1, corners: comparisons });
    for (const r of circuitConfirmTable('tt/1.8V/27C', circuit, 'ngspice-42').rows) {
      const [figure, model, simulator, difference, , verdict] = r.cells;
      const line = text.split('\n').find((l) => l.startsWith('tt/1.8V/27C') && l.includes(` ${figure} `));
      expect(line?.split(/\s{2,}/), figure).toEqual(['tt/1.8V/27C', figure, model, simulator, difference, verdict]);
    }
  });

  it('says NOT SETTLED and "not measured" when the simulation did not settle and measured nothing', () => {
    const unsettled: CircuitComparison = {
      ...circuit,
      settled: false,
      drift: null,
      power: { ...circuit.power, simulator: null },
      figures: [fig('output', 'V', 3.345, null, null, 0.02, false)],
    };
    const t = circuitConfirmTable('ff/1.98V/-40C', unsettled, 'ngspice-42');
    expect(t.rows.map((r) => r.cells)).toEqual([['output', '3.35 V', 'not measured', '-', '±2.0 % of VDD', 'OVER']]);
    expect(t.note).toMatch(/^75 periods from the solver's steady state, NOT SETTLED \(drift not measured\);.* ngspice-42 not measured$/);
  });
});

describe('circuitConfirmTables', () => {
  it('has a table for each corner whose comparison carries the circuit, in order', () => {
    expect(circuitConfirmTables(comparisons, 'ngspice-42').map((t) => t.corner)).toEqual(['tt/1.8V/27C']);
    expect(circuitConfirmTables([timingOnly('tt/1.8V/27C')], 'ngspice-42')).toEqual([]);
  });
});

describe('circuitConfirmHtml', () => {
  it('marks the failing row and carries each figure in SI', () => {
    const html = circuitConfirmHtml(circuitConfirmTable('tt/1.8V/27C', circuit, 'ngspice-42'));
    expect(html).toContain('<h3>Circuit against ngspice-42 at tt/1.8V/27C</h3>');
    expect(html).toContain('<table class="circuit-confirm" data-corner="tt/1.8V/27C" data-pass="false">');
    expect(html).toContain(
      '<tr class="fail" data-figure="ripple" data-model="0.0199" data-simulator="0.0228" data-difference="-0.127" data-tolerance="0.1"><td>ripple</td><td class="num">19.9 mV</td><td class="num">22.8 mV</td><td class="num">-12.7 %</td><td>±10.0 %</td><td class="verdict-cell">OVER</td></tr>',
    );
    expect(html).toContain('<tr data-figure="lost charge" data-model="0" data-simulator="2.71e-13" data-difference="" data-tolerance="">');
  });
});

describe('the review page with a circuit confirmation', () => {
  // One corner of the demo doubler: the page needs a check report; the comparison is made up above.
  const resolved = resolveYaml(
    readFileSync(design('doubler'), 'utf8')
      .replace('process: [tt, ss, ff, fs, sf]', 'process: [tt]')
      .replace('vdd: [1.62V, 1.8V, 1.98V]', 'vdd: [1.8V]')
      .replace('temperature: [-40, 27, 125]', 'temperature: [27]'),
  );
  const confirm = { simulator: 'ngspice-42', tolerance: 0.1, comparisons };
  const model = buildReportModel(resolved, evaluateAll(resolved), { processSource: 'fixtures', fmax: null, fmaxNote: 'skipped', confirm });

  it("fails the page's verdict on a circuit figure exactly as confirm's verdict does", () => {
    const page = model.verdict.parts.find((p) => p.key === 'simulator');
    const own = verdictOf({ corners: null, mc: null, confirm, deadTime: resolved.design.requirements.deadTime }).parts.find(
      (p) => p.key === 'simulator',
    );
    expect(page).toEqual(own);
    expect(page).toEqual({
      key: 'simulator',
      name: 'simulator agreement',
      verdict: 'fail',
      reason: '1 circuit figure beyond tolerance (first: ripple at tt/1.8V/27C)',
    });
    expect(model.verdict.verdict).toBe('fail');
  });

  it('puts the table in the HTML confirmation section and in the Markdown', () => {
    const html = renderHtmlReport(model);
    const section = html.slice(html.indexOf('<section id="confirm">')).split('</section>')[0]!;
    expect(section).toContain('circuit figures within tolerance at 0 of 1;');
    expect(section.match(/<table class="circuit-confirm"/g)?.length).toBe(1);
    expect(html).toMatch(/<div class="verdict fail" data-verdict="fail"><strong>✕ FAIL<\/strong><span>fails: simulator agreement;/);
    const md = renderMarkdownReport(model, { worst: 'w.svg', all: 'a.svg', margins: 'm.svg' });
    expect(md).toContain('### Circuit against ngspice-42 at tt/1.8V/27C');
    expect(md).toContain('| figure | model | ngspice-42 | difference | tolerance | verdict |');
    expect(md).toContain('| ripple | 19.9 mV | 22.8 mV | -12.7 % | ±10.0 % | OVER |');
  });
});
