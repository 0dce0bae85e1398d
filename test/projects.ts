/**
 * Which vitest project runs which test file. `unit` is the fast one (modules called in-process on
 * small inputs, one thread, no other process); `system` runs the whole program; `integration`
 * drives outside programs (the table in outside-tools.ts). `test/projects.test.ts` holds the split
 * to its rules. No vitest import here: the config loads this module before any test runs.
 */
import { INTEGRATION_FILES } from './outside-tools.js';

/** The `system` project's folder: every command test runs a whole command on a design. */
export const SYSTEM_FOLDER = 'test/cli/';

/**
 * The `system` files outside test/cli/ (from the repository root), each with why it is not a
 * unit test.
 */
export const SYSTEM_FILES: Readonly<Record<string, string>> = {
  'test/golden/golden.test.ts': 'check and fmax of every demo design, pinned to the bit (minutes of CPU)',
  'test/quick-start.test.ts': "runs the README's npx phasegap (npm starts a process)",
  'test/report/shell-quote.test.ts': 'runs the quoted text through /bin/sh',
  'test/spice/spice-command.test.ts': 'runs the printed command through /bin/sh',
};

/**
 * What a unit file may not contain: another process, a worker thread (mc and sweep on more than one
 * worker), a module mock (the unit project shares one module graph per worker).
 */
export const NOT_IN_UNIT = /node:child_process|node:worker_threads|vi\.(do)?mock\(|'--workers', '(?!1')/;

/** The project of a test file (a path from the repository root). */
export function projectOf(file: string): 'unit' | 'system' | 'integration' {
  if (file in INTEGRATION_FILES) return 'integration';
  if (file.startsWith(SYSTEM_FOLDER) || file in SYSTEM_FILES) return 'system';
  return 'unit';
}

/** The `system` project's include patterns and the files the `unit` project leaves to other projects. */
export function systemInclude(): string[] {
  return [`${SYSTEM_FOLDER}**/*.test.ts`, ...Object.keys(SYSTEM_FILES)];
}
