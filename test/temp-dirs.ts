/** Temporary folders for tests, removed by test/setup.ts when their test or file ends. */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const testDirs: string[] = [];
const fileDirs: string[] = [];
// Set by test/setup.ts around each test. Not expect's current test name: with the unit project's
// shared module graph (isolate: false) that still names the previous file's last test while the
// next file is collected.
let inTest = false;

/** Marks the start of a test (test/setup.ts): folders made from now on are the test's. */
export function enterTest(): void {
  inTest = true;
}

/**
 * A fresh temporary folder for a test's files. One made inside a test is removed after that test;
 * one made while the file is collected or in beforeAll, after the file (test/setup.ts).
 */
export function tempDir(prefix = 'phasegap-test-'): string {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  (inTest ? testDirs : fileDirs).push(dir);
  return dir;
}

/** Removes the folders tempDir made in the test that just ended, or with `file` every one left. */
export function removeTempDirs(scope: 'test' | 'file'): void {
  inTest = false;
  const dirs = scope === 'test' ? testDirs.splice(0) : [...testDirs.splice(0), ...fileDirs.splice(0)];
  for (const dir of dirs) rmSync(dir, { recursive: true, force: true });
}
