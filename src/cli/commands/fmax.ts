/** `phasegap fmax DESIGN`: the highest safe clock frequency and what limits it. */
import { findFmax } from '../../analysis/fmax.js';
import { CAUTIONS } from '../../report/cautions.js';
import { fmaxPasses, renderFmaxText } from '../../report/fmax-text.js';
import { inputError } from '../../errors.js';
import type { Io } from '../io.js';
import { loadResolved } from '../load.js';
import { emit, toJson, checkedInputs } from '../output.js';
import { relativeNumber } from '../options.js';
import { MAX_FMAX_RESOLUTION, MIN_FMAX_RESOLUTION } from '../run-limits.js';
import { warnTo } from '../warn.js';
import { defineCommand, parsedOption, type CommandOptions } from '../command.js';
import { DESIGN_ARGUMENT, SET_OPTION, jsonOption, outOption } from '../common-options.js';

function parseResolution(text: string, flag: string): number {
  const value = relativeNumber(text);
  if (!(value >= MIN_FMAX_RESOLUTION && value < MAX_FMAX_RESOLUTION)) {
    throw inputError(
      'option.invalid',
      [flag],
      text,
      `must be a relative step from ${MIN_FMAX_RESOLUTION} up to (not including) ${MAX_FMAX_RESOLUTION}, e.g. 0.001 or 0.1%`,
    );
  }
  return value;
}

const OPTIONS = {
  set: SET_OPTION,
  resolution: parsedOption('--resolution <REL>', 'relative resolution of the search (default 0.001 = 0.1 %)', parseResolution),
  json: jsonOption('print the machine report (SI units)'),
  out: outOption('the report'),
} as const;

export const fmaxCommand = defineCommand({
  name: 'fmax',
  description: 'highest clock frequency at which every check holds at every corner, and what limits it',
  arguments: [DESIGN_ARGUMENT],
  options: OPTIONS,
  run: (io, [design], options) => runFmax(io, design, options),
});

export function runFmax(io: Io, designPath: string, options: CommandOptions<typeof OPTIONS>): number {
  const loaded = loadResolved(designPath, options.set, options, warnTo(io), io.readStdin);
  const { design, resolved } = loaded;
  const inputs = checkedInputs(loaded, options);
  const result = findFmax(resolved, { resolution: options.resolution });
  const ok = fmaxPasses(result);
  if (options.json) {
    emit(
      io,
      toJson({ tool: 'phasegap', design: design.name, ...result, verdict: ok ? 'pass' : 'fail', cautions: CAUTIONS }),
      options.out,
      inputs,
    );
    return ok ? 0 : 1;
  }
  emit(io, renderFmaxText(design.name, result), options.out, inputs);
  return ok ? 0 : 1;
}
