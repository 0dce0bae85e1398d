#!/usr/bin/env node
/** Entry point of the `phasegap` binary: the only place that reads process.argv and exits. */
import { processIo } from './io.js';
import { run } from './program.js';

// A reader that closes the pipe early (`phasegap check ... | head`) is not an error.
for (const stream of [process.stdout, process.stderr]) {
  stream.on('error', (error: NodeJS.ErrnoException) => {
    if (error.code === 'EPIPE') process.exit(process.exitCode ?? 0);
    throw error;
  });
}

try {
  process.exitCode = await run(process.argv.slice(2), processIo);
} catch (error) {
  process.stderr.write(`phasegap: internal error: ${error instanceof Error ? error.stack ?? error.message : String(error)}\n`);
  process.exitCode = 3;
}
