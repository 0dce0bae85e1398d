/** `phasegap report DESIGN -o FILE.html`: the self-contained review page (or Markdown with SVGs beside it). */
import { basename, dirname, extname, join } from 'node:path';
import { evaluateAll } from '../../analysis/evaluate.js';
import { findFmax, type FmaxResult } from '../../analysis/fmax.js';
import { resolveDesign } from '../../analysis/resolve.js';
import { inputError } from '../../errors.js';
import { renderHtmlReport } from '../../render/html/report.js';
import { renderMarkdownReport } from '../../render/markdown/report.js';
import { buildReportModel } from '../../render/report-model.js';
import type { Io } from '../io.js';
import { loadDesign } from '../load.js';
import { emit } from '../output.js';
import { requireOut } from './draw.js';

export const REPORT_FORMATS = ['html', 'md'] as const;

export interface ReportOptions {
  readonly set: readonly string[];
  readonly format: string;
  readonly fmax: boolean;
  readonly out?: string;
}

/** Names of the SVG files a Markdown report at `out` puts beside itself. */
export function markdownImageNames(out: string): { worst: string; all: string; margins: string } {
  const stem = basename(out, extname(out));
  return { worst: `${stem}-worst.svg`, all: `${stem}-all.svg`, margins: `${stem}-margins.svg` };
}

export function runReport(io: Io, designPath: string, options: ReportOptions): number {
  const out = requireOut(options.out, options.format === 'md' ? 'Markdown' : 'HTML');
  if (!(REPORT_FORMATS as readonly string[]).includes(options.format)) {
    throw inputError('--format', options.format, `is not a report format; allowed: ${REPORT_FORMATS.join(', ')}`);
  }
  if (options.format === 'md' && out === '-') {
    throw inputError('--out', out, 'cannot be stdout for --format md: the report needs its SVG files beside it; name a .md file');
  }
  const loaded = loadDesign(designPath, options.set);
  const resolved = resolveDesign(loaded.design, loaded.card);
  const results = evaluateAll(resolved);
  let fmax: FmaxResult | null = null;
  if (options.fmax) fmax = findFmax(resolved);
  const model = buildReportModel(resolved, results, {
    processSource: loaded.processSource, fmax, fmaxNote: options.fmax ? '' : 'skipped with --no-fmax',
  });
  const code = model.report.verdict === 'pass' ? 0 : 1;
  if (options.format === 'html') {
    emit(io, renderHtmlReport(model), out);
    return code;
  }
  const images = markdownImageNames(out);
  const folder = dirname(out);
  // Every file is rendered before the first is written; the page goes last so it never points at missing drawings.
  const markdown = renderMarkdownReport(model, images);
  emit(io, model.svg.worst, join(folder, images.worst));
  emit(io, model.svg.all, join(folder, images.all));
  emit(io, model.svg.margins, join(folder, images.margins));
  emit(io, markdown, out);
  return code;
}
