#!/usr/bin/env node
/** Entry point of the `phasegap` binary: the only place that reads process.argv and exits. */
import { processIo, StreamWriteError } from './io.js';
import { EXIT_INPUT, run } from './program.js';

/**
 * A failed write to stdout or stderr ends the run with one line and exit 2; a reader that closes
 * the pipe early (`phasegap check ... | head`) is not an error and ends it quietly.
 */
function streamFailed(stream: StreamWriteError['stream'], code: string): never {
  if (code === 'EPIPE') process.exit(process.exitCode ?? 0);
  if (stream === 'standard output') {
    try {
      process.stderr.write(`phasegap: cannot write to ${stream} (${code})\n`);
    } catch {
      /* stderr is gone too */
    }
  }
  process.exit(EXIT_INPUT);
}

process.stdout.on('error', (error: NodeJS.ErrnoException) => streamFailed('standard output', error.code ?? 'error'));
process.stderr.on('error', (error: NodeJS.ErrnoException) => streamFailed('standard error', error.code ?? 'error'));

try {
  process.exitCode = await run(process.argv.slice(2), processIo);
} catch (error) {
  if (error instanceof StreamWriteError) streamFailed(error.stream, error.code);
  process.stderr.write(`phasegap: internal error: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`);
  process.exitCode = 3;
}
