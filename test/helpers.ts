/** Shared test helpers: one tolerance check, fixture paths, the CLI run against an in-memory Io, small inline designs. */
import { expect } from 'vitest';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parse as parseYaml } from 'yaml';
import { run } from '../src/cli/program.js';
import { openFileStream, writeFileAtomic, type Io } from '../src/cli/io.js';
import { loadProcess } from '../src/cli/load.js';
import { InputError, type InputIssue } from '../src/errors.js';
import { designSchema, type Design } from '../src/schema/design.js';
import { parseWith } from '../src/schema/validate.js';
import { resolveDesign, type ResolvedDesign } from '../src/analysis/resolve.js';
export { tempDir } from './temp-dirs.js';

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
/** `--set` arguments that keep only the typical corner, tt/1.8V/27C. */
export const TYPICAL_ONLY: readonly string[] = [
  '--set',
  'corners.process=[tt]',
  '--set',
  'corners.vdd=[1.8V]',
  '--set',
  'corners.temperature=[27]',
];

export interface CliRun {
  readonly code: number;
  readonly stdout: string;
  readonly stderr: string;
}

/** An Io that captures stdout and stderr; files are written for real (atomically). */
function capturingIo(extra: Partial<Io> = {}): { io: Io; captured: () => { stdout: string; stderr: string } } {
  let stdout = '';
  let stderr = '';
  const io: Io = {
    stdout: (t) => {
      stdout += t;
    },
    stderr: (t) => {
      stderr += t;
    },
    writeFile: writeFileAtomic,
    openFileStream,
    exists: existsSync,
    stderrIsTTY: false,
    ...extra,
  };
  return { io, captured: () => ({ stdout, stderr }) };
}

/** Runs the CLI in-process with captured output. */
export function cli(...argv: string[]): CliRun {
  const { io, captured } = capturingIo();
  const code = run(argv, io);
  if (typeof code !== 'number') throw new Error('this command runs asynchronously: use cliAsync');
  return { code, ...captured() };
}

/** Like cliAsync(), with parts of the Io given: standard input, a fixed clock. */
export async function cliWith(extra: Partial<Io>, ...argv: string[]): Promise<CliRun> {
  const { io, captured } = capturingIo(extra);
  const code = await run(argv, io);
  return { code, ...captured() };
}

/** Like cli(), for the commands that return a promise (mc, sweep). */
export async function cliAsync(...argv: string[]): Promise<CliRun> {
  const { io, captured } = capturingIo();
  const code = await run(argv, io);
  return { code, ...captured() };
}

/** The message of the InputError that `fn` throws; fails if it throws nothing or something else. */
/** The issues of the InputError `fn` throws, for tests that assert codes and paths rather than words. */
export function inputIssues(fn: () => unknown): readonly InputIssue[] {
  try {
    fn();
  } catch (error) {
    if (error instanceof InputError) return error.issues;
    throw error;
  }
  throw new Error('expected an InputError');
}

export function inputErrorMessage(fn: () => unknown): string {
  try {
    fn();
  } catch (error) {
    if (error instanceof InputError) return error.message;
    throw error;
  }
  throw new Error('expected an InputError');
}

/** A design from YAML text (its `process` is ignored by resolveYaml). */
export function designFromYaml(text: string): Design {
  return parseWith(designSchema, parseYaml(text));
}

/** Resolves a YAML design against fixtures/processes/<card>.yaml. */
export function resolveYaml(text: string, card = 'generic180'): ResolvedDesign {
  return resolveDesign(designFromYaml(text), loadProcess(processCard(card)));
}

/**
 * An output with its run record's date removed (and its command line, with `command`), for
 * comparing two runs: the record says when and how each was made, so only those differ.
 */
export function withoutStamp(text: string, command = false): string {
  let out = text.replace(/^(provenance: phasegap \S+), \S+$/m, '$1').replace(/("date": )"[^"]*"/, '$1""');
  if (command) out = out.replace(/^provenance: command: .*$/m, '').replace(/("command": )\[[^\]]*\]/, '$1[]');
  return out;
}

/**
 * An output with its run record's date and command line blanked, so two runs that differ only in
 * how they were invoked (or when) compare equal: a JSON report loses its `provenance`, a text
 * output the ISO date and the `command: ...` field of its header or footer.
 */
export function withoutRunRecord(text: string): string {
  if (text.trimStart().startsWith('{')) {
    const parsed = JSON.parse(text) as Record<string, unknown>;
    delete parsed.provenance;
    return JSON.stringify(parsed, null, 2);
  }
  return text.replace(/\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d(\.\d+)?Z/g, 'DATE').replace(/command: phasegap[^;\n]*/g, 'command: COMMAND');
}
