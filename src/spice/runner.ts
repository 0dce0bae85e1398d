/**
 * Runs ngspice in batch mode on a set of decks, several at a time, and returns each run's output.
 * Decks and logs live in a private temporary folder that is removed afterwards. The only module
 * outside the CLI that starts processes; it is called only from the CLI.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync, existsSync } from 'node:fs';
import { availableParallelism, tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { inputError } from '../errors.js';

export interface RunOptions {
  /** The ngspice executable (default `ngspice` on the PATH). */
  readonly program?: string;
  /** Most simulations at once (default: the number of cores). */
  readonly parallel?: number;
}

export interface RunOutput {
  readonly name: string;
  /** Everything ngspice printed (stdout and stderr). */
  readonly output: string;
}

/** Fails with a clear message when ngspice cannot be started. */
export function checkSimulator(program = 'ngspice'): string {
  const probe = spawnSync(program, ['-v'], { encoding: 'utf8' });
  if (probe.error) {
    const code = (probe.error as NodeJS.ErrnoException).code;
    throw inputError(
      'tool.failed',
      ['ngspice'],
      program,
      code === 'ENOENT'
        ? 'is not installed (or not on the PATH); install it with: sudo apt-get install ngspice (Debian/Ubuntu), or pass --ngspice PATH'
        : `cannot be started (${code ?? probe.error.message})`,
    );
  }
  const version = /ngspice-\S+/.exec(`${probe.stdout}${probe.stderr}`)?.[0];
  return version ?? 'ngspice';
}

export function runDecks(decks: ReadonlyArray<{ readonly name: string; readonly text: string }>, options: RunOptions = {}): RunOutput[] {
  const program = options.program ?? 'ngspice';
  checkSimulator(program);
  const folder = mkdtempSync(join(tmpdir(), 'phasegap-spice-'));
  try {
    const files = decks.map((deck, i) => {
      const file = `deck${i}.cir`;
      writeFileSync(join(folder, file), deck.text);
      return file;
    });
    const parallel = Math.max(1, Math.min(options.parallel ?? availableParallelism(), decks.length));
    // xargs runs up to `parallel` simulations at a time, each writing its own log; it starts ngspice
    // directly (no shell), reads NUL-separated names (no quote processing), and every run starts
    // in the fresh folder, so no .spiceinit from the caller's working directory is read.
    const executable = program.includes('/') ? resolve(program) : program;
    const run = spawnSync('xargs', ['-0', '-P', String(parallel), '-I', '{}', executable, '-b', '-o', '{}.log', '{}'], {
      input: files.join('\0'),
      encoding: 'utf8',
      maxBuffer: 64 * 1024 * 1024,
      cwd: folder,
      shell: false,
    });
    if (run.error) throw inputError('tool.failed', ['ngspice'], program, `could not be run through xargs (${run.error.message})`);
    return decks.map((deck, i) => {
      const log = join(folder, `${files[i]!}.log`);
      const output = existsSync(log) ? readFileSync(log, 'utf8') : `error: ngspice wrote no output for ${deck.name}`;
      return { name: deck.name, output };
    });
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}
