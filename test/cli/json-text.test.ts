import { describe, it, expect } from 'vitest';
import { parseJsonText } from '../../src/cli/json-text.js';
import { inputErrorMessage, inputIssues } from '../helpers.js';

const read = (text: string, quote = true) => parseJsonText(text, { name: 'f.json', quote });
const message = (text: string, quote = true) => inputErrorMessage(() => read(text, quote));

describe('parseJsonText', () => {
  it('gives text that does not parse code file.syntax in the named file, with no field path', () => {
    expect(inputIssues(() => read('{"a": [1,', true))).toEqual([
      expect.objectContaining({ code: 'file.syntax', path: [], file: 'f.json' }),
    ]);
  });

  it('reads what JSON.parse reads, with escapes, numbers and a byte-order mark', () => {
    const text = '{"a": [1, -2.5e-3, true, false, null], "b\\u0041": "x\\ny\\"", "c": {}}';
    expect(read(text)).toEqual(JSON.parse(text));
    expect(read(`\ufeff${text}`)).toEqual(JSON.parse(text));
  });

  it('keeps "__proto__" as an own key, never as the prototype', () => {
    const data = read('{"__proto__": {"x": 1}}') as Record<string, unknown>;
    expect(Object.hasOwn(data, '__proto__')).toBe(true);
    expect(Object.getPrototypeOf(data)).toBe(Object.prototype);
  });

  it.each([
    ['{"a": 1, "a": 2}', 'line 1, column 10: duplicate key "a" in one object'],
    ['{"a": 1,\n "\\u0061": 2}', 'line 2, column 2: duplicate key "a" in one object'],
    ['{"a": 1,}', 'line 1, column 9: expected a key in double quotes'],
    ['{"a" 1}', 'line 1, column 6: expected ":" after the key'],
    ['[1 2]', 'line 1, column 4: expected "," or "]"'],
    ['{"a": tru}', 'line 1, column 7: expected a value'],
    ['{"a": "x', 'line 1, column 7: a string is not closed'],
    ['{"a": "\\x"}', 'line 1, column 8: an invalid escape sequence in a string'],
    ['{"a": "\t"}', 'line 1, column 8: a control character inside a string'],
    ['{"a": 01}', 'line 1, column 8: expected "," or "}"'],
    ['{} {}', 'line 1, column 4: more text after the end of the JSON value'],
    ['', 'line 1, column 1: the text ends where a value'],
    [`${'['.repeat(33)}${']'.repeat(33)}`, 'line 1, column 33: nests deeper than 32 levels'],
  ])('refuses %j at %s', (text, expected) => {
    expect(message(text)).toContain(`f.json: is not valid JSON at ${expected}`);
  });

  it('accepts nesting of exactly 32 levels', () => {
    expect(read(`${'['.repeat(32)}${']'.repeat(32)}`)).toBeInstanceOf(Array);
  });

  it('does not repeat a duplicate key of a file it may not quote', () => {
    expect(message('{"secret": 1, "secret": 2}', false)).toBe(
      'f.json: is not valid JSON at line 1, column 15: duplicate key in one object; each key may appear once',
    );
  });
});
