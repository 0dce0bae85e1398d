#!/usr/bin/env node
/** Entry point of the `phasegap` binary: the only place that reads process.argv and exits. */
import { processIo } from './io.js';
import { run } from './program.js';

try {
  process.exitCode = run(process.argv.slice(2), processIo);
} catch (error) {
  process.stderr.write(`phasegap: internal error: ${error instanceof Error ? error.stack ?? error.message : String(error)}\n`);
  process.exitCode = 3;
}
