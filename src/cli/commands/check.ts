/** `phasegap check DESIGN`: every corner's dead times, gaps, widths and requirement margins. */
import { evaluateAll } from '../../analysis/evaluate.js';
import { resolveDesign } from '../../analysis/resolve.js';
import { checkReport } from '../../report/check-report.js';
import { renderCheckText } from '../../report/check-text.js';
import { checkHint } from '../../report/check-hint.js';
import type { Io } from '../io.js';
import { loadDesign, loadModel, type ModelOptions } from '../load.js';
import { checkOutput, emit, inputFiles, toJson } from '../output.js';

export interface CheckOptions extends ModelOptions {
  readonly set: readonly string[];
  readonly json: boolean;
  readonly out?: string;
}

export function runCheck(io: Io, designPath: string, options: CheckOptions): number {
  const loaded = loadDesign(designPath, options.set);
  const { design, card, cardDir } = loaded;
  const inputs = inputFiles(loaded, options);
  checkOutput(options.out, inputs);
  const resolved = resolveDesign(design, card, loadModel(card, cardDir, options, (m) => io.stderr(`phasegap: warning: ${m}\n`)));
  const report = checkReport(resolved, evaluateAll(resolved));
  emit(io, options.json ? toJson(report) : renderCheckText(report), options.out, inputs);
  const hint = options.json ? null : checkHint(report, designPath, design.generator.template !== 'netlist');
  if (hint) io.stderr(`phasegap: hint: ${hint}\n`);
  return report.verdict === 'pass' ? 0 : 1;
}
