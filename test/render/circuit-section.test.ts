import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { design, resolveYaml } from '../helpers.js';
import { evaluateAll } from '../../src/analysis/evaluate.js';
import { circuitSection, CIRCUIT_HEAD } from '../../src/render/circuit-section.js';
import { circuitSectionHtml } from '../../src/render/html/circuit-section.js';
import { formatEngineering } from '../../src/units/format.js';
import { figureErrorText } from '../../src/circuit/figure-error.js';
import { buildReportModel } from '../../src/render/report-model.js';
import { renderMarkdownReport } from '../../src/render/markdown/report.js';

// Six of the demo's 45 corners (both supply ends, three processes): the section is per corner, and
// six show it at a seventh of the cost.
const sixCorners = readFileSync(design('doubler-unboosted-pump'), 'utf8')
  .replace('process: [tt, ss, ff, fs, sf]', 'process: [tt, ss, ff]')
  .replace('vdd: [1.62V, 1.8V, 1.98V]', 'vdd: [1.62V, 1.98V]')
  .replace('temperature: [-40, 27, 125]', 'temperature: [27]');
const unboosted = resolveYaml(sixCorners);
const results = evaluateAll(unboosted);
const section = circuitSection(unboosted, results)!;

describe('circuitSection', () => {
  it("has a row per corner; unsettled, it leaves the steady-state figures blank and keeps the design's own", () => {
    expect(section.rows.map((row) => row.corner.replace(' (unsettled)', ''))).toEqual([
      'tt/1.62V/27C',
      'tt/1.98V/27C',
      'ss/1.62V/27C',
      'ss/1.98V/27C',
      'ff/1.62V/27C',
      'ff/1.98V/27C',
    ]);
    section.rows.forEach((row, i) => {
      const c = results[i]!.circuit!;
      // The unboosted pump's switches cannot pass the charge: no corner settles, and the row says so. Where the
      // solver stopped is no output, ripple, efficiency or lost charge: those cells are blank ('-', no value).
      expect(c.method).toBe('none');
      expect(row.corner).toBe(`${results[i]!.corner.name} (unsettled)`);
      expect(row.cells.map((x) => x.value)).toEqual([null, null, null, c.slowLimit, c.fastLimit, null, null, c.startupTime]);
      for (const k of [0, 1, 2, 5, 6]) expect(row.cells[k]!.text).toBe('-');
      expect(row.cells[3]!.text).toBe(formatEngineering(c.slowLimit!, 'ohm'));
    });
  });

  it('marks each figure against its requirement: the unboosted pump, unsettled, misses every circuit requirement everywhere', () => {
    for (const row of section.rows) {
      expect(row.cells.map((x) => x.pass)).toEqual([false, false, null, null, null, false, false, null]);
      expect(row.pass).toBe(false);
      expect(row.verdict).toBe('✕ FAIL: output min, output max, ripple, efficiency, lost charge');
    }
    expect(section.required).toEqual(['required', '≥ 1.75vdd, ≤ 2vdd', '≤ 50.0 mV', '', '', '', '≥ 40.0 %', '≤ 1.00 pC', '', '']);
    expect(section.head).toEqual(CIRCUIT_HEAD);
    // The note closes with the circuit figures' measured error on the card (src/circuit/figure-error.ts), as a sentence.
    expect(section.note.endsWith(`${figureErrorText('generic180').replace(/^c/, 'C')}.`)).toBe(true);
  });

  it('lays the table out in HTML with each number and its SI value, failing cells marked without colour', () => {
    const html = circuitSectionHtml(section, 'out');
    const first = results[0]!.circuit!;
    const row = new RegExp(`<tr class="fail" data-corner="${results[0]!.corner.name} \\(unsettled\\)">(.*?)</tr>`).exec(html)![1]!;
    const cells = [...row.matchAll(/<td([^>]*)>(.*?)<\/td>/g)].map((m) => ({ attrs: m[1]!, text: m[2]! }));
    expect(cells.length).toBe(CIRCUIT_HEAD.length);
    // The blank output still carries its failing verdict, without a value.
    expect(cells[1]!.attrs).not.toContain('data-value');
    expect(cells[1]!.attrs).toContain('fail-cell');
    expect(cells[1]!.text).toBe('- ✕');
    expect(cells[2]!.attrs).toContain('data-pass="false"');
    expect(cells[4]!.attrs).toContain(`data-value="${first.slowLimit}"`);
    expect(html).toContain('id="figure-circuit-sweep"');
  });

  it('gives the Markdown page the same table, failing figures marked', () => {
    const model = buildReportModel(unboosted, results, { processSource: 'fixtures', fmax: null, fmaxNote: 'skipped' });
    const md = renderMarkdownReport(model, { worst: 'w.svg', all: 'a.svg', margins: 'm.svg' });
    expect(md).toContain('## Circuit: out at every corner');
    const c = results[0]!.circuit!;
    const line = md.split('\n').find((l) => l.startsWith(`| ${results[0]!.corner.name} (unsettled) |`))!;
    expect(line.split(' | ').slice(1, 5)).toEqual(['- ✕', '- ✕', '-', formatEngineering(c.slowLimit!, 'ohm')]);
    expect(line.endsWith('| ✕ FAIL: output min, output max, ripple, efficiency, lost charge |')).toBe(true);
  });

  it('is null for a design without a circuit', () => {
    const plain = resolveYaml(readFileSync(design('doubler'), 'utf8'));
    expect(circuitSection(plain, [])).toBeNull();
  });
});
