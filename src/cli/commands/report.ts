/** `phasegap report DESIGN -o FILE.html`: the self-contained review page (or Markdown with SVGs beside it). */
import { MONTECARLO_DEFAULTS, montecarloSettings } from '../../schema/design.js';
import { basename, dirname, extname, join } from 'node:path';
import { evaluateAll } from '../../analysis/evaluate.js';
import { findFmax, type FmaxResult } from '../../analysis/fmax.js';
import { inputError } from '../../errors.js';
import type { Io } from '../io.js';
import { loadResolved } from '../load.js';
import { checkOutput, emit, inputFiles } from '../output.js';
import { requireOut } from '../out-options.js';
import { wholeNumberIn } from '../options.js';
import { MAX_SAMPLES } from '../run-limits.js';
import { runMonteCarlo } from '../../analysis/montecarlo.js';
import { mcReport } from '../../report/mc-report.js';
import type { McSection } from '../../render/mc-section.js';
import type { ResolvedDesign } from '../../analysis/resolve.js';
import { tuneChains } from '../../analysis/tune.js';
import { confirmCorners } from '../confirm-run.js';
import { tuneReport } from '../../report/tune-report.js';
import { gatherProvenance } from '../provenance.js';
import { warnTo } from '../warn.js';
import { defineCommand, flagOption, parsedOption, textOption, type CommandOptions } from '../command.js';
import { DESIGN_ARGUMENT, SET_OPTION, outOption, seedOption, toleranceOption } from '../common-options.js';

export const REPORT_FORMATS = ['html', 'md'] as const;

function parseFormat(text: string, flag: string): (typeof REPORT_FORMATS)[number] {
  if (!(REPORT_FORMATS as readonly string[]).includes(text))
    throw inputError('option.invalid', [flag], text, `is not a report format; allowed: ${REPORT_FORMATS.join(', ')}`);
  return text as (typeof REPORT_FORMATS)[number];
}

const OPTIONS = {
  set: SET_OPTION,
  format: parsedOption('--format <FORMAT>', "'html' (one self-contained file) or 'md' (Markdown with the SVGs beside it)", parseFormat, {
    default: 'html',
  }),
  fmax: flagOption('--no-fmax', 'skip the maximum-frequency search'),
  tune: flagOption('--no-tune', 'skip the delay-chain proposals (nand/nor templates)'),
  confirm: textOption(
    '--confirm <WHICH>',
    'add ngspice against the model at these corners (timing, and the circuit when the design has one): worst, all, or names separated by commas',
  ),
  tolerance: toleranceOption('with --confirm: largest allowed relative difference (default: requirements.confirmTolerance, else 10 %)'),
  models: textOption('--models <FILE>', "with --confirm: SPICE model file instead of the card's spice.models"),
  ngspice: textOption('--ngspice <PATH>', 'with --confirm: the ngspice executable (default: ngspice on the PATH)'),
  mc: parsedOption(
    '--mc <N>',
    'add a Monte Carlo section with N dies per corner (yield, sigma margins, dead-time histogram)',
    wholeNumberIn({ min: 1, max: MAX_SAMPLES, noun: 'dies' }),
    { fallback: 0 },
  ),
  seed: seedOption(`Monte Carlo seed (default: montecarlo.seed, else ${MONTECARLO_DEFAULTS.seed})`),
  out: outOption('the report'),
} as const;

export const reportCommand = defineCommand({
  name: 'report',
  description: 'self-contained review page: summary, diagrams, margin chart, corner table, process card, cautions',
  arguments: [DESIGN_ARGUMENT],
  options: OPTIONS,
  run: (io, [design], options) => runReport(io, design, options),
});

/** Monte Carlo on one thread (the report stays a plain, repeatable function of its inputs). */
async function monteCarloSection(resolved: ResolvedDesign, samples: number, seed: number): Promise<McSection> {
  const { renderHistogram } = await import('../../render/svg/histogram.js');
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

export async function runReport(io: Io, designPath: string, options: CommandOptions<typeof OPTIONS>): Promise<number> {
  const out = requireOut(options.out, options.format === 'md' ? 'Markdown' : 'HTML');
  // The page renderers and the SVG stack load only for this command.
  const { renderHtmlReport } = await import('../../render/html/report.js');
  const { renderMarkdownReport } = await import('../../render/markdown/report.js');
  const { buildReportModel } = await import('../../render/report-model.js');
  const { withRunMetadata } = await import('../../render/svg/metadata.js');
  if (options.format === 'md' && out === '-') {
    throw inputError(
      'option.invalid',
      ['--out'],
      out,
      'cannot be stdout for --format md: the report needs its SVG files beside it; name a .md file',
    );
  }
  const loaded = loadResolved(designPath, options.set, options, warnTo(io), io.readStdin);
  const resolved = loaded.resolved;
  const inputs = inputFiles(loaded, options);
  const images = markdownImageNames(out);
  const folder = dirname(out);
  const targets = options.format === 'md' ? [out, ...Object.values(images).map((name) => join(folder, name))] : [out];
  for (const target of targets) checkOutput(target, inputs);
  const dies = options.mc;
  const seed = options.seed ?? montecarloSettings(loaded.design).seed;
  const results = evaluateAll(resolved);
  let fmax: FmaxResult | null = null;
  if (options.fmax) fmax = findFmax(resolved);
  const confirm =
    options.confirm === undefined
      ? null
      : confirmCorners(io, resolved, loaded.cardDir, {
          corners: options.confirm,
          cornersFlag: '--confirm',
          tolerance: options.tolerance,
          models: options.models,
          ngspice: options.ngspice,
          circuit: true,
        });
  const provenance = gatherProvenance(io, loaded, {
    model: resolved.model.name,
    options,
    simulator: confirm?.simulator ?? null,
    spice: confirm !== null,
  });
  const built = buildReportModel(resolved, results, {
    processSource: loaded.processSource,
    fmax,
    fmaxNote: options.fmax ? '' : 'skipped with --no-fmax',
    mc: dies > 0 ? await monteCarloSection(resolved, dies, seed) : null,
    tune:
      options.tune && loaded.design.generator.template !== 'netlist'
        ? tuneReport(
            loaded.design.name,
            loaded.design.clock.frequency,
            resolved.corners.length,
            tuneChains(loaded.design, loaded.card, resolved.model),
            3,
          )
        : null,
    confirm,
    provenance,
  });
  const model = built.mc
    ? { ...built, mc: { ...built.mc, histogram: withRunMetadata(built.mc.histogram, built.verdict, provenance) } }
    : built;
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
