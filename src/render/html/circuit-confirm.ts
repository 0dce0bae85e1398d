/** The circuit against the simulator in the review page's confirmation section, a table per corner. */
import type { CircuitConfirmTable } from '../circuit-confirm.js';
import { escapeHtml as h } from './escape.js';

/** model, simulator and difference: right-aligned. */
const NUMERIC: ReadonlySet<number> = new Set([1, 2, 3]);

/** SI number as an attribute, empty when the simulator did not measure it. */
function si(v: number | null): string {
  return v === null ? '' : String(v);
}

/** One corner's table; each row carries the figure's SI values (data-model, data-simulator, data-difference, data-tolerance). */
export function circuitConfirmHtml(t: CircuitConfirmTable): string {
  const th = t.head.map((c) => `<th>${h(c)}</th>`).join('');
  const last = t.head.length - 1;
  const rows = t.rows
    .map((r) => {
      const f = r.figure;
      const attrs = `data-figure="${h(f.figure)}" data-model="${si(f.model)}" data-simulator="${si(f.simulator)}" data-difference="${si(f.difference)}" data-tolerance="${si(f.tolerance)}"`;
      const cells = r.cells
        .map((c, i) => `<td${NUMERIC.has(i) ? ' class="num"' : i === last ? ' class="verdict-cell"' : ''}>${h(c)}</td>`)
        .join('');
      return `<tr${r.fail ? ' class="fail"' : ''} ${attrs}>${cells}</tr>`;
    })
    .join('\n');
  return `<h3>${h(t.title)}</h3>
<p class="table-note">${h(t.note)}</p>
<div class="table-wrap"><table class="circuit-confirm" data-corner="${h(t.corner)}" data-pass="${t.pass}"><thead><tr>${th}</tr></thead><tbody>
${rows}
</tbody></table></div>`;
}
