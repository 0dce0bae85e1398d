/**
 * The review page: one self-contained HTML file (inline CSS and SVG, nothing fetched) with the
 * verdict, cautions, summary, the worst-corner and all-corner diagrams, the margin chart, each
 * check's worst case, the corner table, the switches and the process card used.
 */
import type { ReportModel } from '../report-model.js';
import { formatEngineering, formatTime } from '../../units/format.js';
import { GLYPH } from '../palette.js';
import { escapeHtml as h } from './escape.js';
import { REPORT_CSS } from './style.js';
import {
  cardRows,
  confirmTables,
  cornerRows,
  fmaxText,
  generatorText,
  failingParts,
  summaryItems,
  tuneTable,
  verdictPartText,
  verdictWord,
} from '../report-text.js';
import { renderTuneChart } from '../svg/tune-chart.js';
import type { TuneReport } from '../../report/tune-report.js';
import { mcHead, mcHeadline, mcRows, mcShownNote } from '../mc-section.js';
import { formatMargin } from '../../report/margin-format.js';
import { levelText, nodeTable } from '../node-table.js';
import { provenanceLines } from '../../report/provenance.js';
import { circuitSectionHtml } from './circuit-section.js';
import { circuitConfirmHtml } from './circuit-confirm.js';

function table(
  head: readonly string[],
  rows: ReadonlyArray<{ cells: readonly string[]; fail?: boolean }>,
  numeric: ReadonlySet<number>,
): string {
  const th = head.map((c) => `<th>${h(c)}</th>`).join('');
  const body = rows
    .map(
      (r) =>
        `<tr${r.fail ? ' class="fail"' : ''}>${r.cells
          .map((c, i) => `<td${numeric.has(i) ? ' class="num"' : i === r.cells.length - 1 ? ' class="verdict-cell"' : ''}>${h(c)}</td>`)
          .join('')}</tr>`,
    )
    .join('\n');
  return `<div class="table-wrap"><table><thead><tr>${th}</tr></thead><tbody>\n${body}\n</tbody></table></div>`;
}

/** The chart of the searched chains, when there is anything to plot. */
function tuneFigure(t: TuneReport): string {
  const svg = renderTuneChart(t);
  return svg
    ? figure(
        svg,
        'Every searched chain: its least margin (at the fast corner) across, its largest dead time beyond the requirement (wasted at the slow corner) up. Further right keeps more headroom; lower wastes less.',
        'figure-tune',
      )
    : '';
}

function figure(svg: string, caption: string, id: string): string {
  return `<figure id="${id}" class="diagram-figure">\n${svg.trim()}\n<figcaption>${h(caption)}</figcaption></figure>`;
}

