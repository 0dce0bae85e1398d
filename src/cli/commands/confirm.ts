/** `phasegap confirm DESIGN`: runs ngspice on the chosen corners and compares with the model. */
import { resolveDesign } from '../../analysis/resolve.js';
import { worstDifference } from '../../report/confirm-report.js';
import { renderConfirmText } from '../../report/confirm-text.js';
import { CAUTIONS } from '../../report/cautions.js';
import type { Io } from '../io.js';
import { loadDesign, loadModel } from '../load.js';
import { checkOutput, emit, toJson, checkedInputs } from '../output.js';
import { confirmCorners } from '../confirm-run.js';
import { warnTo } from '../warn.js';
import { verdictOf } from '../../report/verdict.js';
import { withRunJson, withRunText } from '../../report/run-record.js';
import { gatherProvenance } from '../provenance.js';
import { writeJunit } from '../junit-option.js';
import { defineCommand, textOption, type CommandOptions } from '../command.js';
import {
  DESIGN_ARGUMENT,
  JOBS_OPTION,
  JUNIT_OPTION,
  MODELS_OPTION,
  NGSPICE_OPTION,
  SET_OPTION,
  jsonOption,
  outOption,
  toleranceOption,
} from '../common-options.js';

export const CONFIRM_HINTS = { corners: 'run phasegap check', montecarlo: 'run phasegap mc' } as const;

const OPTIONS = {
  set: SET_OPTION,
  corners: textOption('--corners <WHICH>', 'worst (the extremes), all, or corner names separated by commas', { default: 'worst' }),
  tolerance: toleranceOption('largest allowed relative difference, e.g. 0.1 or 10% (default 10 %)'),
  models: MODELS_OPTION,
  ngspice: NGSPICE_OPTION,
  jobs: JOBS_OPTION,
  json: jsonOption('print the machine report (SI units)'),
  out: outOption('the report'),
  junit: JUNIT_OPTION,
} as const;

export const confirmCommand = defineCommand({
  name: 'confirm',
  description: 'simulate corners in ngspice and compare dead times, gaps and widths with the model',
  arguments: [DESIGN_ARGUMENT],
  options: OPTIONS,
  run: (io, [design], options) => runConfirm(io, design, options),
});

export function runConfirm(io: Io, designPath: string, options: CommandOptions<typeof OPTIONS>): number {
  const loaded = loadDesign(designPath, options.set, io.readStdin);
  const { design, card, cardDir } = loaded;
  const inputs = checkedInputs(loaded, options);
  checkOutput(options.junit, inputs, '--junit');
  const model = loadModel(card, cardDir, options, warnTo(io));
  const resolved = resolveDesign(design, card, model);
  const { simulator, tolerance, comparisons } = confirmCorners(io, resolved, cardDir, { ...options, quiet: options.json, circuit: true });
  const pass = comparisons.every((c) => c.pass);
  const verdict = verdictOf({
    corners: null,
    mc: null,
    confirm: { simulator, tolerance, comparisons },
    deadTime: design.requirements.deadTime,
    hints: CONFIRM_HINTS,
  });
  const record = gatherProvenance(io, loaded, { model: model.name, options, simulator, spice: true });
  const junit =
    options.junit === undefined
      ? null
      : writeJunit(io, options.junit, inputs, {
          name: design.name,
          verdict,
          confirm: { simulator, tolerance, comparisons },
          provenance: record,
        });
  if (options.json) {
    emit(
      io,
      toJson(
        withRunJson(
          {
            tool: 'phasegap',
            design: design.name,
            process: card.name,
            model: model.name,
            simulator,
            tolerance,
            verdict: pass ? 'agree' : 'disagree',
            worst: worstDifference(comparisons),
            corners: comparisons,
            cautions: CAUTIONS,
          },
          verdict,
          record,
        ),
      ),
      options.out,
      inputs,
    );
  } else {
    emit(
      io,
      withRunText(
        renderConfirmText({ design: design.name, model: model.name, simulator, tolerance, corners: comparisons }),
        verdict,
        record,
      ),
      options.out,
      inputs,
    );
  }
  junit?.();
  return verdict.verdict === 'pass' ? 0 : 1;
}
