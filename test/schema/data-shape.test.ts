import { describe, it, expect } from 'vitest';
import { checkDataShape } from '../../src/schema/data-shape.js';
import { inputErrorMessage, inputIssues } from '../helpers.js';

const message = (data: unknown) => inputErrorMessage(() => checkDataShape(data));
/** The issue's path and shown value; every issue here is file.data-limit. */
const where = (data: unknown, prefix: readonly PropertyKey[] = []) => {
  const issues = inputIssues(() => checkDataShape(data, prefix));
  expect(issues.map((i) => i.code)).toEqual(['file.data-limit']);
  return [issues[0]!.path, issues[0]!.value];
};

describe('checkDataShape', () => {
  it('accepts plain data at the bounds: 10000 keys, 100000 items, 32 levels', () => {
    const keys = Object.fromEntries(Array.from({ length: 10_000 }, (_, i) => [`k${i}`, i]));
    let deep: unknown = 1;
    for (let i = 0; i < 32; i++) deep = [deep];
    expect(() =>
      checkDataShape({ keys, items: new Array(100_000).fill(0), deep: (deep as unknown[])[0], none: null, ok: true, s: 'x' }),
    ).not.toThrow();
  });

  it.each([
    ['10001 keys', { a: Object.fromEntries(Array.from({ length: 10_001 }, (_, i) => [`k${i}`, i])) }, [['a'], undefined]],
    ['100001 items', { a: [0, new Array(100_001).fill(0)] }, [['a', 1], undefined]],
    ['33 levels', { a: JSON.parse(`${'['.repeat(32)}${']'.repeat(32)}`) as unknown }, [['a', ...new Array(31).fill(0)], undefined]],
    ['a Set', { a: { b: new Set([1]) } }, [['a', 'b'], undefined]],
    ['a Date', { a: [new Date(0)] }, [['a', 0], undefined]],
    ['a Map', { a: new Map() }, [['a'], undefined]],
    ['a key "constructor"', { corners: { constructor: {} } }, [['corners', 'constructor'], undefined]],
    ['a key "toString"', { corners: { toString: {} } }, [['corners', 'toString'], undefined]],
    ['a key "prototype"', { prototype: 1 }, [['prototype'], undefined]],
    ['an own key "__proto__"', JSON.parse('{"a": {"__proto__": 1}}') as unknown, [['a', '__proto__'], undefined]],
    ['the value "__proto__"', { phases: ['p1', '__proto__'] }, [['phases', 1], '"__proto__"']],
    ['the value "toString"', { switches: [{ name: 'toString' }] }, [['switches', 0, 'name'], '"toString"']],
  ])('refuses %s, naming the path', (_what, data, expected) => {
    expect(where(data)).toEqual(expected);
  });

  it.each([
    [
      { a: Object.fromEntries(Array.from({ length: 10_001 }, (_, i) => [`k${i}`, i])) },
      'a: has 10001 keys; a mapping may hold at most 10000',
    ],
    [{ a: [0, new Array(100_001).fill(0)] }, 'a[1]: has 100001 items; a list may hold at most 100000'],
    [{ a: { b: new Set([1]) } }, 'a.b: is not plain data'],
    [{ corners: { constructor: {} } }, 'corners.constructor: uses the reserved key "constructor"'],
    [{ phases: ['p1', '__proto__'] }, 'phases[1]: "__proto__" is a reserved name'],
  ])('says in words what each limit allows (%#)', (data, expected) => {
    expect(message(data)).toContain(expected);
  });

  it('counts every use of a shared list toward 2000000 values', () => {
    const shared = new Array(50_000).fill(0);
    expect(message({ a: Array.from({ length: 41 }, () => shared) })).toContain('holds more than 2000000 values in all');
    expect(() => checkDataShape({ a: Array.from({ length: 39 }, () => shared) })).not.toThrow();
  });

  it('starts paths at the prefix it is given', () => {
    expect(where({ b: new Set() }, ['corners', 0])).toEqual([['corners', 0, 'b'], undefined]);
  });
});