export function renderHtmlReport(m: ReportModel): string {
  const r = m.report;
  const pass = m.verdict.verdict === 'pass';
  const lim = r.limiting;
  const passing = r.corners.filter((c) => c.verdict === 'pass').length;
  const failing = failingParts(m.verdict.parts);
  const verdictLine =
    `${failing ? `${failing}; ` : ''}${passing} of ${r.corners.length} corners pass` +
    (lim
      ? `; limiting: ${lim.check} at ${lim.corner}${lim.margin === null ? ' (not measurable)' : `, margin ${formatMargin(lim.margin, lim.kind)}`}`
      : '');
  const summary = summaryItems(m)
    .map(([k, v]) => `<dt>${h(k)}</dt><dd>${h(v)}</dd>`)
    .join('\n');
  const checkRows = m.checks.map((c) => ({
    cells: [
      c.kind,
      c.name,
      c.worst ? formatMargin(c.worst.margin, c.kind) : 'n/a',
      c.worst?.corner ?? c.unmeasured[0] ?? '',
      c.failing === 0 ? `${GLYPH.pass} holds at ${c.corners}` : `${GLYPH.fail} FAIL at ${c.failing}/${c.corners}`,
    ],
    fail: c.failing > 0,
  }));
  const corners = cornerRows(m).map((row, i) => ({ cells: row, fail: r.corners[i]!.verdict === 'fail' }));
  const [a, b] = r.phases as [string, string];
  const switches = m.resolved.design.switches.map((s, k) => ({
    cells: [
      s.name,
      s.type,
      s.gate + (s.gateBar ? ` / ${s.gateBar}` : ''),
      `${formatEngineering(s.w, 'm')} / ${formatEngineering(s.l, 'm')}`,
      s.levelShifter
        ? `level shifter ${formatTime(s.levelShifter.delay)}, ${levelText(s.levelShifter.low)} .. ${levelText(s.levelShifter.high)}`
        : s.driver.length > 0
          ? s.driver.map((d) => `${d.cell}x${d.size}`).join(' ')
          : 'direct',
      m.resolved.switches[k]!.declared ? m.resolved.switches[k]!.terminals.map((t) => t.name).join(' / ') : 'undeclared (signal form)',
      s.bulk === undefined ? 'default' : String(s.bulk),
    ],
  }));
  const nodes = nodeTable(m.resolved);
  const card = cardRows(m.resolved.card);
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${h(r.design)}: phasegap review</title>
<style>${REPORT_CSS}</style>
</head>
<body>
<main>
<header>
<h1>${h(r.design)}</h1>
${m.description ? `<p class="lede">${h(m.description)}</p>` : ''}
<div class="verdict ${pass ? 'pass' : 'fail'}" data-verdict="${m.verdict.verdict}"><strong>${verdictWord(m.verdict.verdict)}</strong><span>${h(verdictLine)}</span></div>
<ul class="verdict-parts" id="verdict-parts">
${m.verdict.parts.map((p) => `<li data-part="${h(p.name)}" data-verdict="${p.verdict}">${p.verdict === 'fail' ? `<strong>${h(verdictPartText(p))}</strong>` : h(verdictPartText(p))}</li>`).join('\n')}
</ul>
</header>
<section class="cautions" id="cautions">
<h2>Cautions</h2>
<ul>
${r.cautions.map((c) => `<li>${h(c)}</li>`).join('\n')}
</ul>
</section>
${
  r.warnings.length > 0
    ? `<section class="cautions" id="warnings">
<h2>Warnings: what the checks cannot see</h2>
<ul>
${r.warnings.map((w) => `<li>${h(w)}</li>`).join('\n')}
</ul>
</section>`
    : ''
}
<section id="summary">
<h2>Summary</h2>
<dl class="summary">
${summary}
</dl>
</section>
<section class="diagram" id="worst-corner">
<h2>Worst corner: ${h(m.worstCorner)}</h2>
${figure(m.svg.worst, `Timing at ${m.worstCorner}, the corner of the limiting check. Dimension marks give each dead time and break-before-make gap in picoseconds.`, 'figure-worst')}
</section>
<section class="diagram" id="all-corners">
<h2>All corners overlaid</h2>
${figure(m.svg.all, 'Each edge drawn as the band its corners span, from the earliest to the latest; the line is the worst corner. The marks give the least and the most dead time and the corners where they occur.', 'figure-all')}
</section>
<section class="diagram" id="margins">
<h2>Margins</h2>
${figure(m.svg.margins, 'Margin of every check at every corner; left of the zero line the requirement is not met.', 'figure-margins')}
<h3>Worst case of each check</h3>
${table(['kind', 'check', 'worst margin', 'at corner', 'verdict'], checkRows, new Set([2]))}
</section>
${m.circuit ? circuitSectionHtml(m.circuit, m.resolved.design.circuit!.output) : ''}
${
  m.tune
    ? (
        (t) => `<section id="tune">
<h2>Delay chains that pass with the least dead time</h2>
<p>${t.options.reduce((html, o) => html.split(h(o)).join(`<span class="option">${h(o)}</span>`), h(t.text))}</p>
${table(t.head, t.rows, new Set([1, 2, 3, 4, 5, 6]))}
${tuneFigure(m.tune!)}
</section>`
      )(tuneTable(m.tune))
    : ''
}
${
  m.confirm
    ? (
        (c) => `<section id="confirm">
<h2>Transistor-level confirmation (${h(m.confirm!.simulator)})</h2>
<p>${h(c.text)}</p>
${table(c.quantities.head, c.quantities.rows, new Set([2, 3, 4]))}
${c.pairs.rows.length > 0 ? table(c.pairs.head, c.pairs.rows, new Set([2, 3])) : ''}${c.circuit.map((t) => `\n${circuitConfirmHtml(t)}`).join('')}
</section>`
      )(confirmTables(m.confirm, r.model))
    : ''
}
${
  m.mc
    ? `<section class="diagram" id="montecarlo">
<h2>Monte Carlo mismatch</h2>
<p>${h(mcHeadline(m.mc.report))}</p>
${table(
  mcHead(m.mc.report),
  mcRows(m.mc.report).map((cells) => ({ cells })),
  new Set([1, 2, 3, 4, 5, 6]),
)}
${mcShownNote(m.mc.report) ? `<p class="table-note" id="mc-shown">${h(mcShownNote(m.mc.report))}</p>` : ''}
${figure(m.mc.histogram, `Dead times of every die at ${m.mc.report.worstCorner}; dashed lines are the dead-time requirements (past an axis break when far from the dies), the solid line the mean, dotted lines mean ± sigma. Sigma margin = mean margin / sigma.`, 'figure-histogram')}
</section>`
    : ''
}
<section id="corners">
<h2>Corner table</h2>
${table(['corner', `dead ${a}→${b}`, `dead ${b}→${a}`, `gap ${a}→${b}`, `gap ${b}→${a}`, `width ${a}`, `width ${b}`, 'least margin', 'verdict'], corners, new Set([1, 2, 3, 4, 5, 6, 7]))}
</section>
${
  switches.length > 0
    ? `<section id="switches">
<h2>Switches</h2>
${table(['switch', 'type', 'gate net', 'W / L', 'drive', 'terminals', 'body'], switches, new Set())}
</section>`
    : ''
}
${
  nodes.rows.length > 0
    ? `<section id="nodes">
<h2>Node voltages per phase</h2>
<p>What each switch terminal sees while each phase is active and in the dead time, as declared under <code>nodes</code>; volts at the card's nominal supply (${h(formatEngineering(m.resolved.card.vddNominal, 'V'))}). The off-state, on-state and stress checks read these at every corner's supply.</p>
${table(nodes.head, nodes.rows, new Set())}
</section>`
    : ''
}
<section id="process">
<h2>Process card used: ${h(m.resolved.card.name)}</h2>
<p>${h((m.resolved.card.description ?? '').replace(/([^.])$/, '$1.'))} Source: <code>${h(m.processSource)}</code>. Generator: ${h(generatorText(m))}.</p>
${table(
  card.head,
  card.rows.map((cells) => ({ cells })),
  new Set([1, 2]),
)}
${table(
  ['process corner', 'n: dVth', 'n: drive', 'p: dVth', 'p: drive'],
  Object.entries(m.resolved.card.corners).map(([name, c]) => ({
    cells: [name, formatEngineering(c.n.dvth, 'V'), `x${c.n.drive}`, formatEngineering(c.p.dvth, 'V'), `x${c.p.drive}`],
  })),
  new Set([1, 2, 3, 4]),
)}
</section>
<footer>phasegap${m.provenance ? ` ${h(m.provenance.version)}` : ''} · ${h(r.model)} delay model · ${h(fmaxText(m))} · times are SI; dead times at the 50 % points, gaps at 10 % of the swing.
${
  m.provenance
    ? `<ul class="provenance" id="provenance">
${provenanceLines(m.provenance)
  .map((l) => `<li>${h(l)}</li>`)
  .join('\n')}
</ul>`
    : ''
}</footer>
</main>
</body>
</html>
`;
}
