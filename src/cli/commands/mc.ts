/** `phasegap mc DESIGN`: Monte Carlo mismatch on every corner, yield and sigma margins, in parallel threads. */
import { MONTECARLO_DEFAULTS, montecarloSettings } from '../../schema/design.js';
import { chunkPlan, McMerger, runChunk, type ChunkResult } from '../../analysis/montecarlo.js';
import { CornerEvaluator } from '../../analysis/evaluate.js';
import { checkReport } from '../../report/check-report.js';
import { emitCornerReport } from '../corner-report-output.js';
import { mcReport, renderMcText } from '../../report/mc-report.js';
import { drawMismatch, mismatchBuffers, mismatchSigmas } from '../../variation/mismatch.js';
import type { Io } from '../io.js';
import { loadResolved } from '../load.js';
import { checkOutput, emit, toJson, checkedInputs } from '../output.js';
import { runParallel, type RunEnd } from '../parallel-run.js';
import { progressBar } from '../progress.js';
import { wholeNumberIn } from '../options.js';
import { inputError } from '../../errors.js';
import { MAX_SAMPLES } from '../run-limits.js';
import { notRun, verdictOf } from '../../report/verdict.js';
import { withRunJson, withRunText } from '../../report/run-record.js';
import { gatherProvenance } from '../provenance.js';
import { writeJunit } from '../junit-option.js';
import { warnTo } from '../warn.js';
import { defineCommand, flagOption, parsedOption, textOption, type CommandOptions } from '../command.js';
import { DESIGN_ARGUMENT, JUNIT_OPTION, SET_OPTION, jsonOption, outOption, seedOption, workersOption } from '../common-options.js';

const OPTIONS = {
  set: SET_OPTION,
  samples: parsedOption(
    '--samples <N>',
    `dies to draw (default: montecarlo.samples, else ${MONTECARLO_DEFAULTS.samples})`,
    wholeNumberIn({ min: 1, max: MAX_SAMPLES, noun: 'dies' }),
  ),
  seed: seedOption(`random seed, a whole number (default: montecarlo.seed, else ${MONTECARLO_DEFAULTS.seed})`),
  workers: workersOption('threads (default: the number of cores); results do not depend on it'),
  replay: parsedOption(
    '--replay <INDEX>',
    'evaluate one die at every corner and print its check table',
    wholeNumberIn({ min: 0, max: MAX_SAMPLES - 1, noun: 'die indices' }),
  ),
  histogram: textOption(
    '--histogram <FILE.svg>',
    'also draw a histogram over the dies: by default the margin of the check that limits yield at the worst corner',
  ),
  histogramCorner: textOption(
    '--histogram-corner <NAME>',
    "corner the histogram shows (default: 'worst', the corner with the lowest yield)",
  ),
  histogramCheck: textOption(
    '--histogram-check <NAME>',
    "check the histogram shows: a check name or a unique part of one, or 'dead-times' for both dead times",
  ),
  skipCircuit: flagOption(
    '--skip-circuit',
    'leave the circuit solve out of the dies (faster); the yield then counts timing and switch checks only, and the verdict says so',
    false,
  ),
  timings: flagOption('--timings', 'print on stderr how long setup, evaluation and the report took', false),
  json: jsonOption('print the machine report (SI units)'),
  out: outOption('the report'),
  junit: JUNIT_OPTION,
} as const;

export const mcCommand = defineCommand({
  name: 'mc',
  description: 'Monte Carlo local mismatch (Pelgrom) on every corner: yield with a 95 % interval, sigma margins',
  arguments: [DESIGN_ARGUMENT],
  options: OPTIONS,
  run: (io, [design], options) => runMc(io, design, options),
});

export const MC_HINTS = { corners: 'run phasegap check', simulator: 'run phasegap confirm' } as const;

