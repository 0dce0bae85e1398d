/** Validation at the boundary: zod issues become our InputIssues with path, value and allowed. */
import type * as z from 'zod';
import { formatPath, InputError, showValue, type InputIssue } from '../errors.js';

export function parseWith<S extends z.ZodType>(schema: S, raw: unknown, prefix = ''): z.output<S> {
  const result = schema.safeParse(raw);
  if (result.success) return result.data;
  throw new InputError(result.error.issues.map((issue) => toInputIssue(issue, raw, prefix, schema)));
}

interface SchemaDef {
  readonly type: string;
  readonly shape?: Record<string, z.ZodType>;
  readonly innerType?: z.ZodType;
  readonly in?: z.ZodType;
  readonly element?: z.ZodType;
  readonly options?: readonly z.ZodType[];
  readonly valueType?: z.ZodType;
  readonly items?: readonly z.ZodType[];
}

function defOf(schema: z.ZodType): SchemaDef {
  return (schema as unknown as { _zod: { def: SchemaDef } })._zod.def;
}

/** The object schemas a path can lead to (several where a union branches). */
function objectsAt(schema: z.ZodType, path: readonly PropertyKey[]): SchemaDef[] {
  const def = defOf(schema);
  switch (def.type) {
    case 'default': case 'optional': case 'prefault': case 'nullable': case 'readonly':
      return objectsAt(def.innerType!, path);
    case 'pipe': return objectsAt(def.in!, path);
    case 'union': return def.options!.flatMap((o) => objectsAt(o, path));
    case 'array': return path.length === 0 ? [] : objectsAt(def.element!, path.slice(1));
    case 'tuple': return path.length === 0 ? [] : objectsAt(def.items![Number(path[0])] ?? def.items![0]!, path.slice(1));
    case 'record': return path.length === 0 ? [] : objectsAt(def.valueType!, path.slice(1));
    case 'object': {
      if (path.length === 0) return [def];
      const next = def.shape![String(path[0])];
      return next ? objectsAt(next, path.slice(1)) : [];
    }
    default: return [];
  }
}

function knownKeys(schema: z.ZodType, path: readonly PropertyKey[]): string[] {
  const keys = new Set<string>();
  for (const def of objectsAt(schema, path)) for (const key of Object.keys(def.shape ?? {})) keys.add(key);
  return [...keys];
}

function toInputIssue(issue: z.core.$ZodIssue, root: unknown, prefix: string, schema: z.ZodType): InputIssue {
  const path = joinPath(prefix, formatPath(issue.path));
  const received = valueAt(root, issue.path);
  switch (issue.code) {
    case 'unrecognized_keys':
      return {
        path: joinPath(path, ''),
        allowed: `unknown key${issue.keys.length > 1 ? 's' : ''} ${issue.keys.map((k) => JSON.stringify(k)).join(', ')}; allowed keys here are ${allowedKeys(schema, issue.path)}`,
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
      if (received === undefined) return { path, allowed: 'is required' };
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

function allowedKeys(schema: z.ZodType, path: readonly PropertyKey[]): string {
  const known = knownKeys(schema, path);
  return known.length > 0 ? known.join(', ') : 'those listed by `phasegap schema`';
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
