/** Validation at the boundary: zod issues become our InputIssues with path, value and allowed. */
import type * as z from 'zod';
import { formatPath, InputError, showValue, type InputIssue } from '../errors.js';

export function parseWith<S extends z.ZodType>(schema: S, raw: unknown, prefix = ''): z.output<S> {
  const result = schema.safeParse(raw);
  if (result.success) return result.data;
  throw new InputError(result.error.issues.map((issue) => toInputIssue(issue, raw, prefix)));
}

function toInputIssue(issue: z.core.$ZodIssue, root: unknown, prefix: string): InputIssue {
  const path = joinPath(prefix, formatPath(issue.path));
  const received = valueAt(root, issue.path);
  switch (issue.code) {
    case 'unrecognized_keys':
      return {
        path: joinPath(path, ''),
        allowed: `unknown key${issue.keys.length > 1 ? 's' : ''} ${issue.keys.map((k) => JSON.stringify(k)).join(', ')}; allowed keys are ${allowedKeys(issue)}`,
      };
    case 'invalid_type':
      return received === undefined
        ? { path, allowed: `is required (${issue.expected})` }
        : { path, value: showValue(received), allowed: `has the wrong type; expected ${issue.expected}` };
    case 'invalid_value':
      return { path, value: showValue(received), allowed: `is not allowed; expected one of ${issue.values.map((v) => JSON.stringify(v)).join(', ')}` };
    case 'invalid_union':
      if ('discriminator' in issue && issue.discriminator) {
        return { path: joinPath(path, String(issue.discriminator)), value: showValue(valueAt(received, [issue.discriminator])), allowed: `is not a known ${issue.discriminator}; ${issue.message}` };
      }
      return { path, value: showValue(received), allowed: describeUnion(issue) };
    case 'too_small':
    case 'too_big':
      return { path, value: showValue(received), allowed: `is out of range: ${lowerFirst(issue.message)}` };
    default:
      return { path, value: received === undefined ? undefined : showValue(received), allowed: issue.message };
  }
}

function describeUnion(issue: z.core.$ZodIssueInvalidUnion): string {
  const inner = issue.errors.flat().map((e) => e.message).filter((m, i, all) => all.indexOf(m) === i);
  return `does not match any allowed form (${inner.slice(0, 3).join('; ')})`;
}

function allowedKeys(issue: z.core.$ZodIssueUnrecognizedKeys): string {
  const known = (issue as unknown as { known?: string[] }).known;
  return known ? known.join(', ') : 'those listed by `phasegap schema`';
}

function lowerFirst(text: string): string {
  return text.charAt(0).toLowerCase() + text.slice(1);
}

function joinPath(prefix: string, path: string): string {
  if (prefix === '') return path;
  if (path === '') return prefix;
  return path.startsWith('[') ? `${prefix}${path}` : `${prefix}.${path}`;
}

function valueAt(root: unknown, path: readonly PropertyKey[]): unknown {
  let node: unknown = root;
  for (const key of path) {
    if (node === null || typeof node !== 'object') return undefined;
    node = (node as Record<PropertyKey, unknown>)[key as string];
  }
  return node;
}