export async function runMc(io: Io, designPath: string, options: CommandOptions<typeof OPTIONS>): Promise<number> {
  const started = performance.now();
  const loaded = loadResolved(designPath, options.set, options, warnTo(io), io.readStdin);
  const { design, card, resolved } = loaded;
  const inputs = checkedInputs(loaded, options);
  checkOutput(options.histogram, inputs, '--histogram');
  checkOutput(options.junit, inputs, '--junit');
  if (options.histogram !== undefined && options.out !== undefined && options.histogram === options.out) {
    throw inputError('option.invalid', ['--histogram'], options.histogram, 'is also the --out file; give the histogram its own file');
  }
  const samples = options.samples ?? montecarloSettings(design).samples;
  const seed = options.seed ?? montecarloSettings(design).seed;
  const threads = options.workers;
  if (options.replay !== undefined) {
    const die = options.replay;
    const sigmas = mismatchSigmas(resolved.netlist, card, resolved.switches);
    const mismatch = drawMismatch(sigmas, seed, die, mismatchBuffers(sigmas));
    const evaluator = new CornerEvaluator(resolved);
    const results = resolved.corners.map(({ corner }) => evaluator.evaluate(corner, mismatch));
    const report = { ...checkReport(resolved, results), design: `${design.name} (die ${die}, seed ${seed})` };
    const verdict = emitCornerReport(io, loaded, inputs, report, { model: resolved.model.name, hints: MC_HINTS, options });
    return verdict.verdict === 'pass' ? 0 : 1;
  }
  for (const [flag, value] of [
    ['--histogram-corner', options.histogramCorner],
    ['--histogram-check', options.histogramCheck],
  ] as const) {
    if (value !== undefined && options.histogram === undefined)
      throw inputError('option.invalid', [flag], value, 'chooses what --histogram draws; give --histogram FILE.svg too');
  }
  if (options.histogram !== undefined && (options.histogramCorner !== undefined || options.histogramCheck !== undefined)) {
    // Names are checked before the run, so a typo costs no waiting (a design's check names are alike at every corner).
    const { DEAD_TIMES, matchCheck, pickCorner } = await import('../../render/histogram-choice.js');
    const names = resolved.corners.map(({ corner }) => corner.name);
    const at = pickCorner(names, names[0]!, options.histogramCorner === 'worst' ? undefined : options.histogramCorner);
    if (options.histogramCheck !== undefined && options.histogramCheck !== DEAD_TIMES) {
      matchCheck(
        new CornerEvaluator(resolved).evaluate(resolved.corners[at]!.corner).checks.map((c) => c.name),
        options.histogramCheck,
        options.histogramCorner === undefined ? 'of this design' : `at ${names[at]!}`,
      );
    }
  }
  const evaluating = performance.now();
  const plan = chunkPlan(samples);
  const checks = { circuit: !options.skipCircuit };
  // Each chunk is folded into the totals as it arrives: memory does not grow with the dies.
  const merger = new McMerger(resolved, seed, samples);
  const bar = progressBar(io, samples * resolved.corners.length, 'mc', !options.json);
  let done = 0;
  const take = (result: ChunkResult) => {
    merger.add(result);
    done += result.count * resolved.corners.length;
    bar.update(done);
  };
  let end: RunEnd;
  try {
    end = await runParallel<{ start: number; count: number }, ChunkResult>({
      setup: {
        kind: 'mc',
        design: { path: loaded.designPath, text: loaded.designText },
        overrides: options.set,
        seed,
        model: { model: options.model, tables: options.tables },
        checks,
      },
      tasks: plan,
      threads,
      local: (task) => runChunk(resolved, seed, task.start, task.count, checks),
      onResult: take,
    });
  } finally {
    bar.stop();
  }
  if (end === 'interrupted') {
    io.stderr('phasegap: interrupted; no report written\n');
    return 130;
  }
  const reporting = performance.now();
  const mc = merger.finish();
  const report = mcReport(design.name, card.name, mc, design.requirements.minYield, resolved.model.name);
  const skipped =
    design.circuit !== undefined && options.skipCircuit
      ? [
          notRun(
            'circuit',
            'circuit requirements on the dies',
            'left out with --skip-circuit: the yield counts timing and switch checks only',
          ),
        ]
      : [];
  const verdict = verdictOf({ corners: null, mc: report, confirm: null, hints: MC_HINTS, extra: skipped });
  const record = gatherProvenance(io, loaded, { model: resolved.model.name, options });
  const junit =
    options.junit === undefined
      ? null
      : writeJunit(io, options.junit, inputs, { name: design.name, verdict, mc: report, provenance: record });
  if (options.histogram !== undefined) {
    // The SVG stack loads only when a histogram is asked for.
    const { renderHistogram } = await import('../../render/svg/histogram.js');
    const { withRunMetadata } = await import('../../render/svg/metadata.js');
    const { histogramSubject } = await import('../../render/histogram-choice.js');
    const subject = histogramSubject(report, options.histogramCorner, options.histogramCheck);
    const corner = report.corners[subject.corner]!.name;
    const subtitle = `${samples} dies, seed ${seed}, local mismatch (Pelgrom)`;
    if (subject.kind === 'dead-times') {
      emit(
        io,
        withRunMetadata(
          renderHistogram({
            title: `${design.name}: dead times at ${corner}`,
            subtitle,
            axis: '50 % dead time',
            series: mc.deadTimes[subject.corner]!.map((histogram, k) => ({
              label: subject.deadTimes[k]?.name ?? `dead ${k}`,
              histogram,
              mean: subject.deadTimes[k]?.mean,
              sigma: subject.deadTimes[k]?.sigma,
            })),
            requirement: design.requirements.deadTime?.min,
            maximum: design.requirements.deadTime?.max,
          }),
          verdict,
          record,
        ),
        options.histogram,
        inputs,
        '--histogram',
      );
    } else {
      const { checkMarginHistogram } = await import('../../analysis/check-histogram.js');
      const { marginUnit } = await import('../../checks/check.js');
      const q = subject.check;
      emit(
        io,
        withRunMetadata(
          renderHistogram({
            title: `${design.name}: check margin at ${corner}`,
            subtitle: `${subtitle}; ${q.failures ?? 0} of ${samples} dies fail this check here`,
            axis: 'margin (below 0 fails)',
            unit: marginUnit(q.kind),
            requirement: 0,
            series: [
              {
                label: q.name,
                histogram: checkMarginHistogram(resolved, seed, samples, subject.corner, q.name, checks),
                mean: q.mean,
                sigma: q.sigma,
              },
            ],
          }),
          verdict,
          record,
        ),
        options.histogram,
        inputs,
        '--histogram',
      );
    }
  }
  const invocation = [
    'phasegap',
    'mc',
    designPath,
    ...options.set.flatMap((s) => ['--set', s]),
    ...(options.model === undefined ? [] : ['--model', options.model]),
    ...(options.tables === undefined ? [] : ['--tables', options.tables]),
  ];
  emit(
    io,
    options.json ? toJson(withRunJson(report, verdict, record)) : withRunText(renderMcText(report, invocation), verdict, record),
    options.out,
    inputs,
  );
  junit?.();
  if (options.timings) {
    const evaluations = samples * resolved.corners.length;
    const used = Math.min(threads, plan.length);
    const seconds = (from: number, to: number) => ((to - from) / 1000).toFixed(3);
    io.stderr(
      `phasegap: timings: setup ${seconds(started, evaluating)} s, evaluation ${seconds(evaluating, reporting)} s ` +
        `(${evaluations} evaluations on ${used} thread${used === 1 ? '' : 's'}, ${Math.round(evaluations / ((reporting - evaluating) / 1000))}/s), ` +
        `report ${seconds(reporting, performance.now())} s\n`,
    );
  }
  return verdict.verdict === 'pass' ? 0 : 1;
}
