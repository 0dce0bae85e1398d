/**
 * The review page as Markdown for a wiki or a merge request: the same sections as the HTML page,
 * with the three drawings as SVG files beside it (their names are given by the caller).
 */
import type { ReportModel } from '../report-model.js';
import { GLYPH } from '../palette.js';
import {
  cardRows,
  confirmTables,
  cornerRows,
  fmaxText,
  failingParts,
  summaryItems,
  tuneTable,
  verdictPartText,
  verdictWord,
} from '../report-text.js';
import { formatMargin } from '../../report/margin-format.js';
import { nodeTable } from '../node-table.js';
import { provenanceLines } from '../../report/provenance.js';
import { mcHead, mcHeadline, mcRows, mcShownNote } from '../mc-section.js';
import { markdownCode, markdownLine, markdownParagraph, markdownText, markdownUrl } from './text.js';

export interface MarkdownImages {
  readonly worst: string;
  readonly all: string;
  readonly margins: string;
  /** The Monte Carlo histogram, when the model has Monte Carlo results. */
  readonly histogram?: string;
}

function cell(text: string): string {
  return markdownText(text);
}

function table(head: readonly string[], rows: ReadonlyArray<readonly string[]>, right: ReadonlySet<number>): string {
  const line = (cells: readonly string[]) => `| ${cells.map(cell).join(' | ')} |`;
  const rule = `|${head.map((_, i) => (right.has(i) ? ' ---: ' : ' --- ')).join('|')}|`;
  return [line(head), rule, ...rows.map(line)].join('\n');
}

