/** `--set PATH=VALUE` overrides: edit the raw design before it is validated. */
import { parse } from 'yaml';
import { inputError } from '../errors.js';

/** Applies overrides in order to a deep copy of `raw`; values are read as YAML scalars or flows. */
export function applyOverrides(raw: unknown, overrides: readonly string[]): unknown {
  if (overrides.length === 0) return raw;
  const root = structuredClone(raw) as Record<string, unknown>;
  for (const text of overrides) {
    const eq = text.indexOf('=');
    if (eq <= 0) throw inputError('--set', text, 'must read PATH=VALUE, e.g. clock.frequency=40MHz');
    const path = splitPath(text.slice(0, eq), text);
    let value: unknown;
    try {
      value = parse(text.slice(eq + 1));
    } catch {
      throw inputError('--set', text, 'has a value that is not a YAML scalar, list or mapping');
    }
    setAt(root, path, value, text);
  }
  return root;
}

function splitPath(path: string, text: string): Array<string | number> {
  const parts: Array<string | number> = [];
  for (const piece of path.split('.')) {
    const match = /^([^[\]]+)((?:\[\d+\])*)$/.exec(piece);
    if (!match) throw inputError('--set', text, 'has a malformed path; write keys separated by dots, list items as [N], e.g. corners.vdd[0]=1.6V');
    parts.push(match[1]!);
    for (const index of match[2]!.matchAll(/\[(\d+)\]/g)) parts.push(Number(index[1]));
  }
  return parts;
}

function setAt(root: Record<string, unknown>, path: Array<string | number>, value: unknown, text: string): void {
  let node: unknown = root;
  for (let i = 0; i < path.length - 1; i++) {
    const key = path[i]!;
    const container = node as Record<string | number, unknown>;
    if (container[key] === undefined || container[key] === null) container[key] = typeof path[i + 1] === 'number' ? [] : {};
    node = container[key];
    if (typeof node !== 'object') {
      throw inputError('--set', text, `cannot set inside ${path.slice(0, i + 1).join('.')}, which holds a plain value`);
    }
  }
  (node as Record<string | number, unknown>)[path[path.length - 1]!] = value;
}
