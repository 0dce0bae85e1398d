/**
 * A long-lived process (forked with a heap limit) that runs phasegap's `run()` on one argument
 * list at a time with captured output, the way test/helpers.ts cli() does in-process, so cases
 * pay no start-up; a hang is cut off by killing it, and running out of memory kills only it (a
 * worker thread's resourceLimits do not: V8 can abort the whole process). It also reports whether
 * the case left anything on Object.prototype.
 */
import { existsSync } from 'node:fs';
import { run } from '../../src/cli/program.js';
import { openFileStream, writeFileAtomic, type Io } from '../../src/cli/io.js';

export interface WorkerRequest {
  readonly id: number;
  readonly argv: readonly string[];
}
export interface WorkerReply {
  readonly id: number;
  readonly code: number | undefined;
  readonly stdout: string;
  readonly stderr: string;
  /** An exception that escaped run(): the in-process equivalent of "internal error". */
  readonly thrown: string | undefined;
  /** Keys found on Object.prototype after the case. */
  readonly polluted: readonly string[];
}

const baseline = new Set(Object.getOwnPropertyNames(Object.prototype));
const MAX_CAPTURE = 4_000_000;

process.on('message', async (request: WorkerRequest) => {
  let stdout = '';
  let stderr = '';
  const io: Io = {
    stdout: (t) => {
      if (stdout.length < MAX_CAPTURE) stdout += t;
    },
    stderr: (t) => {
      if (stderr.length < MAX_CAPTURE) stderr += t;
    },
    writeFile: writeFileAtomic,
    openFileStream,
    exists: existsSync,
    stderrIsTTY: false,
  };
  let code: number | undefined;
  let thrown: string | undefined;
  try {
    code = await run(request.argv, io);
  } catch (error) {
    thrown = error instanceof Error ? (error.stack ?? error.message) : String(error);
  }
  const polluted = Object.getOwnPropertyNames(Object.prototype).filter((k) => !baseline.has(k));
  const reply: WorkerReply = { id: request.id, code, stdout, stderr, thrown, polluted };
  process.send!(reply);
});
