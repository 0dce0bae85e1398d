/** `--set PATH=VALUE` overrides: edit the raw design before it is validated. */
import { InputError, formatPath, inputError } from '../errors.js';
import { checkDataShape } from '../schema/data-shape.js';
import { MAX_DEPTH, MAX_SET_INDEX, RESERVED_KEYS } from '../schema/limits.js';
import { parseYamlText } from './yaml-text.js';

/** Applies overrides in order to a deep copy of `raw`; values are read as YAML scalars or flows. */
export function applyOverrides(raw: unknown, overrides: readonly string[]): unknown {
  if (overrides.length === 0) return raw;
  const root = structuredClone(raw) as Record<string, unknown>;
  for (const text of overrides) {
    const eq = text.indexOf('=');
    if (eq <= 0) throw inputError('option.invalid', ['--set'], text, 'must read PATH=VALUE, e.g. clock.frequency=40MHz');
    const path = splitPath(text.slice(0, eq), text);
    const value = readValue(text.slice(eq + 1), text, path);
    setAt(root, path, value, text);
  }
  return root;
}

function readValue(source: string, text: string, path: ReadonlyArray<string | number>): unknown {
  let value: unknown;
  try {
    value = parseYamlText(source, { name: '--set', quote: false });
  } catch (error) {
    if (error instanceof InputError)
      throw inputError('option.invalid', ['--set'], text, 'has a value that is not a YAML scalar, list or mapping');
    throw error;
  }
  try {
    checkDataShape(value, path);
  } catch (error) {
    if (error instanceof InputError)
      throw inputError(
        'option.invalid',
        ['--set'],
        text,
        `is refused at ${formatPath(error.issues[0]!.path)}: it ${error.issues[0]!.expected}`,
      );
    throw error;
  }
  return value;
}

function splitPath(path: string, text: string): Array<string | number> {
  const parts: Array<string | number> = [];
  for (const piece of path.split('.')) {
    const match = /^([^[\]]+)((?:\[\d+\])*)$/.exec(piece);
    if (!match)
      throw inputError(
        'option.invalid',
        ['--set'],
        text,
        'has a malformed path; write keys separated by dots, list items as [N], e.g. corners.vdd[0]=1.6V',
      );
    const key = match[1]!;
    if (RESERVED_KEYS.has(key))
      throw inputError(
        'option.invalid',
        ['--set'],
        text,
        `names the reserved key ${JSON.stringify(key)} (a built-in object member name), which no field, net, corner or switch may use`,
      );
    parts.push(key);
    for (const index of match[2]!.matchAll(/\[(\d+)\]/g)) {
      const n = Number(index[1]);
      if (n > MAX_SET_INDEX)
        throw inputError('option.invalid', ['--set'], text, `has list index ${index[1]}; a list holds at most ${MAX_SET_INDEX} items`);
      parts.push(n);
    }
  }
  if (parts.length > MAX_DEPTH)
    throw inputError(
      'option.invalid',
      ['--set'],
      text,
      `has a path ${parts.length} levels deep; design fields nest at most ${MAX_DEPTH} deep`,
    );
  return parts;
}

/** Walks own properties only and grows a list by at most one item, so nothing is allocated for a far index. */
function setAt(root: Record<string, unknown>, path: ReadonlyArray<string | number>, value: unknown, text: string): void {
  let node: unknown = root;
  for (let i = 0; i < path.length; i++) {
    const key = path[i]!;
    const where = describe(path, i);
    if (node === null || typeof node !== 'object') {
      throw inputError('option.invalid', ['--set'], text, `cannot set inside ${where}, which holds a plain value`);
    }
    if (Array.isArray(node) !== (typeof key === 'number')) {
      throw inputError(
        'option.invalid',
        ['--set'],
        text,
        Array.isArray(node)
          ? `cannot set key ${JSON.stringify(key)} in ${where}, which is a list; write ${where}[N]`
          : `cannot set item [${key}] in ${where}, which is a mapping; write ${where}.KEY`,
      );
    }
    if (typeof key === 'number' && key > (node as unknown[]).length) {
      throw inputError(
        'option.invalid',
        ['--set'],
        text,
        `sets item [${key}] of ${where}, which has ${(node as unknown[]).length} items; give an index from 0 to ${(node as unknown[]).length} (the last appends)`,
      );
    }
    // A field of a new item would leave the item's other required fields missing: one error here, not one per field.
    if (typeof key === 'number' && key === (node as unknown[]).length && i < path.length - 1) {
      const items = (node as unknown[]).length;
      throw inputError(
        'option.invalid',
        ['--set'],
        text,
        `sets a field of item [${key}] of ${where}, which has ${items} items${items > 0 ? ` (0 to ${items - 1})` : ''}; to add an item, set it whole, e.g. ${where}[${key}]={...}`,
      );
    }
    const container = node as Record<string | number, unknown>;
    if (i === path.length - 1) {
      container[key] = value;
      return;
    }
    const current = Object.hasOwn(container, key) ? container[key] : undefined;
    if (current === undefined || current === null) container[key] = typeof path[i + 1] === 'number' ? [] : {};
    node = container[key];
  }
}

/** The path up to (not including) part i, for messages: the container being edited. */
function describe(path: ReadonlyArray<string | number>, i: number): string {
  if (i === 0) return 'the design';
  return path
    .slice(0, i)
    .map((p, k) => (typeof p === 'number' ? `[${p}]` : k === 0 ? p : `.${p}`))
    .join('');
}
