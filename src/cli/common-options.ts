/**
 * Options and arguments several commands share, declared once: a command lists them by reference
 * in its definition (see `command.ts`). Parsers for numbers live in `options.ts`.
 */
import { parsedOption, listOption, textOption, flagOption, type ArgumentSpec } from './command.js';
import { defaultParallelism, relativeNumber, wholeNumberIn } from './options.js';
import { inputError } from '../errors.js';
import { MAX_SEED, MAX_WORKERS } from './run-limits.js';

/** On the program itself, read by every command that loads a design. */
export const GLOBAL_OPTIONS = {
  model: textOption(
    '--model <KIND>',
    'delay model for every command: analytic or table (default: table when the process card names tables)',
  ),
  tables: textOption('--tables <FILE>', "delay tables (from phasegap characterize) to use instead of the card's; implies --model table"),
} as const;

export const DESIGN_ARGUMENT: ArgumentSpec = { name: '<DESIGN>', help: 'design file (YAML or JSON)' };

export const SET_OPTION = listOption(
  '--set <PATH=VALUE>',
  'override a design value before validation (repeatable), e.g. clock.frequency=40MHz',
);

export const JUNIT_OPTION = textOption('--junit <FILE>', 'also write the results as JUnit XML for a CI server (one test case per check)');

/** `-o FILE`: `what` the command writes, e.g. "the report". */
export function outOption(what: string) {
  return textOption('-o, --out <FILE>', `write ${what} to FILE atomically ('-' for stdout)`);
}

/** `--json`, false unless given. */
export function jsonOption(help: string) {
  return flagOption('--json', help, false);
}

/** ngspice runs at once (confirm, characterize). */
export const JOBS_OPTION = parsedOption(
  '--jobs <N>',
  'simulations at once (default: the number of cores)',
  wholeNumberIn({ min: 1, max: MAX_WORKERS, noun: 'simulations at once' }),
  { fallback: defaultParallelism() },
);

/** Worker threads (mc, sweep); `help` says what does not depend on them. */
export function workersOption(help: string) {
  return parsedOption('--workers <K>', help, wholeNumberIn({ min: 1, max: MAX_WORKERS, noun: 'threads' }), {
    fallback: defaultParallelism(),
  });
}

/** A Monte Carlo seed; absent, the design's montecarlo.seed or 1 applies. */
export function seedOption(help: string) {
  return parsedOption('--seed <S>', help, wholeNumberIn({ min: 0, max: MAX_SEED }));
}

export const MODELS_OPTION = textOption('--models <FILE>', "SPICE model file to include instead of the card's spice.models");

export const NGSPICE_OPTION = textOption('--ngspice <PATH>', 'the ngspice executable (default: ngspice on the PATH)');

/** `--tolerance` of an ngspice comparison: a relative difference; absent, the design's requirements.confirmTolerance or 10 %. */
export function toleranceOption(help: string) {
  return parsedOption('--tolerance <REL>', help, parseTolerance);
}

function parseTolerance(text: string, flag: string): number {
  const value = relativeNumber(text);
  if (!(value > 0 && value < 10))
    throw inputError('option.invalid', [flag], text, 'must be a relative difference above 0, e.g. 0.1 or 10%');
  return value;
}
