/**
 * Outside programs some tests drive. `requireTool` fails the enclosing suite (or file) with one
 * line naming the Debian package when the program is not on the PATH, instead of each test
 * failing with a spawn error and a stack.
 */
import { beforeAll } from 'vitest';
import { findOnPath } from './outside-tools.js';

export { findOnPath };

/** The one-line message for a missing program. */
export function missingToolMessage(command: string, debianPackage: string): string {
  return `${command} is not installed: run \`sudo apt-get install ${debianPackage}\` (or \`sudo bash .ci/run\` for every tool the tests use)`;
}

/** An error whose whole text is the one-line message (no stack frames), or undefined when installed. */
export function missingToolError(command: string, debianPackage: string): Error | undefined {
  if (findOnPath(command) !== undefined) return undefined;
  const error = new Error(missingToolMessage(command, debianPackage));
  error.stack = error.message;
  return error;
}

/** Registers a beforeAll that stops the enclosing suite with one line when `command` is missing. */
export function requireTool(command: string, debianPackage: string): void {
  beforeAll(() => {
    const error = missingToolError(command, debianPackage);
    if (error) throw error;
  });
}
