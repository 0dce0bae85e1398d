import { describe, expect, it } from 'vitest';
import { closestName, editDistance } from '../../src/schema/closest-name.js';

describe('editDistance', () => {
  it.each([
    ['frequncy', 'frequency', 1],
    ['kitten', 'sitting', 3],
    ['', 'abc', 3],
    ['Duty', 'duty', 0],
    ['abc', 'abc', 0],
  ])('counts %j to %j as %i edits', (a, b, d) => {
    expect(editDistance(a, b)).toBe(d);
  });
});

describe('closestName', () => {
  const keys = ['frequency', 'duty', 'dutyTolerance', 'transition'];
  it('names the key one typo away', () => {
    expect(closestName('frequncy', keys)).toBe('frequency');
    expect(closestName('trnasition', keys)).toBe('transition');
    expect(closestName('dutyTolerence', keys)).toBe('dutyTolerance');
  });

  it('names nothing for a word far from every key, an empty list or the key itself', () => {
    expect(closestName('zzz', keys)).toBeUndefined();
    expect(closestName('period', keys)).toBeUndefined();
    expect(closestName('duty', [])).toBeUndefined();
    expect(closestName('duty', ['duty'])).toBeUndefined();
    expect(closestName('b', ['n', 'p'])).toBeUndefined();
  });
});
