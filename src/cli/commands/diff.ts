/** `phasegap diff OLD.json NEW.json`: two check reports compared; exit 1 on a new failure or a margin lost beyond --tolerance. */
import { InputError, inputError } from '../../errors.js';
import { checkReportShape, diffReports, renderDiffText, type DiffInput } from '../../report/diff.js';
import { parseQuantity } from '../../units/quantity.js';
import { parseWith } from '../../schema/validate.js';
import type { Io } from '../io.js';
import { readDataFile } from '../load.js';
import { emit, toJson } from '../output.js';

export interface DiffOptions {
  readonly tolerance?: string;
  readonly voltageTolerance?: string;
  readonly json: boolean;
  readonly out?: string;
}

/** Margin loss and dead-time shift below which nothing is reported: 1 ps, 1 mV (common practice: below the model's resolution). */
export const DEFAULT_DIFF_TOLERANCE = { time: 1e-12, voltage: 1e-3 } as const;

function quantity(flag: string, text: string | undefined, unit: 's' | 'V', fallback: number): number {
  if (text === undefined) return fallback;
  const q = parseQuantity(text, unit);
  if (!q.ok) throw inputError('option.invalid', flag, text, q.allowed);
  if (!(q.value >= 0)) throw inputError('option.invalid', flag, text, `must not be negative, e.g. ${unit === 's' ? '5ps' : '10mV'}`);
  return q.value;
}

/** A report file read within the loader's limits and checked against the shape diff needs. */
export function loadCheckReport(path: string, label: string): DiffInput {
  const data = readDataFile(path, label, 'report');
  try {
    return parseWith(checkReportShape, data);
  } catch (error) {
    if (error instanceof InputError) {
      throw new InputError(error.issues.map((i) => ({ ...i, path: `${path}: ${i.path}`, allowed: `${i.allowed} (not a phasegap check report; write one with phasegap check DESIGN --json -o FILE)` })));
    }
    throw error;
  }
}

export function runDiff(io: Io, before: string, after: string, options: DiffOptions): number {
  const tolerance = {
    time: quantity('--tolerance', options.tolerance, 's', DEFAULT_DIFF_TOLERANCE.time),
    voltage: quantity('--voltage-tolerance', options.voltageTolerance, 'V', DEFAULT_DIFF_TOLERANCE.voltage),
  };
  const d = diffReports(loadCheckReport(before, 'OLD'), loadCheckReport(after, 'NEW'), { old: before, new: after }, tolerance);
  emit(io, options.json ? toJson(d) : renderDiffText(d), options.out, [before, after]);
  return d.verdict === 'pass' ? 0 : 1;
}
