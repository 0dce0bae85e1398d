/** The review page's circuit section: the per-corner figures against the requirements, and the frequency chart. */
import type { CircuitSection } from '../circuit-section.js';
import { GLYPH } from '../palette.js';
import { escapeHtml as h } from './escape.js';

function cell(c: CircuitSection['rows'][number]['cells'][number]): string {
  const fail = c.pass === false;
  const attrs = `class="num${fail ? ' fail-cell' : ''}"${c.value === null ? '' : ` data-value="${c.value}"`}${c.pass === null ? '' : ` data-pass="${c.pass}"`}`;
  return `<td ${attrs}>${h(c.text)}${fail ? ` ${GLYPH.fail}` : ''}</td>`;
}

export function circuitSectionHtml(s: CircuitSection, output: string): string {
  const head = `<tr>${s.head.map((x) => `<th>${h(x)}</th>`).join('')}</tr>\n<tr class="required">${s.required.map((x) => `<th>${h(x)}</th>`).join('')}</tr>`;
  const rows = s.rows
    .map((r) => {
      const cells = r.cells.length > 0 ? r.cells.map(cell).join('') : `<td colspan="${s.head.length - 2}">-</td>`;
      return `<tr${r.pass ? '' : ' class="fail"'} data-corner="${h(r.corner)}"><td>${h(r.corner)}</td>${cells}<td class="verdict-cell">${h(r.verdict)}</td></tr>`;
    })
    .join('\n');
  return `<section id="circuit">
<h2>Circuit: ${h(output)} at every corner</h2>
<p class="table-note">${h(s.note)}</p>
<div class="table-wrap"><table class="circuit-figures"><thead>${head}</thead><tbody>
${rows}
</tbody></table></div>
<figure id="figure-circuit-sweep" class="diagram-figure">
${s.chart.trim()}
<figcaption>${h(`Mean output and efficiency at ${s.sweep.series[0]?.points.length ?? 0} clock frequencies from a quarter to twice the design's, at ${s.sweep.series.map((x) => `${x.corner} (${x.role})`).join(' and ')}; dashed lines are the requirements, the vertical line the design's frequency.`)}</figcaption></figure>
</section>`;
}
