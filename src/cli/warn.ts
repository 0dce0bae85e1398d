/**
 * Lines for stderr, all with the program's prefix: `phasegap: warning: ...` for warnings and
 * `phasegap: ...` for what a command reports about its progress or its files.
 */
import type { Io } from './io.js';

export const warningLine = (message: string): string => `phasegap: warning: ${message}\n`;

export const warnTo =
  (io: Io) =>
  (message: string): void =>
    io.stderr(warningLine(message));

/** A progress or file note on stderr: `phasegap: wrote x.sp ...`. */
export const noteTo = (io: Io, message: string): void => io.stderr(`phasegap: ${message}\n`);
