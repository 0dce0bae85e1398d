/**
 * Errors as data: every rejected input is described by where it is (a field path),
 * what was received and what is allowed. Rendering to words happens once, at the edge.
 */

/**
 * What kind of problem an issue is: `<area>.<problem>`, stable across releases (tests and scripts
 * match on it, not on the words). The table in DEVELOPERS.md ("Errors") says what each means.
 */
export const ISSUE_CODES = [
  'field.unknown',
  'field.required',
  'field.not-allowed',
  'value.wrong-type',
  'value.not-allowed',
  'value.out-of-range',
  'value.too-many',
  'value.not-finite',
  'value.duplicate',
  'value.invalid',
  'reference.unknown',
  'file.not-found',
  'file.unreadable',
  'file.too-large',
  'file.syntax',
  'file.wrong-kind',
  'file.no-stdin',
  'file.data-limit',
  'netlist.invalid',
  'tables.invalid',
  'physics.device-off',
  'physics.limit',
  'physics.no-steady-state',
  'option.invalid',
  'output.refused',
  'tool.failed',
] as const;

export type IssueCode = (typeof ISSUE_CODES)[number];

/** A place in the input: keys and list indices from the top, e.g. `['switches', 2, 'nodes', 'a']`. */
export type IssuePath = readonly (string | number)[];

/** One problem found in the user's input. */
export interface InputIssue {
  /** The kind of problem, for programs and tests; the words below are for people. */
  readonly code: IssueCode;
  /**
   * Where: the keys from the top of the input, rendered by `formatPath` as `switches[2].nodes.a`.
   * Its first key may name a whole input instead (`DESIGN`, `--corners`, an outside tool).
   */
  readonly path: IssuePath;
  /** The input file the path is inside, when that is not the design (a process card, tables, a report). */
  readonly file?: string;
  /** The offending value as the user wrote it (stringified), if there is one. */
  readonly value?: string;
  /** What is expected instead, in words. */
  readonly expected: string;
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

/** One issue: `path` is the keys from the top (`['corners', 'vdd', 1]`, `['--model']`), never dotted text. */
export function inputError(code: IssueCode, path: IssuePath, value: unknown, expected: string): InputError {
  return new InputError([{ code, path, value: value === undefined ? undefined : showValue(value), expected }]);
}

/** The issues of `error` placed inside `file` (a process card, tables): their paths stay as they are. */
export function inFile(error: InputError, file: string): InputError {
  return new InputError(error.issues.map((issue) => (issue.file === undefined ? { ...issue, file } : issue)));
}

export function renderIssue(issue: InputIssue): string {
  const path = formatPath(issue.path);
  const where = issue.file === undefined ? (path === '' ? '(top level)' : path) : path === '' ? issue.file : `${issue.file}: ${path}`;
  const text = issue.value === undefined ? `${where}: ${issue.expected}` : `${where}: ${issue.value} ${issue.expected}`;
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

/**
 * Formats a path array (from zod or our own walkers) as `a.b[2].c`. After a command-line option
 * comes its argument, spaced: `['--vary', 'clock.frequency']` is `--vary clock.frequency`.
 */
export function formatPath(path: readonly PropertyKey[]): string {
  let out = '';
  path.forEach((key, i) => {
    if (typeof key === 'number') out += `[${key}]`;
    else if (typeof key === 'string' && key.match(UNPRINTABLE)) out += `[${showValue(key)}]`;
    else if (i === 1 && isOption(path[0])) out += ` ${String(key)}`;
    else out += out === '' ? String(key) : `.${String(key)}`;
  });
  return out;
}

const isOption = (key: PropertyKey | undefined): boolean => typeof key === 'string' && key.startsWith('-');

/** A zod or walker path as an issue path (a symbol key, which data never has, as its description). */
export function issuePath(path: readonly PropertyKey[]): (string | number)[] {
  return path.map((key) => (typeof key === 'symbol' ? String(key) : key));
}
