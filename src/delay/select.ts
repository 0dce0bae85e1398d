/**
 * Which delay model a run uses: `--model analytic|table`, or by default the table model when the
 * process card names delay tables and the analytic model otherwise.
 */
import { inputError } from '../errors.js';
import type { DelayTables } from '../schema/tables.js';
import { analyticModel } from './analytic.js';
import type { DelayModel } from './model.js';
import { tableModel } from './table.js';

export const MODEL_CHOICES = ['analytic', 'table'] as const;
export type ModelChoice = (typeof MODEL_CHOICES)[number];

export function parseModelChoice(text: string | undefined): ModelChoice | undefined {
  if (text === undefined) return undefined;
  if ((MODEL_CHOICES as readonly string[]).includes(text)) return text as ModelChoice;
  throw inputError('option.invalid', ['--model'], text, `is not a delay model; allowed: ${MODEL_CHOICES.join(', ')}`);
}

export function selectModel(choice: ModelChoice | undefined, tables: DelayTables | undefined, warn: (message: string) => void): DelayModel {
  if (choice === 'analytic') return analyticModel;
  if (tables) return tableModel(tables, { warn });
  if (choice === 'table') {
    throw inputError(
      'option.invalid',
      ['--model'],
      'table',
      'needs delay tables: name them in the process card (tables: FILE.json, from phasegap characterize) or pass --tables FILE',
    );
  }
  return analyticModel;
}
