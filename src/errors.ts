/**
 * Errors as data: every rejected input is described by where it is (a field path),
 * what was received and what is allowed. Rendering to words happens once, at the edge.
 */

/**
 * What kind of problem an issue is: `<area>.<problem>`, stable across releases (tests and scripts
 * match on it, not on the words). The table in DEVELOPERS.md ("Errors") says what each means.
 */
export type IssueCode =
  | 'field.unknown'
  | 'field.required'
  | 'field.not-allowed'
  | 'value.wrong-type'
  | 'value.not-allowed'
  | 'value.out-of-range'
  | 'value.too-many'
  | 'value.not-finite'
  | 'value.duplicate'
  | 'value.invalid'
  | 'reference.unknown'
  | 'file.not-found'
  | 'file.unreadable'
  | 'file.too-large'
  | 'file.syntax'
  | 'file.wrong-kind'
  | 'file.no-stdin'
  | 'file.data-limit'
  | 'netlist.invalid'
  | 'tables.invalid'
  | 'physics.device-off'
  | 'physics.limit'
  | 'physics.no-steady-state'
  | 'option.invalid'
  | 'output.refused'
  | 'tool.failed';

/** One problem found in the user's input. */
export interface InputIssue {
  /** The kind of problem, for programs and tests; the words below are for people. */
  readonly code: IssueCode;
  /** Dotted field path, e.g. `corners.vdd[1]`, or a file name for file-level problems. */
  readonly path: string;
  /** The offending value as the user wrote it (stringified), if there is one. */
  readonly value?: string;
  /** What is allowed, in words. */
  readonly allowed: string;
}

/** Thrown by the core for bad input or impossible physics; the CLI maps it to exit code 2. */
export class InputError extends Error {
  readonly issues: readonly InputIssue[];
  constructor(issues: readonly InputIssue[]) {
    super(renderIssues(issues).join('\n'));
    this.name = 'InputError';
    this.issues = issues;
  }
}

export function inputError(code: IssueCode, path: string, value: unknown, allowed: string): InputError {
  return new InputError([{ code, path, value: value === undefined ? undefined : showValue(value), allowed }]);
}

export function renderIssue(issue: InputIssue): string {
  const where = issue.path === '' ? '(top level)' : issue.path;
  const text = issue.value === undefined ? `${where}: ${issue.allowed}` : `${where}: ${issue.value} ${issue.allowed}`;
  // Messages from the schema library may quote a key as written: nothing a terminal acts on gets through.
  return text.replace(TERMINAL_UNSAFE, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
}

/** Like UNPRINTABLE below, but a message's own line breaks and tabs stay. */
const TERMINAL_UNSAFE = /[^\P{Cc}\n\t]|[\p{Cf}\p{Zl}\p{Zp}\p{Cs}]/gu;

/** Most issues rendered for one error; the rest are counted, so a hostile file cannot flood the terminal. */
export const MAX_RENDERED_ISSUES = 20;

/** The first `max` issues as lines, then one line counting the rest. */
export function renderIssues(issues: readonly InputIssue[], max = MAX_RENDERED_ISSUES): string[] {
  const lines = issues.slice(0, max).map(renderIssue);
  if (issues.length > max) lines.push(`... and ${issues.length - max} more`);
  return lines;
}

/** Characters a terminal could act on or reorder: controls, separators, format characters (shown as \uXXXX). */
const UNPRINTABLE = /[\p{Cc}\p{Cf}\p{Zl}\p{Zp}\p{Cs}]/gu;
const escaped = (json: string) => json.replace(UNPRINTABLE, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);

const MAX_SHOWN_CHARS = 60;
/** Longest string value shown: a 64-character name shows whole, a file-sized one does not. */
const MAX_SHOWN_STRING = 100;

export function showValue(value: unknown): string {
  if (typeof value === 'string') {
    const text = escaped(JSON.stringify(value));
    return text.length > MAX_SHOWN_STRING ? `${escaped(JSON.stringify(value.slice(0, MAX_SHOWN_STRING - 5))).slice(0, -1)}..."` : text;
  }
  if (typeof value === 'number' || typeof value === 'boolean' || value === null) return String(value);
  const json = JSON.stringify(value) as string | undefined;
  const text = json === undefined ? undefined : escaped(json);
  return text === undefined ? String(value) : text.length > MAX_SHOWN_CHARS ? `${text.slice(0, MAX_SHOWN_CHARS - 3)}...` : text;
}

/** Formats a path array (from zod or our own walkers) as `a.b[2].c`. */
export function formatPath(path: readonly PropertyKey[]): string {
  let out = '';
  for (const key of path) {
    if (typeof key === 'number') out += `[${key}]`;
    else if (typeof key === 'string' && key.match(UNPRINTABLE)) out += `[${showValue(key)}]`;
    else out += out === '' ? String(key) : `.${String(key)}`;
  }
  return out;
}
