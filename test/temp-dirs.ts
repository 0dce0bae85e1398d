/** Temporary folders for tests, removed by test/setup.ts when their test or file ends. */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { expect } from 'vitest';

const testDirs: string[] = [];
const fileDirs: string[] = [];

/**
 * A fresh temporary folder for a test's files. One made inside a test is removed after that test;
 * one made while the file is collected or in beforeAll, after the file (test/setup.ts).
 */
export function tempDir(prefix = 'phasegap-test-'): string {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  (expect.getState().currentTestName === undefined ? fileDirs : testDirs).push(dir);
  return dir;
}

/** Removes the folders tempDir made in the test that just ended, or with `file` every one left. */
export function removeTempDirs(scope: 'test' | 'file'): void {
  const dirs = scope === 'test' ? testDirs.splice(0) : [...testDirs.splice(0), ...fileDirs.splice(0)];
  for (const dir of dirs) rmSync(dir, { recursive: true, force: true });
}
