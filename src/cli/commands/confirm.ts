/** `phasegap confirm DESIGN`: runs ngspice on the chosen corners and compares with the model. */
import { resolveDesign } from '../../analysis/resolve.js';
import { worstDifference } from '../../report/confirm-report.js';
import { renderConfirmText } from '../../report/confirm-text.js';
import { CAUTIONS } from '../../report/cautions.js';
import type { Io } from '../io.js';
import { loadDesign, loadModel, type ModelOptions } from '../load.js';
import { checkOutput, emit, inputFiles, toJson } from '../output.js';
import { confirmCorners } from '../confirm-run.js';
import { warnTo } from '../warn.js';

export interface ConfirmOptions extends ModelOptions {
  readonly set: readonly string[];
  readonly corners: string;
  readonly tolerance?: string;
  readonly json: boolean;
  readonly out?: string;
  readonly models?: string;
  readonly ngspice?: string;
  readonly jobs?: string;
}

export function runConfirm(io: Io, designPath: string, options: ConfirmOptions): number {
  const loaded = loadDesign(designPath, options.set);
  const { design, card, cardDir } = loaded;
  const inputs = inputFiles(loaded, options);
  checkOutput(options.out, inputs);
  const model = loadModel(card, cardDir, options, warnTo(io));
  const resolved = resolveDesign(design, card, model);
  const { simulator, tolerance, comparisons } = confirmCorners(io, resolved, cardDir, { ...options, quiet: options.json });
  const pass = comparisons.every((c) => c.pass);
  if (options.json) {
    emit(io, toJson({
      tool: 'phasegap', design: design.name, process: card.name, model: model.name, simulator, tolerance,
      verdict: pass ? 'agree' : 'disagree', worst: worstDifference(comparisons), corners: comparisons, cautions: CAUTIONS,
    }), options.out, inputs);
  } else {
    emit(io, renderConfirmText({ design: design.name, model: model.name, simulator, tolerance, corners: comparisons }), options.out, inputs);
  }
  return pass ? 0 : 1;
}
