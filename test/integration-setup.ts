/**
 * Global set-up of the `integration` project: says at the start which outside programs are
 * missing, and under CI fails the run on one instead of letting their tests be skipped.
 */
import { missingTools, missingToolsReport, underCi } from './outside-tools.js';

export default function setup(): void {
  const missing = missingTools();
  const report = missingToolsReport(missing, underCi());
  if (report === '') return;
  if (underCi()) {
    const error = new Error(report);
    error.stack = report;
    throw error;
  }
  process.stderr.write(`${report}\n`);
}
