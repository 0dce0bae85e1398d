/** The review page's own stylesheet, screen and print; no web fonts, nothing fetched. */
import { FAIL, FAIL_TINT, FONT, GRID, INK, MONO, MUTED, PANEL, PHASE } from '../palette.js';

export const REPORT_CSS = `
:root { color-scheme: light; }
* { box-sizing: border-box; }
body { margin: 0; font-family: ${FONT}; color: ${INK}; background: #eef0f3; font-size: 15px; line-height: 1.45; }
main { max-width: 1260px; margin: 0 auto; padding: 24px 28px 48px; background: #ffffff; }
h1 { font-size: 26px; margin: 0 0 4px; }
h2 { font-size: 19px; margin: 34px 0 10px; padding-bottom: 4px; border-bottom: 2px solid ${GRID}; }
p.lede { margin: 0 0 14px; color: ${MUTED}; }
.verdict { display: flex; gap: 18px; align-items: center; padding: 12px 16px; border: 2px solid ${INK}; border-radius: 6px; margin: 14px 0; }
.verdict strong { font-size: 22px; }
.verdict.fail { border-color: ${FAIL}; background: repeating-linear-gradient(45deg, ${FAIL_TINT} 0 8px, #ffffff 8px 16px); }
.verdict.fail strong { color: ${FAIL}; }
.cautions { border-left: 6px solid ${PHASE[1]}; background: #fbf3e8; padding: 10px 16px; margin: 16px 0; }
.cautions h2 { border: 0; margin: 4px 0 6px; font-size: 16px; }
.cautions li { margin: 4px 0; }
dl.summary { display: grid; grid-template-columns: max-content 1fr; gap: 4px 18px; margin: 0; }
dl.summary dt { color: ${MUTED}; }
dl.summary dd { margin: 0; }
figure { margin: 12px 0 26px; break-inside: avoid; }
figure svg { display: block; width: 100%; height: auto; border: 1px solid ${GRID}; }
figcaption { color: ${MUTED}; font-size: 13px; margin-top: 6px; }
table { border-collapse: collapse; font-size: 13px; margin: 8px 0 18px; }
th, td { border-bottom: 1px solid ${GRID}; padding: 4px 10px; text-align: left; vertical-align: top; }
th { background: ${PANEL}; font-weight: bold; }
td.num { text-align: right; font-family: ${MONO}; white-space: nowrap; }
.option { font-family: ${MONO}; white-space: nowrap; }
tr.fail td { background: ${FAIL_TINT}; }
tr.fail td.verdict-cell { color: ${FAIL}; font-weight: bold; }
td.fail-cell { color: ${FAIL}; font-weight: bold; background: repeating-linear-gradient(45deg, ${FAIL_TINT} 0 4px, #ffffff 4px 8px); }
tr.required th { white-space: nowrap; font-weight: normal; color: ${MUTED}; background: #ffffff; }
.table-wrap { overflow-x: auto; }
code { font-family: ${MONO}; font-size: 13px; }
footer { margin-top: 36px; color: ${MUTED}; font-size: 12px; }
@media print {
  @page { size: A4 portrait; margin: 12mm 11mm 14mm; }
  body { background: #ffffff; font-size: 9.5pt; line-height: 1.35; }
  main { max-width: none; padding: 0; }
  h1 { font-size: 18pt; }
  h2 { font-size: 13pt; margin: 0 0 6px; break-after: avoid; }
  h3 { break-after: avoid; }
  main > section:not(.cautions):not(#summary) { break-before: page; }
  figure { margin: 6px 0 10px; }
  figure svg { border: 0; width: auto; max-width: 100%; max-height: 250mm; margin: 0 auto; }
  figcaption { font-size: 8pt; }
  .table-wrap { overflow: visible; }
  table { font-size: 7.5pt; margin: 4px 0 10px; width: 100%; }
  th, td { padding: 2px 5px; }
  thead { display: table-header-group; }
  tr { break-inside: avoid; }
  p, li { orphans: 3; widows: 3; }
  footer { margin-top: 12px; }
  .verdict, .cautions, tr.fail td, td.fail-cell, th { -webkit-print-color-adjust: exact; print-color-adjust: exact; }
}
`;
