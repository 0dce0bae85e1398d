/**
 * YAML text to plain data, safe against hostile input: duplicate keys found in one linear pass
 * (the yaml package's own `uniqueKeys` check compares every key with every earlier one), anchors
 * and aliases counted and bounded before they are expanded, every parser failure an InputError
 * with the line and column.
 */
import { isAlias, isMap, isPair, isScalar, isSeq, LineCounter, parseDocument, type Node } from 'yaml';
import { InputError } from '../errors.js';
import { MAX_ALIAS_COUNT, MAX_ALIASES, MAX_ANCHORS, MAX_DEPTH } from '../schema/limits.js';
import { shapeMessages } from '../schema/data-shape.js';

/**
 * How a file is named in errors. `quote` lets a syntax error repeat the parser's own words,
 * which may hold a few characters of the file: allowed for the file the user named, not for a
 * file that a design points at (it may be anything on disk).
 */
export interface TextSource {
  readonly name: string;
  readonly quote: boolean;
}

class Located extends Error {
  constructor(
    readonly offset: number,
    message: string,
  ) {
    super(message);
  }
}

export function parseYamlText(text: string, source: TextSource): unknown {
  const lines = new LineCounter();
  const fail = (offset: number, what: string): never => {
    const { line, col } = lines.linePos(offset);
    throw new InputError([
      { code: 'file.syntax', path: [], file: source.name, expected: `is not valid YAML or JSON at line ${line}, column ${col}: ${what}` },
    ]);
  };
  const unreadable = (): never => {
    throw new InputError([{ code: 'file.syntax', path: [], file: source.name, expected: 'could not be read as YAML or JSON' }]);
  };
  let doc: ReturnType<typeof parseDocument>;
  try {
    doc = parseDocument(text, { lineCounter: lines, prettyErrors: false, uniqueKeys: false, merge: false, logLevel: 'silent' });
  } catch {
    return unreadable();
  }
  const first = doc.errors[0];
  if (first) fail(first.pos[0], source.quote ? clip(first.message) : codeWords(first.code));
  try {
    checkNodes(doc.contents, source.quote);
  } catch (error) {
    if (error instanceof Located) fail(error.offset, error.message);
    throw error;
  }
  try {
    return doc.toJS({ maxAliasCount: MAX_ALIAS_COUNT });
  } catch (error) {
    if (!(error instanceof ReferenceError)) return unreadable();
    throw new InputError([
      {
        code: 'file.data-limit',
        path: [],
        file: source.name,
        expected: `uses YAML aliases that expand beyond ${MAX_ALIAS_COUNT} nodes; write the values out or use fewer aliases`,
      },
    ]);
  }
}

function clip(message: string): string {
  const line = message.split('\n')[0]!;
  return line.length > 100 ? `${line.slice(0, 97)}...` : line;
}

function codeWords(code: string): string {
  return `${code.toLowerCase().replace(/_/g, ' ')} (the file's text is not shown)`;
}

/**
 * One pass over the document in order: mapping keys are scalars and unique (compared as the
 * strings they become), anchors are defined before their aliases and do not contain them,
 * anchors, aliases and nesting stay within bounds.
 */
function checkNodes(root: unknown, quote: boolean): void {
  const named = (prefix: string, name: string): string => (quote ? ` ${prefix}${name.slice(0, 40)}` : '');
  const defined = new Set<string>();
  const open: string[] = [];
  let anchors = 0;
  let aliases = 0;
  const visit = (node: unknown, depth: number): void => {
    if (node === null || node === undefined) return;
    const at = (node as { range?: [number, number, number] }).range?.[0] ?? 0;
    if (depth > MAX_DEPTH) throw new Located(at, shapeMessages.depth);
    if (isAlias(node)) {
      if (++aliases > MAX_ALIASES) throw new Located(at, `uses more than ${MAX_ALIASES} aliases`);
      if (!defined.has(node.source)) throw new Located(at, `alias${named('*', node.source)} has no anchor of that name before it`);
      if (open.includes(node.source)) throw new Located(at, `alias${named('*', node.source)} refers to a node that contains it`);
      return;
    }
    const anchor = (node as Node).anchor;
    if (anchor !== undefined) {
      if (++anchors > MAX_ANCHORS) throw new Located(at, `defines more than ${MAX_ANCHORS} anchors`);
      defined.add(anchor);
      open.push(anchor);
    }
    if (isMap(node)) {
      const keys = new Set<string>();
      for (const pair of node.items) visitPair(pair, keys, depth);
    } else if (isSeq(node)) {
      for (const item of node.items) {
        if (isPair(item)) visitPair(item, new Set<string>(), depth);
        else visit(item, depth + 1);
      }
    }
    if (anchor !== undefined) open.pop();
  };
  const visitPair = (pair: { key: unknown; value: unknown }, keys: Set<string>, depth: number): void => {
    const key = pair.key;
    const at = (key as { range?: [number, number, number] } | null)?.range?.[0] ?? 0;
    const value: unknown = isScalar(key) ? key.value : key;
    if (value !== null && typeof value === 'object')
      throw new Located(at, 'a mapping key must be a plain name, not a list, mapping or alias');
    const keyAnchor = (key as Node | null)?.anchor;
    if (keyAnchor !== undefined) {
      if (++anchors > MAX_ANCHORS) throw new Located(at, `defines more than ${MAX_ANCHORS} anchors`);
      defined.add(keyAnchor);
    }
    const name = value === null ? '' : String(value);
    if (keys.has(name)) throw new Located(at, `duplicate key${named('', JSON.stringify(name))} in one mapping; each key may appear once`);
    keys.add(name);
    visit(pair.value, depth + 1);
  };
  visit(root, 0);
}
