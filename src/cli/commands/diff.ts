/** `phasegap diff OLD.json NEW.json`: two check reports compared; exit 1 on a new failure or a margin lost beyond --tolerance. */
import { InputError, inputError, type IssuePath } from '../../errors.js';
import { checkReportShape, diffReports, renderDiffText, type DiffInput } from '../../report/diff.js';
import { parseQuantity } from '../../units/quantity.js';
import { parseWith } from '../../schema/validate.js';
import type { Io } from '../io.js';
import { readDataFile } from '../load.js';
import { emit, toJson } from '../output.js';
import { defineCommand, parsedOption, type CommandOptions } from '../command.js';
import { jsonOption, outOption } from '../common-options.js';

/** Margin loss and dead-time shift below which nothing is reported: 1 ps, 1 mV (common practice: below the model's resolution). */
export const DEFAULT_DIFF_TOLERANCE = { time: 1e-12, voltage: 1e-3 } as const;

/** The parser of a tolerance in `unit`, at least 0. */
function quantity(unit: 's' | 'V'): (text: string, flag: string) => number {
  return (text, flag) => {
    const q = parseQuantity(text, unit);
    if (!q.ok) throw inputError('option.invalid', [flag], text, q.allowed);
    if (!(q.value >= 0)) throw inputError('option.invalid', [flag], text, `must not be negative, e.g. ${unit === 's' ? '5ps' : '10mV'}`);
    return q.value;
  };
}

const OPTIONS = {
  tolerance: parsedOption('--tolerance <T>', 'margin loss and dead-time shift to ignore, e.g. 5ps (default 1ps)', quantity('s'), {
    fallback: DEFAULT_DIFF_TOLERANCE.time,
  }),
  voltageTolerance: parsedOption(
    '--voltage-tolerance <V>',
    'margin loss to ignore on the switch bias checks (default 1mV)',
    quantity('V'),
    { fallback: DEFAULT_DIFF_TOLERANCE.voltage },
  ),
  json: jsonOption('print the comparison as JSON (SI units)'),
  out: outOption('the comparison'),
} as const;

export const diffCommand = defineCommand({
  name: 'diff',
  description: 'compare two check reports (check --json): margin changes, new and fixed failures, dead-time shifts',
  arguments: [
    { name: '<OLD.json>', help: 'the baseline report' },
    { name: '<NEW.json>', help: 'the report to compare with it' },
  ],
  options: OPTIONS,
  run: (io, [before, after], options) => runDiff(io, before, after, options),
});

/** A report file read within the loader's limits and checked against the shape diff needs. */
export function loadCheckReport(path: string, label: IssuePath): DiffInput {
  const data = readDataFile(path, label, 'report');
  try {
    return parseWith(checkReportShape, data);
  } catch (error) {
    if (error instanceof InputError) {
      throw new InputError(
        error.issues.map((i) => ({
          ...i,
          file: path,
          expected: `${i.expected} (not a phasegap check report; write one with phasegap check DESIGN --json -o FILE)`,
        })),
      );
    }
    throw error;
  }
}

export function runDiff(io: Io, before: string, after: string, options: CommandOptions<typeof OPTIONS>): number {
  const tolerance = { time: options.tolerance, voltage: options.voltageTolerance };
  const d = diffReports(loadCheckReport(before, ['OLD']), loadCheckReport(after, ['NEW']), { old: before, new: after }, tolerance);
  emit(io, options.json ? toJson(d) : renderDiffText(d), options.out, [before, after]);
  return d.verdict === 'pass' ? 0 : 1;
}
