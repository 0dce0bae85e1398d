/** `phasegap check DESIGN`: every corner's dead times, gaps, widths and requirement margins. */
import { evaluateAll } from '../../analysis/evaluate.js';
import { resolveDesign } from '../../analysis/resolve.js';
import { checkReport } from '../../report/check-report.js';
import { checkHint } from '../../report/check-hint.js';
import type { Io } from '../io.js';
import { loadDesign, loadModel } from '../load.js';
import { checkOutput, checkedInputs } from '../output.js';
import { emitCornerReport } from '../corner-report-output.js';
import { warnTo } from '../warn.js';
import { defineCommand, type CommandOptions } from '../command.js';
import { DESIGN_ARGUMENT, JUNIT_OPTION, SET_OPTION, jsonOption, outOption } from '../common-options.js';

const OPTIONS = {
  set: SET_OPTION,
  json: jsonOption('print the machine report (SI units) instead of the table'),
  out: outOption('the report'),
  junit: JUNIT_OPTION,
} as const;

export type CheckOptions = CommandOptions<typeof OPTIONS>;

export const checkCommand = defineCommand({
  name: 'check',
  description: 'every corner: dead times, gaps, widths, requirement margins and a verdict',
  arguments: [DESIGN_ARGUMENT],
  options: OPTIONS,
  run: (io, [design], options) => runCheck(io, design, options),
});

export function runCheck(io: Io, designPath: string, options: CheckOptions): number {
  const loaded = loadDesign(designPath, options.set, io.readStdin);
  const { design, card, cardDir } = loaded;
  const inputs = checkedInputs(loaded, options);
  checkOutput(options.junit, inputs, '--junit');
  const resolved = resolveDesign(design, card, loadModel(card, cardDir, options, warnTo(io)));
  const report = checkReport(resolved, evaluateAll(resolved));
  const verdict = emitCornerReport(io, loaded, inputs, report, { model: resolved.model.name, hints: CHECK_HINTS, options });
  const hint = options.json ? null : checkHint(report, designPath, design.generator.template !== 'netlist');
  if (hint) io.stderr(`phasegap: hint: ${hint}\n`);
  return verdict.verdict === 'pass' ? 0 : 1;
}

export const CHECK_HINTS = { montecarlo: 'run phasegap mc', simulator: 'run phasegap confirm' } as const;
