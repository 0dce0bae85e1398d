import { describe, expect, it } from 'vitest';
import { inputError, renderIssue } from '../src/errors.js';

describe('renderIssue', () => {
  it('escapes control and format characters a schema message quotes from the file, keeping its own line breaks', () => {
    const line = renderIssue({
      code: 'field.unknown',
      path: 'nodes.hv',
      allowed: 'has unknown keys "pgx\u0015", "\u001b[2J" and "\u202e"\nallowed: min, max',
    });
    expect(line).toBe('nodes.hv: has unknown keys "pgx\\u0015", "\\u001b[2J" and "\\u202e"\nallowed: min, max');
    expect(line).not.toMatch(/[\u0000-\u0008\u000b-\u001f\u007f-\u009f\u202e]/);
  });

  it('leaves the code out of the words: it is data for programs', () => {
    expect(renderIssue({ code: 'value.out-of-range', path: 'clock.duty', value: '1.2', allowed: 'is out of range' })).toBe(
      'clock.duty: 1.2 is out of range',
    );
  });
});

describe('inputError', () => {
  it('carries its code, path, shown value and allowed words as one issue', () => {
    expect(inputError('option.invalid', '--nets', 'some', 'is not a net selection').issues).toEqual([
      { code: 'option.invalid', path: '--nets', value: '"some"', allowed: 'is not a net selection' },
    ]);
  });
});
