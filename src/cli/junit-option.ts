/** `--junit FILE` on check, mc and confirm: the JUnit XML of the run, written after the main output. */
import { junitXml, verdictSuite, checkSuite, mcSuite, confirmSuite, type JunitSuite } from '../report/junit.js';
import type { CheckReport } from '../report/check-report.js';
import type { McReport } from '../report/mc-report.js';
import type { Provenance } from '../report/provenance.js';
import type { RunVerdict } from '../report/verdict.js';
import type { CornerComparison } from '../report/confirm-report.js';
import type { Io } from './io.js';
import { emit } from './output.js';
import { junitBuilder } from './junit-builder.js';

export interface JunitRun {
  readonly name: string;
  readonly verdict: RunVerdict;
  readonly provenance: Provenance;
  readonly checks?: CheckReport;
  readonly mc?: McReport;
  readonly confirm?: { readonly simulator: string; readonly tolerance: number; readonly comparisons: readonly CornerComparison[] };
}

/**
 * Renders the XML now (so a failure leaves nothing written) and returns the step that writes it,
 * to run once the main output is out.
 */
export function writeJunit(io: Io, file: string, inputs: readonly string[], run: JunitRun): () => void {
  const suites: JunitSuite[] = [verdictSuite(run.name, run.verdict)];
  if (run.checks) suites.push(checkSuite(run.checks));
  if (run.mc) suites.push(mcSuite(run.mc));
  if (run.confirm) suites.push(confirmSuite(run.name, run.confirm.simulator, run.confirm.tolerance, run.confirm.comparisons));
  const xml = junitXml(suites, run.provenance, junitBuilder);
  return () => emit(io, xml, file, inputs, '--junit');
}
