/** Writes a corner report (check, or one Monte Carlo die replayed) with its verdict, provenance and optional JUnit file. */
import type { CheckReport } from '../report/check-report.js';
import { renderCheckText } from '../report/check-text.js';
import { withRunJson, withRunText } from '../report/run-record.js';
import { type RunHints, type RunVerdict, verdictOf } from '../report/verdict.js';
import type { Io } from './io.js';
import { writeJunit } from './junit-option.js';
import type { LoadedDesign } from './load.js';
import { emit, toJson } from './output.js';
import { gatherProvenance } from './provenance.js';

export interface CornerReportRun {
  /** The delay model's name as used. */
  readonly model: string;
  /** What the verdict suggests for the analyses this command does not run. */
  readonly hints: RunHints;
  readonly options: {
    readonly json?: boolean;
    readonly out?: string;
    readonly junit?: string;
    readonly tables?: string;
    readonly models?: string;
  };
}

/** Emits the report to --out (table or --json) and the JUnit file after it; returns the verdict. */
export function emitCornerReport(
  io: Io,
  loaded: LoadedDesign,
  inputs: readonly string[],
  report: CheckReport,
  run: CornerReportRun,
): RunVerdict {
  const { options } = run;
  const verdict = verdictOf({ corners: report, mc: null, confirm: null, hints: run.hints });
  const record = gatherProvenance(io, loaded, { model: run.model, options });
  const junit =
    options.junit === undefined
      ? null
      : writeJunit(io, options.junit, inputs, { name: report.design, verdict, checks: report, provenance: record });
  emit(
    io,
    options.json ? toJson(withRunJson(report, verdict, record)) : withRunText(renderCheckText(report), verdict, record),
    options.out,
    inputs,
  );
  junit?.();
  return verdict;
}
