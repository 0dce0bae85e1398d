/**
 * The shape every file phasegap reads must have before its schema sees it: plain data (mappings,
 * lists, strings, numbers, booleans, null) within the bounds of limits.ts, with no reserved name
 * (constructor, __proto__, toString, ...) as a key or as a value: names become keys of plain
 * objects further in, where such a name would find or replace the built-in member.
 * Checked once, before any expensive work, so the schema and the core can trust the size.
 */
import { InputError, issuePath, showValue, type InputIssue } from '../errors.js';
import { MAX_DEPTH, MAX_LIST_ITEMS, MAX_MAPPING_KEYS, MAX_VALUES, RESERVED_KEYS } from './limits.js';

export const shapeMessages = {
  depth: `nests deeper than ${MAX_DEPTH} levels of mappings and lists; phasegap files nest at most about 10 deep`,
  keys: (count: number) => `has ${count} keys; a mapping may hold at most ${MAX_MAPPING_KEYS}`,
  items: (count: number) => `has ${count} items; a list may hold at most ${MAX_LIST_ITEMS}`,
  values: `holds more than ${MAX_VALUES} values in all (counting each use of a YAML alias); phasegap files hold far fewer`,
  reserved: (key: string) =>
    `uses the reserved key ${JSON.stringify(key)} (a built-in object member name: constructor, prototype, __proto__, toString, ...); choose another name`,
  reservedName: 'is a reserved name (a built-in object member: constructor, prototype, __proto__, toString, ...); choose another name',
  kind: 'is not plain data; write numbers, strings, booleans, lists and mappings (YAML sets, timestamps and binary are not read)',
};

/** Throws an InputError at the first place `data` leaves the allowed shape; `prefix` starts every path. */
export function checkDataShape(data: unknown, prefix: readonly PropertyKey[] = []): void {
  const path: PropertyKey[] = [...prefix];
  let values = 0;
  const fail = (allowed: string, value?: string): never => {
    const issue: InputIssue = {
      code: 'file.data-limit',
      path: issuePath(path),
      value: value === undefined ? undefined : showValue(value),
      expected: allowed,
    };
    throw new InputError([issue]);
  };
  const visit = (node: unknown, depth: number): void => {
    if (++values > MAX_VALUES) fail(shapeMessages.values);
    if (typeof node === 'string' && RESERVED_KEYS.has(node)) fail(shapeMessages.reservedName, node);
    if (node === null || typeof node === 'string' || typeof node === 'number' || typeof node === 'boolean') return;
    if (depth >= MAX_DEPTH) fail(shapeMessages.depth);
    if (Array.isArray(node)) {
      if (node.length > MAX_LIST_ITEMS) fail(shapeMessages.items(node.length));
      for (let i = 0; i < node.length; i++) {
        path.push(i);
        visit(node[i], depth + 1);
        path.pop();
      }
      return;
    }
    if (typeof node !== 'object' || !isPlainObject(node)) fail(shapeMessages.kind);
    const keys = Object.keys(node as object);
    if (keys.length > MAX_MAPPING_KEYS) fail(shapeMessages.keys(keys.length));
    for (const key of keys) {
      path.push(key);
      if (RESERVED_KEYS.has(key)) fail(shapeMessages.reserved(key));
      visit((node as Record<string, unknown>)[key], depth + 1);
      path.pop();
    }
  };
  visit(data, 0);
}

function isPlainObject(node: object): boolean {
  const proto: unknown = Object.getPrototypeOf(node);
  return proto === Object.prototype || proto === null;
}
