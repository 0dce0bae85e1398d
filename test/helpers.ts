/** Shared test helpers: one tolerance check, fixture paths, and the CLI run against an in-memory Io. */
import { expect } from 'vitest';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { run } from '../src/cli/program.js';
import type { Io } from '../src/cli/io.js';
import { writeFileAtomic } from '../src/cli/io.js';
import { existsSync } from 'node:fs';

/** |actual - expected| <= tolerance * max(1, |expected|) when relative, else <= tolerance. */
export function expectClose(actual: number, expected: number, tolerance: number, mode: 'abs' | 'rel' = 'rel'): void {
  const scale = mode === 'rel' ? Math.abs(expected) : 1;
  const bound = tolerance * (scale === 0 ? 1 : scale);
  if (!(Math.abs(actual - expected) <= bound)) {
    expect.fail(`expected ${actual} to be within ${mode === 'rel' ? `${tolerance * 100}%` : tolerance} of ${expected}`);
  }
}

export const ROOT = fileURLToPath(new URL('..', import.meta.url));
export const fixture = (...parts: string[]): string => join(ROOT, 'fixtures', ...parts);
export const design = (name: string): string => fixture('designs', `${name}.yaml`);
export const processCard = (name: string): string => fixture('processes', `${name}.yaml`);

export interface CliRun {
  readonly code: number;
  readonly stdout: string;
  readonly stderr: string;
}

/** Runs the CLI in-process with captured output; files are written for real (atomically). */
export function cli(...argv: string[]): CliRun {
  let stdout = '';
  let stderr = '';
  const io: Io = {
    stdout: (t) => { stdout += t; },
    stderr: (t) => { stderr += t; },
    writeFile: writeFileAtomic,
    exists: existsSync,
    stderrIsTTY: false,
  };
  const code = run(argv, io);
  if (typeof code !== 'number') throw new Error('this command runs asynchronously: use cliAsync');
  return { code, stdout, stderr };
}

/** Like cli(), for the commands that return a promise (mc, sweep). */
export async function cliAsync(...argv: string[]): Promise<CliRun> {
  let stdout = '';
  let stderr = '';
  const io: Io = {
    stdout: (t) => { stdout += t; },
    stderr: (t) => { stderr += t; },
    writeFile: writeFileAtomic,
    exists: existsSync,
    stderrIsTTY: false,
  };
  const code = await run(argv, io);
  return { code, stdout, stderr };
}

/** A fresh temporary folder for a test's files. */
export function tempDir(prefix = 'phasegap-test-'): string {
  return mkdtempSync(join(tmpdir(), prefix));
}

import { parse as parseYaml } from 'yaml';
import { designSchema, type Design } from '../src/schema/design.js';
import { parseWith } from '../src/schema/validate.js';
import { loadProcess } from '../src/cli/load.js';
import { resolveDesign, type ResolvedDesign } from '../src/analysis/resolve.js';

/** A design from YAML text whose `process` names a card under fixtures/processes (by name). */
export function designFromYaml(text: string): Design {
  return parseWith(designSchema, parseYaml(text));
}

/** Resolves a YAML design against fixtures/processes/<card>.yaml. */
export function resolveYaml(text: string, card = 'generic180'): ResolvedDesign {
  return resolveDesign(designFromYaml(text), loadProcess(processCard(card)));
}
