/** Parsing of numeric command-line options: one place that says what a whole number is and how large it may be. */
import { inputError } from '../errors.js';

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
    const what = range.noun === undefined
      ? `of at least ${range.min} and at most ${range.max}`
      : `of ${range.noun} from ${range.min} to ${range.max}`;
    throw inputError(option, text, `must be a whole number ${what}`);
  }
  return value;
}

/** Like wholeNumber, with `fallback` when the option was not given. */
export function optionalWholeNumber(option: string, text: string | undefined, range: WholeRange, fallback: number): number {
  return text === undefined ? fallback : wholeNumber(option, text, range);
}
