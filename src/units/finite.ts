/**
 * The last guard before a number is written (JSON, CSV, Verilog, SPICE): Infinity and NaN are
 * never printed; they become an error naming what was being written.
 */
import { inputError, type IssuePath } from '../errors.js';

/** Returns `value` when it is finite; otherwise throws an InputError naming `what` (a field path or an output item). */
export function finite(value: number, what: IssuePath, why = ''): number {
  if (Number.isFinite(value)) return value;
  throw inputError('value.not-finite', what, value, `is not a finite number and cannot be written${why ? `: ${why}` : ''}`);
}
