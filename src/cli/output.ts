/** Where a command's main output goes: stdout, or a file written atomically (`-o FILE`, `-o -` for stdout). */
import { dirname, resolve } from 'node:path';
import { InputError, inputError } from '../errors.js';
import { pathKind, sameFile, type FileStream, type Io } from './io.js';
import type { LoadedDesign } from './load.js';

/** Whether `out` means standard output. */
export const toStdout = (out: string | undefined): out is undefined | '-' => out === undefined || out === '-';

/**
 * Refuses an output file that is not a plain file (a symbolic link, a device, a FIFO, a folder) or
 * that is one of the command's inputs. Renaming over a link or a device would replace it with a
 * regular file, and writing through it would reach whatever it points at; phasegap writes only
 * regular files and leaves anything else to the shell (`-o -` and a redirection).
 */
export function checkOutput(out: string | undefined, inputs: readonly string[], option = '--out'): void {
  if (toStdout(out)) return;
  const kind = pathKind(out);
  if (kind !== 'absent' && kind !== 'regular file') {
    throw inputError(
      'output.refused',
      [option],
      out,
      `is a ${kind}; phasegap writes only regular files (use -o - and a shell redirection to write elsewhere)`,
    );
  }
  const input = inputs.find((path) => sameFile(path, out));
  if (input !== undefined)
    throw inputError(
      'output.refused',
      [option],
      out,
      `is an input of this command (${input}); writing it would replace the input, pick another name`,
    );
}

export function emit(io: Io, text: string, out: string | undefined, inputs: readonly string[], option = '--out'): void {
  if (toStdout(out)) {
    io.stdout(text);
    return;
  }
  checkOutput(out, inputs, option);
  try {
    io.writeFile(out, text);
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code ?? 'error';
    throw inputError('output.refused', [option], out, `cannot be written (${code}); check that the folder exists and is writable`);
  }
}

/** An output written as it is produced (sweep rows): to stdout, or to a file that appears whole at `finish`. */
export interface OutputSink {
  write(text: string): void;
  finish(): void;
  /** Drops a file output (nothing is left behind); stdout keeps what was written. */
  abandon(): void;
}

/**
 * Like `emit` for an output too large to hold: a file output goes through `io.openFileStream` and
 * is renamed into place at `finish`, after `checkOutput` once more.
 */
export function streamOutput(io: Io, out: string | undefined, inputs: readonly string[]): OutputSink {
  if (toStdout(out)) return { write: (t) => io.stdout(t), finish: () => undefined, abandon: () => undefined };
  checkOutput(out, inputs);
  let file: FileStream;
  try {
    file = io.openFileStream(out);
  } catch (error) {
    throw inputError(
      'option.invalid',
      ['--out'],
      out,
      `cannot be written (${(error as NodeJS.ErrnoException).code ?? 'error'}); check that the folder exists and is writable`,
    );
  }
  const failed = (error: unknown) => {
    file.abandon();
    if (error instanceof InputError) return error;
    return inputError(
      'option.invalid',
      ['--out'],
      out,
      `cannot be written (${(error as NodeJS.ErrnoException).code ?? 'error'}); check that the disk has room`,
    );
  };
  return {
    write: (t) => {
      try {
        file.write(t);
      } catch (error) {
        throw failed(error);
      }
    },
    finish: () => {
      try {
        file.commit(() => checkOutput(out, inputs));
      } catch (error) {
        throw failed(error);
      }
    },
    abandon: () => file.abandon(),
  };
}

/**
 * The files a command reading this design depends on: the design, its process card, the delay
 * tables in use and the SPICE model file, as far as they are files.
 */
export function inputFiles(loaded: LoadedDesign, options: { readonly tables?: string; readonly models?: string }): string[] {
  return [...designFiles(loaded), ...cardFiles(loaded.card, loaded.cardDir, options)];
}

/** `inputFiles` after refusing an `--out` that is one of them or cannot be written: call it right after loading. */
export function checkedInputs(
  loaded: LoadedDesign,
  options: { readonly out?: string; readonly tables?: string; readonly models?: string },
): string[] {
  const inputs = inputFiles(loaded, options);
  checkOutput(options.out, inputs);
  return inputs;
}

/** The design file and its process card file (when the card is not inline). */
export function designFiles(loaded: LoadedDesign): string[] {
  const design = loaded.designPath === '-' ? [] : [loaded.designPath];
  return loaded.processSource === 'inline' ? design : [...design, resolve(dirname(loaded.designPath), loaded.processSource)];
}

/** The tables and SPICE model file a process card names (or the options replace), resolved. */
export function cardFiles(
  card: LoadedDesign['card'],
  cardDir: string,
  options: { readonly tables?: string; readonly models?: string },
): string[] {
  const files: string[] = [];
  if (options.tables !== undefined) files.push(options.tables);
  else if (card.tables !== undefined) files.push(resolve(cardDir, card.tables));
  if (options.models !== undefined) files.push(options.models);
  else if (card.spice !== undefined) files.push(resolve(cardDir, card.spice.models));
  return files;
}

export function toJson(value: unknown): string {
  return `${JSON.stringify(value, null, 2)}\n`;
}
