/** Where a command's main output goes: stdout, or a file written atomically (`-o FILE`, `-o -` for stdout). */
import { inputError } from '../errors.js';
import type { Io } from './io.js';

export function emit(io: Io, text: string, out: string | undefined): void {
  if (out === undefined || out === '-') {
    io.stdout(text);
    return;
  }
  try {
    io.writeFile(out, text);
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code ?? 'error';
    throw inputError('--out', out, `cannot be written (${code}); check that the folder exists and is writable`);
  }
}

export function toJson(value: unknown): string {
  return `${JSON.stringify(value, null, 2)}\n`;
}
