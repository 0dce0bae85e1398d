/** `phasegap mc DESIGN`: Monte Carlo mismatch on every corner, yield and sigma margins, in parallel threads. */
import { availableParallelism } from 'node:os';
import { chunkPlan, McMerger, runChunk, type ChunkResult } from '../../analysis/montecarlo.js';
import { CornerEvaluator } from '../../analysis/evaluate.js';
import { checkReport } from '../../report/check-report.js';
import { renderCheckText } from '../../report/check-text.js';
import { mcReport, renderMcText } from '../../report/mc-report.js';
import { drawMismatch, mismatchBuffers, mismatchSigmas } from '../../variation/mismatch.js';
import type { Io } from '../io.js';
import { loadResolved, type ModelOptions } from '../load.js';
import { checkOutput, emit, inputFiles, toJson } from '../output.js';
import { runPool } from '../pool.js';
import { progressBar } from '../progress.js';
import { optionalWholeNumber } from '../options.js';
import { inputError } from '../../errors.js';
import { MAX_SAMPLES, MAX_SEED, MAX_WORKERS } from '../run-limits.js';

export interface McOptions extends ModelOptions {
  readonly set: readonly string[];
  readonly json: boolean;
  readonly out?: string;
  readonly samples?: string;
  readonly seed?: string;
  readonly workers?: string;
  readonly replay?: string;
  readonly histogram?: string;
  readonly timings?: boolean;
}

export async function runMc(io: Io, designPath: string, options: McOptions): Promise<number> {
  const started = performance.now();
  const loaded = loadResolved(designPath, options.set, options, (m) => io.stderr(`phasegap: warning: ${m}\n`));
  const { design, card, resolved } = loaded;
  const inputs = inputFiles(loaded, options);
  checkOutput(options.out, inputs);
  checkOutput(options.histogram, inputs, '--histogram');
  if (options.histogram !== undefined && options.out !== undefined && options.histogram === options.out) {
    throw inputError('--histogram', options.histogram, 'is also the --out file; give the histogram its own file');
  }
  const samples = optionalWholeNumber('--samples', options.samples, { min: 1, max: MAX_SAMPLES, noun: 'dies' }, design.montecarlo?.samples ?? 1000);
  const seed = optionalWholeNumber('--seed', options.seed, { min: 0, max: MAX_SEED }, design.montecarlo?.seed ?? 1);
  const threads = optionalWholeNumber('--workers', options.workers, { min: 1, max: MAX_WORKERS, noun: 'threads' }, Math.min(availableParallelism(), MAX_WORKERS));
  if (options.replay !== undefined) {
    const die = optionalWholeNumber('--replay', options.replay, { min: 0, max: MAX_SAMPLES - 1, noun: 'die indices' }, 0);
    const sigmas = mismatchSigmas(resolved.netlist, card, resolved.switches);
    const mismatch = drawMismatch(sigmas, seed, die, mismatchBuffers(sigmas));
    const evaluator = new CornerEvaluator(resolved);
    const results = resolved.corners.map(({ corner }) => evaluator.evaluate(corner, mismatch));
    const report = { ...checkReport(resolved, results), design: `${design.name} (die ${die}, seed ${seed})` };
    emit(io, options.json ? toJson(report) : renderCheckText(report), options.out, inputs);
    return report.verdict === 'pass' ? 0 : 1;
  }
  const evaluating = performance.now();
  const plan = chunkPlan(samples);
  // Each chunk is folded into the totals as it arrives: memory does not grow with the dies.
  const merger = new McMerger(resolved, seed, samples);
  const bar = progressBar(io, samples * resolved.corners.length, 'mc', !options.json);
  let done = 0;
  const take = (result: ChunkResult) => {
    merger.add(result);
    done += result.count * resolved.corners.length;
    bar.update(done);
  };
  if (threads === 1 || plan.length === 1) {
    for (const { start, count } of plan) take(runChunk(resolved, seed, start, count));
  } else {
    let interrupted = false;
    let stopPool = () => undefined as void;
    const onSigint = () => { interrupted = true; stopPool(); };
    process.once('SIGINT', onSigint);
    try {
      await runPool<{ start: number; count: number }, ChunkResult>(
        { kind: 'mc', designPath, overrides: options.set, seed, model: { model: options.model, tables: options.tables } }, plan, threads,
        (_i, result) => take(result),
        (handle) => { stopPool = () => handle.stop(); },
        (task) => runChunk(resolved, seed, task.start, task.count),
      );
    } finally {
      process.removeListener('SIGINT', onSigint);
      bar.stop();
    }
    if (interrupted) {
      io.stderr('phasegap: interrupted; no report written\n');
      return 130;
    }
  }
  bar.stop();
  const reporting = performance.now();
  const mc = merger.finish();
  const report = mcReport(design.name, card.name, mc, design.requirements.minYield, resolved.model.name);
  if (options.histogram !== undefined) {
    const c = report.corners.findIndex((x) => x.name === report.worstCorner);
    // The SVG stack loads only when a histogram is asked for.
    const { renderHistogram } = await import('../../render/svg/histogram.js');
    emit(io, renderHistogram({
      title: `${design.name}: dead times at ${report.worstCorner}`,
      subtitle: `${samples} dies, seed ${seed}, local mismatch (Pelgrom)`,
      series: mc.deadTimes[c]!.map((histogram, k) => ({ label: report.corners[c]!.quantities.filter((q) => q.kind === 'measure' && q.name.startsWith('dead '))[k]?.name ?? `dead ${k}`, histogram })),
      requirement: design.requirements.deadTime?.min,
      maximum: design.requirements.deadTime?.max,
    }), options.histogram, inputs, '--histogram');
  }
  const invocation = ['phasegap', 'mc', designPath, ...options.set.flatMap((s) => ['--set', s]), ...(options.model === undefined ? [] : ['--model', options.model]), ...(options.tables === undefined ? [] : ['--tables', options.tables])];
  emit(io, options.json ? toJson(report) : renderMcText(report, invocation), options.out, inputs);
  if (options.timings) {
    const evaluations = samples * resolved.corners.length;
    const used = Math.min(threads, plan.length);
    const seconds = (from: number, to: number) => ((to - from) / 1000).toFixed(3);
    io.stderr(`phasegap: timings: setup ${seconds(started, evaluating)} s, evaluation ${seconds(evaluating, reporting)} s `
      + `(${evaluations} evaluations on ${used} thread${used === 1 ? '' : 's'}, ${Math.round(evaluations / ((reporting - evaluating) / 1000))}/s), `
      + `report ${seconds(reporting, performance.now())} s\n`);
  }
  return report.verdict === 'pass' ? 0 : 1;
}
