/** Option checks shared by the commands that write drawings and waveforms (kept free of the SVG stack, so loading them is cheap). */
import { inputError } from '../errors.js';
import { NET_CHOICES, type NetChoice } from '../render/rows.js';

/** `--out` is required for every drawing: a file name, or - for stdout. */
export function requireOut(out: string | undefined, what: string): string {
  if (out === undefined || out === '')
    throw inputError('option.invalid', ['--out'], undefined, `is required: name the ${what} file to write, or - for stdout`);
  return out;
}

export function parseNets(value: string): NetChoice {
  if (!(NET_CHOICES as readonly string[]).includes(value))
    throw inputError('option.invalid', ['--nets'], value, `is not a net selection; allowed: ${NET_CHOICES.join(', ')}`);
  return value as NetChoice;
}