export function renderMarkdownReport(m: ReportModel, images: MarkdownImages): string {
  const r = m.report;
  const [a, b] = r.phases as [string, string];
  const out: string[] = [];
  out.push(`# ${markdownText(r.design)}`, '');
  if (m.description) out.push(markdownParagraph(m.description), '');
  const failing = failingParts(m.verdict.parts);
  out.push(
    `**${verdictWord(m.verdict.verdict)}**: ${failing ? `${markdownText(failing)}; ` : ''}${r.corners.filter((c) => c.verdict === 'pass').length} of ${r.corners.length} corners pass.`,
    '',
  );
  for (const p of m.verdict.parts)
    out.push(`- ${p.verdict === 'fail' ? `**${markdownText(verdictPartText(p))}**` : markdownText(verdictPartText(p))}`);
  out.push('');
  out.push('> **Cautions**', '>');
  for (const c of r.cautions) out.push(`> - ${c}`);
  if (r.warnings.length > 0) {
    out.push('', '> **Warnings: what the checks cannot see**', '>');
    for (const w of r.warnings) out.push(`> - ${markdownText(w)}`);
  }
  out.push('', '## Summary', '');
  for (const [k, v] of summaryItems(m)) out.push(`- **${markdownText(k)}**: ${markdownText(v)}`);
  const worst = markdownText(m.worstCorner);
  out.push('', `## Worst corner: ${worst}`, '', `![Timing diagram at ${worst}](${markdownUrl(images.worst)})`, '');
  out.push('## All corners overlaid', '', `![All corners overlaid](${markdownUrl(images.all)})`, '');
  out.push('## Margins', '', `![Margin of every check at every corner](${markdownUrl(images.margins)})`, '');
  out.push(
    table(
      ['kind', 'check', 'worst margin', 'at corner', 'verdict'],
      m.checks.map((c) => [
        c.kind,
        c.name,
        c.worst ? formatMargin(c.worst.margin, c.kind) : 'n/a',
        c.worst?.corner ?? c.unmeasured[0] ?? '',
        c.failing === 0 ? `${GLYPH.pass} holds at ${c.corners}` : `${GLYPH.fail} FAIL at ${c.failing}/${c.corners}`,
      ]),
      new Set([2]),
    ),
    '',
  );
  if (m.circuit) {
    const c = m.circuit;
    out.push(`## Circuit: ${markdownText(m.resolved.design.circuit!.output)} at every corner`, '', markdownParagraph(c.note), '');
    out.push(
      table(
        c.head,
        [
          c.required,
          ...c.rows.map((r) => [
            r.corner,
            ...(r.cells.length > 0
              ? r.cells.map((x) => `${x.text}${x.pass === false ? ` ${GLYPH.fail}` : ''}`)
              : c.head.slice(2).map(() => '-')),
            r.verdict,
          ]),
        ],
        new Set([1, 2, 3, 4, 5, 6, 7]),
      ),
      '',
    );
  }
  if (m.tune) {
    const t = tuneTable(m.tune);
    out.push('## Delay chains that pass with the least dead time', '', markdownLine(t.text), '');
    out.push(
      table(
        t.head,
        t.rows.map((row) => row.cells),
        new Set([1, 2, 3, 4, 5, 6]),
      ),
      '',
    );
  }
  if (m.confirm) {
    const c = confirmTables(m.confirm, r.model);
    out.push(`## Transistor-level confirmation (${markdownText(m.confirm.simulator)})`, '', markdownLine(c.text), '');
    out.push(
      table(
        c.quantities.head,
        c.quantities.rows.map((row) => row.cells),
        new Set([2, 3, 4]),
      ),
      '',
    );
    if (c.pairs.rows.length > 0)
      out.push(
        table(
          c.pairs.head,
          c.pairs.rows.map((row) => row.cells),
          new Set([2, 3]),
        ),
        '',
      );
    for (const t of c.circuit) {
      out.push(`### ${markdownText(t.title)}`, '', markdownLine(t.note), '');
      out.push(
        table(
          t.head,
          t.rows.map((row) => row.cells),
          new Set([1, 2, 3]),
        ),
        '',
      );
    }
  }
  if (m.mc) {
    out.push('## Monte Carlo mismatch', '', markdownLine(mcHeadline(m.mc.report)), '');
    out.push(table(mcHead(m.mc.report), mcRows(m.mc.report), new Set([1, 2, 3, 4, 5, 6])), '');
    if (mcShownNote(m.mc.report)) out.push(markdownLine(mcShownNote(m.mc.report)), '');
    if (images.histogram)
      out.push(`![Dead times of every die at ${markdownText(m.mc.report.worstCorner)}](${markdownUrl(images.histogram)})`, '');
  }
  out.push('## Corner table', '');
  out.push(
    table(
      [
        'corner',
        `dead ${a}→${b}`,
        `dead ${b}→${a}`,
        `gap ${a}→${b}`,
        `gap ${b}→${a}`,
        `width ${a}`,
        `width ${b}`,
        'least margin',
        'verdict',
      ],
      cornerRows(m),
      new Set([1, 2, 3, 4, 5, 6, 7]),
    ),
    '',
  );
  const nodes = nodeTable(m.resolved);
  if (nodes.rows.length > 0) {
    out.push(
      '## Node voltages per phase',
      '',
      `Volts at the card's nominal supply; the bias checks read these at every corner's supply.`,
      '',
    );
    out.push(
      table(
        nodes.head,
        nodes.rows.map((row) => row.cells),
        new Set(),
      ),
      '',
    );
  }
  const card = cardRows(m.resolved.card);
  out.push(
    `## Process card used: ${markdownText(m.resolved.card.name)}`,
    '',
    `${markdownLine(`${m.resolved.card.description ?? ''}`)} Source: ${markdownCode(m.processSource)}.`.trimStart(),
    '',
  );
  out.push(table(card.head, card.rows, new Set([1, 2])), '');
  out.push(
    `---`,
    `phasegap${m.provenance ? ` ${markdownText(m.provenance.version)}` : ''} · ${markdownText(r.model)} delay model · ${markdownText(fmaxText(m))}`,
    '',
  );
  if (m.provenance) out.push(...provenanceLines(m.provenance).map((l) => `- ${markdownText(l)}`), '');
  return out.join('\n');
}
