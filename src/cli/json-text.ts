/**
 * JSON text to plain data: one linear scan checks the grammar, the nesting depth and that no
 * object repeats a key (JSON.parse keeps the last silently), with the line and column of the
 * first problem; then JSON.parse, about a hundred times faster than a YAML parser, builds the data.
 */
import { InputError } from '../errors.js';
import { MAX_DEPTH } from '../schema/limits.js';
import { shapeMessages } from '../schema/data-shape.js';
import type { TextSource } from './yaml-text.js';

class Stop extends Error {
  constructor(
    readonly offset: number,
    message: string,
  ) {
    super(message);
  }
}

export function parseJsonText(raw: string, source: TextSource): unknown {
  const text = raw.charCodeAt(0) === 0xfeff ? raw.slice(1) : raw;
  try {
    scan(text, source.quote);
  } catch (error) {
    if (!(error instanceof Stop)) throw error;
    const { line, col } = linePos(text, error.offset);
    throw new InputError([
      { code: 'file.syntax', path: [], file: source.name, expected: `is not valid JSON at line ${line}, column ${col}: ${error.message}` },
    ]);
  }
  try {
    return JSON.parse(text) as unknown;
  } catch {
    throw new InputError([{ code: 'file.syntax', path: [], file: source.name, expected: 'could not be read as JSON' }]);
  }
}

function linePos(text: string, offset: number): { line: number; col: number } {
  let line = 1;
  let start = 0;
  for (let i = text.indexOf('\n'); i >= 0 && i < offset; i = text.indexOf('\n', i + 1)) {
    line++;
    start = i + 1;
  }
  return { line, col: offset - start + 1 };
}

const NUMBER = /-?(?:0|[1-9][0-9]*)(?:\.[0-9]+)?(?:[eE][+-]?[0-9]+)?/y;

function scan(text: string, quote: boolean): void {
  let i = 0;
  const ws = (): void => {
    for (;;) {
      const c = text.charCodeAt(i);
      if (c === 0x20 || c === 0x0a || c === 0x0d || c === 0x09) i++;
      else return;
    }
  };
  const expect = (what: string): never => {
    throw new Stop(i, i >= text.length ? `the text ends where ${what} was expected` : `expected ${what}`);
  };
  const string = (): string => {
    const start = i++;
    let escaped = false;
    for (;;) {
      const c = text.charCodeAt(i);
      if (Number.isNaN(c)) throw new Stop(start, 'a string is not closed');
      if (c < 0x20) throw new Stop(i, 'a control character inside a string; write it as an escape');
      if (c === 0x22) break;
      if (c === 0x5c) {
        escaped = true;
        const e = text.charAt(i + 1);
        if ('"\\/bfnrt'.includes(e) && e !== '') i += 2;
        else if (e === 'u' && /^[0-9a-fA-F]{4}$/.test(text.slice(i + 2, i + 6))) i += 6;
        else throw new Stop(i, 'an invalid escape sequence in a string');
      } else i++;
    }
    i++;
    return escaped ? (JSON.parse(text.slice(start, i)) as string) : text.slice(start + 1, i - 1);
  };
  const value = (depth: number): void => {
    ws();
    const c = text.charAt(i);
    if (c === '{' || c === '[') {
      if (depth >= MAX_DEPTH) throw new Stop(i, shapeMessages.depth);
      i++;
      ws();
      const close = c === '{' ? '}' : ']';
      if (text.charAt(i) === close) {
        i++;
        return;
      }
      const keys = c === '{' ? new Set<string>() : null;
      for (;;) {
        if (keys) {
          ws();
          if (text.charAt(i) !== '"') expect('a key in double quotes');
          const at = i;
          const key = string();
          if (keys.has(key))
            throw new Stop(
              at,
              `duplicate key${quote ? ` ${JSON.stringify(key.slice(0, 40))}` : ''} in one object; each key may appear once`,
            );
          keys.add(key);
          ws();
          if (text.charAt(i) !== ':') expect('":" after the key');
          i++;
        }
        value(depth + 1);
        ws();
        const next = text.charAt(i);
        if (next === ',') i++;
        else if (next === close) {
          i++;
          return;
        } else expect(`"," or "${close}"`);
      }
    }
    if (c === '"') {
      string();
      return;
    }
    for (const word of ['true', 'false', 'null']) {
      if (text.startsWith(word, i)) {
        i += word.length;
        return;
      }
    }
    NUMBER.lastIndex = i;
    if (NUMBER.test(text)) {
      i = NUMBER.lastIndex;
      return;
    }
    expect('a value (object, list, string, number, true, false or null)');
  };
  value(0);
  ws();
  if (i < text.length) throw new Stop(i, 'more text after the end of the JSON value');
}
