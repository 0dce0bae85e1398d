/** Warnings go to stderr with the program's prefix. */
import type { Io } from './io.js';

export const warnTo = (io: Io) => (message: string) => io.stderr(`phasegap: warning: ${message}\n`);
