/** Validation at the boundary: zod issues become our InputIssues with path, value and expected. */
import type * as z from 'zod';
import { InputError, issuePath, showValue, type InputIssue, type IssueCode, type IssuePath } from '../errors.js';
import { closestName } from './closest-name.js';

export function parseWith<S extends z.ZodType>(schema: S, raw: unknown, prefix: IssuePath = []): z.output<S> {
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

/**
 * The object schemas a path can lead to (several where a union branches). `value` is the raw
 * data at the same place: a discriminated union follows the branch its discriminator picks.
 */
function objectsAt(schema: z.ZodType, path: readonly PropertyKey[], value: unknown): SchemaDef[] {
  const def = defOf(schema);
  const child = (key: PropertyKey) => ownValue(value, key);
  switch (def.type) {
    case 'default':
    case 'optional':
    case 'prefault':
    case 'nullable':
    case 'readonly':
      return objectsAt(def.innerType!, path, value);
    case 'pipe':
      return objectsAt(def.in!, path, value);
    case 'union': {
      const all = def.options!.map((o) => objectsAt(o, path, value));
      const key = (def as { discriminator?: string }).discriminator;
      if (key !== undefined) {
        const picked = def.options!.findIndex((o) => literalValues(o, key).includes(child(key)));
        if (picked >= 0) return all[picked]!;
      }
      return all.flat();
    }
    case 'array':
      return path.length === 0 ? [] : objectsAt(def.element!, path.slice(1), child(path[0]!));
    case 'tuple':
      return path.length === 0 ? [] : objectsAt(def.items![Number(path[0])] ?? def.items![0]!, path.slice(1), child(path[0]!));
    case 'record':
      return path.length === 0 ? [] : objectsAt(def.valueType!, path.slice(1), child(path[0]!));
    case 'object': {
      if (path.length === 0) return [def];
      const next = ownValue(def.shape, String(path[0])) as z.ZodType | undefined;
      return next ? objectsAt(next, path.slice(1), child(path[0]!)) : [];
    }
    default:
      return [];
  }
}

/** The literal or enum values an object schema allows for `key` (its discriminator). */
function literalValues(schema: z.ZodType, key: string): unknown[] {
  const shape = defOf(schema).shape;
  const field = ownValue(shape, key) as z.ZodType | undefined;
  if (!field) return [];
  const def = defOf(field) as SchemaDef & { values?: unknown[]; entries?: Record<string, unknown> };
  if (def.values) return def.values;
  if (def.entries) return Object.values(def.entries);
  return [];
}

function knownKeys(schema: z.ZodType, path: readonly PropertyKey[], root: unknown): string[] {
  const keys = new Set<string>();
  for (const def of objectsAt(schema, path, root)) for (const key of Object.keys(def.shape ?? {})) keys.add(key);
  return [...keys];
}

function toInputIssue(issue: z.core.$ZodIssue, root: unknown, prefix: IssuePath, schema: z.ZodType): InputIssue {
  const path = [...prefix, ...issuePath(issue.path)];
  const received = valueAt(root, issue.path);
  switch (issue.code) {
    case 'unrecognized_keys':
      return {
        code: 'field.unknown',
        path,
        expected: `unknown key${issue.keys.length > 1 ? 's' : ''} ${listKeys(issue.keys)}${didYouMean(issue.keys, knownKeys(schema, issue.path, root))}; allowed keys here are ${allowedKeys(schema, issue.path, root)}`,
      };
    case 'invalid_key': {
      const inner = issue.issues
        .map((i) => i.message)
        .filter((m, i, all) => all.indexOf(m) === i)
        .join('; ');
      return {
        code: 'field.not-allowed',
        path: [...prefix, ...issuePath(issue.path.slice(0, -1))],
        value: showValue(issue.path[issue.path.length - 1]),
        expected: `is not allowed as a key here: ${inner}`,
      };
    }
    case 'invalid_type':
      return received === undefined
        ? { code: 'field.required', path, expected: `is required: ${fieldDescription(schema, issue.path, root) ?? issue.expected}` }
        : { code: 'value.wrong-type', path, value: showValue(received), expected: `has the wrong type; expected ${issue.expected}` };
    case 'invalid_value':
      if (received === undefined)
        return {
          code: 'field.required',
          path,
          expected: `is required; allowed: ${issue.values.map((v) => JSON.stringify(v)).join(', ')}`,
        };
      return {
        code: 'value.not-allowed',
        path,
        value: showValue(received),
        expected: `is not allowed; expected one of ${issue.values.map((v) => JSON.stringify(v)).join(', ')}`,
      };
    case 'invalid_union':
      if ('discriminator' in issue && issue.discriminator) {
        // zod already ends the path with the discriminator key.
        return {
          code: 'value.not-allowed',
          path,
          value: showValue(received),
          expected: `is not a known ${issue.discriminator}; ${issue.message}`,
        };
      }
      if (received === undefined)
        return {
          code: 'field.required',
          path,
          expected: `is required: ${fieldDescription(schema, issue.path, root) ?? 'see `phasegap schema`'}`,
        };
      return { code: 'value.wrong-type', path, value: showValue(received), expected: describeUnion(issue) };
    case 'too_small':
    case 'too_big':
      if (issue.origin === 'array' && Array.isArray(received)) {
        const bound = issue.code === 'too_big' ? `at most ${issue.maximum}` : `at least ${issue.minimum}`;
        return {
          code: 'value.too-many',
          path,
          expected: `has ${received.length} item${received.length === 1 ? '' : 's'}; ${bound} allowed`,
        };
      }
      return { code: 'value.out-of-range', path, value: showValue(received), expected: `is out of range: ${lowerFirst(issue.message)}` };
    default: {
      // A refinement may name its kind in params.code (a range check written as a refinement).
      const named = issue.code === 'custom' ? (issue.params as { code?: IssueCode } | undefined)?.code : undefined;
      const value = received === undefined ? undefined : showValue(received);
      return { code: named ?? 'value.invalid', path, value, expected: issue.message };
    }
  }
}

/** "; did you mean ..." for the unknown keys that are one typo from a known key. */
function didYouMean(keys: readonly string[], known: readonly string[]): string {
  const pairs = keys.slice(0, SHOWN_KEYS).flatMap((k) => {
    const near = closestName(k, known);
    return near === undefined ? [] : [`${JSON.stringify(near)} for ${showValue(k)}`];
  });
  if (pairs.length === 0) return '';
  return keys.length === 1 ? ` (did you mean ${pairs[0]!.split(' for ')[0]}?)` : ` (did you mean ${pairs.join(', ')}?)`;
}

/** The schema's own description of the field at `path` (through optional, default and pipe wrappers). */
function fieldDescription(schema: z.ZodType, path: readonly PropertyKey[], root: unknown): string | undefined {
  const key = path[path.length - 1];
  if (key === undefined) return undefined;
  for (const def of objectsAt(schema, path.slice(0, -1), root)) {
    let field = ownValue(def.shape, String(key)) as z.ZodType | undefined;
    while (field) {
      if (field.description) return field.description;
      const inner: SchemaDef = defOf(field);
      field = inner.innerType ?? inner.in;
    }
  }
  return undefined;
}

const SHOWN_KEYS = 3;
const SHOWN_KEY_CHARS = 24;

/** The first few unknown keys, each cut short: a long list or a long key says no more. */
function listKeys(keys: readonly string[]): string {
  const shown = keys.slice(0, SHOWN_KEYS).map((k) => showValue(k.length > SHOWN_KEY_CHARS ? `${k.slice(0, SHOWN_KEY_CHARS - 3)}...` : k));
  return keys.length > SHOWN_KEYS ? `${shown.join(', ')} and ${keys.length - SHOWN_KEYS} more` : shown.join(', ');
}

function describeUnion(issue: z.core.$ZodIssueInvalidUnion): string {
  const inner = issue.errors
    .flat()
    .map((e) => e.message)
    .filter((m, i, all) => all.indexOf(m) === i);
  return `does not match any allowed form (${inner.slice(0, 3).join('; ')})`;
}

function allowedKeys(schema: z.ZodType, path: readonly PropertyKey[], root: unknown): string {
  const known = knownKeys(schema, path, root);
  return known.length > 0 ? known.join(', ') : 'those listed by `phasegap schema`';
}

function lowerFirst(text: string): string {
  return text.charAt(0).toLowerCase() + text.slice(1);
}

function valueAt(root: unknown, path: readonly PropertyKey[]): unknown {
  let node: unknown = root;
  for (const key of path) node = ownValue(node, key);
  return node;
}

/** `node[key]` when node is an object that has `key` itself; a name never finds an inherited member. */
function ownValue(node: unknown, key: PropertyKey): unknown {
  return node !== null && typeof node === 'object' && Object.hasOwn(node, key)
    ? (node as Record<PropertyKey, unknown>)[key as string]
    : undefined;
}
