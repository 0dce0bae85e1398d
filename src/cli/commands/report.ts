/** `phasegap report DESIGN -o FILE.html`: the self-contained review page (or Markdown with SVGs beside it). */
import { basename, dirname, extname, join } from 'node:path';
import { evaluateAll } from '../../analysis/evaluate.js';
import { findFmax, type FmaxResult } from '../../analysis/fmax.js';
import { inputError } from '../../errors.js';
import { renderHtmlReport } from '../../render/html/report.js';
import { renderMarkdownReport } from '../../render/markdown/report.js';
import { buildReportModel } from '../../render/report-model.js';
import type { Io } from '../io.js';
import { loadResolved, type ModelOptions } from '../load.js';
import { checkOutput, emit, inputFiles } from '../output.js';
import { requireOut } from '../out-options.js';
import { optionalWholeNumber } from '../options.js';
import { MAX_SAMPLES, MAX_SEED } from '../run-limits.js';
import { runMonteCarlo } from '../../analysis/montecarlo.js';
import { mcReport } from '../../report/mc-report.js';
import { renderHistogram } from '../../render/svg/histogram.js';
import type { McSection } from '../../render/mc-section.js';
import type { ResolvedDesign } from '../../analysis/resolve.js';
import { tuneChains } from '../../analysis/tune.js';
import { confirmCorners } from '../confirm-run.js';
import { tuneReport } from '../../report/tune-report.js';
import { gatherProvenance } from '../provenance.js';
import { withRunMetadata } from '../../render/svg/metadata.js';
import { warnTo } from '../warn.js';

export const REPORT_FORMATS = ['html', 'md'] as const;

export interface ReportOptions extends ModelOptions {
  readonly set: readonly string[];
  readonly format: string;
  readonly fmax: boolean;
  readonly out?: string;
  /** Dies for a Monte Carlo section (none when absent). */
  readonly mc?: string;
  readonly seed?: string;
  readonly tune: boolean;
  /** Corners to confirm with ngspice (worst, all or names); none when absent. */
  readonly confirm?: string;
  readonly tolerance?: string;
  readonly models?: string;
  readonly ngspice?: string;
}

/** Monte Carlo on one thread (the report stays a plain, repeatable function of its inputs). */
function monteCarloSection(resolved: ResolvedDesign, samples: number, seed: number): McSection {
  const mc = runMonteCarlo(resolved, samples, seed);
  const report = mcReport(resolved.design.name, resolved.card.name, mc, resolved.design.requirements.minYield, resolved.model.name);
  const c = report.corners.findIndex((x) => x.name === report.worstCorner);
  const names = report.corners[c]!.quantities.filter((q) => q.kind === 'measure' && q.name.startsWith('dead ')).map((q) => q.name);
  const histogram = renderHistogram({
    title: `${resolved.design.name}: dead times at ${report.worstCorner}`,
    subtitle: `${samples} dies, seed ${seed}, local mismatch (Pelgrom)`,
    series: mc.deadTimes[c]!.map((histogram, k) => ({ label: names[k] ?? `dead ${k}`, histogram })),
    requirement: resolved.design.requirements.deadTime?.min,
    maximum: resolved.design.requirements.deadTime?.max,
  });
  return { report, histogram };
}

/** Names of the SVG files a Markdown report at `out` puts beside itself. */
export function markdownImageNames(out: string): { worst: string; all: string; margins: string; histogram: string } {
  const stem = basename(out, extname(out));
  return { worst: `${stem}-worst.svg`, all: `${stem}-all.svg`, margins: `${stem}-margins.svg`, histogram: `${stem}-histogram.svg` };
}

export function runReport(io: Io, designPath: string, options: ReportOptions): number {
  const out = requireOut(options.out, options.format === 'md' ? 'Markdown' : 'HTML');
  if (!(REPORT_FORMATS as readonly string[]).includes(options.format)) {
    throw inputError('option.invalid', '--format', options.format, `is not a report format; allowed: ${REPORT_FORMATS.join(', ')}`);
  }
  if (options.format === 'md' && out === '-') {
    throw inputError('option.invalid', '--out', out, 'cannot be stdout for --format md: the report needs its SVG files beside it; name a .md file');
  }
  const loaded = loadResolved(designPath, options.set, options, warnTo(io), io.readStdin);
  const resolved = loaded.resolved;
  const inputs = inputFiles(loaded, options);
  const images = markdownImageNames(out);
  const folder = dirname(out);
  const targets = options.format === 'md' ? [out, ...Object.values(images).map((name) => join(folder, name))] : [out];
  for (const target of targets) checkOutput(target, inputs);
  const dies = optionalWholeNumber('--mc', options.mc, { min: 1, max: MAX_SAMPLES, noun: 'dies' }, 0);
  const seed = optionalWholeNumber('--seed', options.seed, { min: 0, max: MAX_SEED }, loaded.design.montecarlo?.seed ?? 1);
  const results = evaluateAll(resolved);
  let fmax: FmaxResult | null = null;
  if (options.fmax) fmax = findFmax(resolved);
  const confirm = options.confirm === undefined ? null
    : confirmCorners(io, resolved, loaded.cardDir, { corners: options.confirm, tolerance: options.tolerance, models: options.models, ngspice: options.ngspice }, '--confirm');
  const provenance = gatherProvenance(io, loaded, { model: resolved.model.name, options, simulator: confirm?.simulator ?? null, spice: confirm !== null });
  const built = buildReportModel(resolved, results, {
    processSource: loaded.processSource, fmax, fmaxNote: options.fmax ? '' : 'skipped with --no-fmax',
    mc: dies > 0 ? monteCarloSection(resolved, dies, seed) : null,
    tune: options.tune && loaded.design.generator.template !== 'netlist'
      ? tuneReport(loaded.design.name, loaded.design.clock.frequency, resolved.corners.length, tuneChains(loaded.design, loaded.card, resolved.model), 3)
      : null,
    confirm,
    provenance,
  });
  const model = built.mc ? { ...built, mc: { ...built.mc, histogram: withRunMetadata(built.mc.histogram, built.verdict, provenance) } } : built;
  const code = model.verdict.verdict === 'pass' ? 0 : 1;
  if (options.format === 'html') {
    emit(io, renderHtmlReport(model), out, inputs);
    return code;
  }
  // Every file is rendered before the first is written; the page goes last so it never points at missing drawings.
  const markdown = renderMarkdownReport(model, model.mc ? images : { ...images, histogram: undefined });
  if (model.mc) emit(io, model.mc.histogram, join(folder, images.histogram), inputs);
  emit(io, model.svg.worst, join(folder, images.worst), inputs);
  emit(io, model.svg.all, join(folder, images.all), inputs);
  emit(io, model.svg.margins, join(folder, images.margins), inputs);
  emit(io, markdown, out, inputs);
  return code;
}
