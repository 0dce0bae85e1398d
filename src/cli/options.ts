/** Parsing of numeric command-line options: one place that says what a whole number is and how large it may be. */
import { availableParallelism } from 'node:os';
import { inputError } from '../errors.js';
import { MAX_WORKERS } from './run-limits.js';

export interface WholeRange {
  readonly min: number;
  readonly max: number;
  /** What is counted, for the message, e.g. "clock periods". */
  readonly noun?: string;
}

/**
 * `text` as a whole number within [min, max]. Only plain decimal digits are read: "1e3", "0x10",
 * "2.0", "+3" and " 4" are refused, so what the user typed is exactly the number used.
 */
export function wholeNumber(option: string, text: string, range: WholeRange): number {
  const value = /^\d{1,16}$/.test(text) ? Number(text) : NaN;
  if (!(Number.isSafeInteger(value) && value >= range.min && value <= range.max)) {
    const what =
      range.noun === undefined ? `of at least ${range.min} and at most ${range.max}` : `of ${range.noun} from ${range.min} to ${range.max}`;
    throw inputError('option.invalid', [option], text, `must be a whole number ${what}`);
  }
  return value;
}

/** Like wholeNumber, with `fallback` when the option was not given. */
export function optionalWholeNumber(option: string, text: string | undefined, range: WholeRange, fallback: number): number {
  return text === undefined ? fallback : wholeNumber(option, text, range);
}

/** `text` as a relative value, a plain number (0.1) or a percentage (10%); NaN when it is neither. */
export function relativeNumber(text: string): number {
  const percent = /^(\d*\.?\d+)\s*%$/.exec(text.trim());
  return percent ? Number(percent[1]) / 100 : Number(text);
}

/** The parser of a whole-number option within `range`. */
export function wholeNumberIn(range: WholeRange): (text: string, flag: string) => number {
  return (text, flag) => wholeNumber(flag, text, range);
}

/** Threads or simulations at once when the option is absent: the number of cores, within the bound. */
export function defaultParallelism(): number {
  return Math.min(availableParallelism(), MAX_WORKERS);
}
