import { describe, it, expect } from 'vitest';
import { parseYamlText } from '../../src/cli/yaml-text.js';
import { inputErrorMessage, inputIssues } from '../helpers.js';

const read = (text: string, quote = true) => parseYamlText(text, { name: 'f.yaml', quote });
const message = (text: string, quote = true) => inputErrorMessage(() => read(text, quote));

describe('parseYamlText', () => {
  it('gives text that does not parse code file.syntax in the named file, with no field path', () => {
    expect(inputIssues(() => read('{"a": [1,', true))).toEqual([
      expect.objectContaining({ code: 'file.syntax', path: [], file: 'f.yaml' }),
    ]);
  });

  it('reads mappings, lists, anchors and aliases', () => {
    expect(read('a: &x [1, 2]\nb: *x\nc: { d: null }\n')).toEqual({ a: [1, 2], b: [1, 2], c: { d: null } });
  });

  it('reads an alias of an anchored key', () => {
    expect(read('? &k x\n: 1\ny: *k\n')).toEqual({ x: 1, y: 'x' });
  });

  it('reads a one-pair mapping inside a flow list', () => {
    expect(read('a: [k: 1, [j: 2]]\n')).toEqual({ a: [{ k: 1 }, [{ j: 2 }]] });
  });

  it('keeps "__proto__" and "constructor" as own keys', () => {
    const data = read('__proto__: 1\nconstructor: 2\n') as Record<string, unknown>;
    expect(Object.hasOwn(data, '__proto__')).toBe(true);
    expect(Object.hasOwn(data, 'constructor')).toBe(true);
    expect(Object.getPrototypeOf(data)).toBe(Object.prototype);
  });

  it.each([
    ['a: 1\nb: 2\na: 3\n', 'line 3, column 1: duplicate key "a" in one mapping'],
    ['a: {x: 1, x: 2}\n', 'line 1, column 11: duplicate key "x" in one mapping'],
    ['1: a\n1.0: b\n', 'line 2, column 1: duplicate key "1" in one mapping'],
    ['a: *x\n', 'line 1, column 4: alias *x has no anchor of that name before it'],
    ['a: *x\nb: &x 1\n', 'line 1, column 4: alias *x has no anchor of that name before it'],
    ['a: &x [*x]\n', 'line 1, column 8: alias *x refers to a node that contains it'],
    ['? [a]\n: 1\n', 'line 1, column 3: a mapping key must be a plain name'],
    ['a: [1\n', 'line 2, column 1:'],
  ])('refuses %j at %s', (text, expected) => {
    expect(message(text)).toContain(`f.yaml: is not valid YAML or JSON at ${expected}`);
  });

  it('refuses an alias bomb before expanding it', () => {
    const lines = ['a0: &a0 [x, x, x, x, x, x, x, x, x, x]'];
    for (let i = 1; i < 6; i++) lines.push(`a${i}: &a${i} [${Array.from({ length: 10 }, () => `*a${i - 1}`).join(', ')}]`);
    expect(message(lines.join('\n'))).toBe(
      'f.yaml: uses YAML aliases that expand beyond 1000 nodes; write the values out or use fewer aliases',
    );
  });

  it('refuses more than 1000 aliases', () => {
    const text = `a: &a 1\nb: [${Array.from({ length: 1001 }, () => '*a').join(', ')}]\n`;
    expect(message(text)).toContain('uses more than 1000 aliases');
  });

  it('refuses nesting deeper than 32 levels', () => {
    expect(message(`a: ${'['.repeat(40)}${']'.repeat(40)}\n`)).toContain('nests deeper than 32 levels');
  });

  it('names neither the key, the alias nor the parser excerpt of a file it may not quote', () => {
    expect(message('secret: 1\nsecret: 2\n', false)).toBe(
      'f.yaml: is not valid YAML or JSON at line 2, column 1: duplicate key in one mapping; each key may appear once',
    );
    expect(message('a: *hunter2\n', false)).toBe(
      'f.yaml: is not valid YAML or JSON at line 1, column 4: alias has no anchor of that name before it',
    );
    expect(message('a: "hunter2\\q"\n', false)).not.toContain('hunter2');
  });
});
