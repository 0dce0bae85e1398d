import { describe, expect, it } from 'vitest';
import { renderIssue } from '../src/errors.js';

describe('renderIssue', () => {
  it('escapes control and format characters a schema message quotes from the file, keeping its own line breaks', () => {
    const line = renderIssue({ path: 'nodes.hv', allowed: 'has unknown keys "pgx\u0015", "\u001b[2J" and "\u202e"\nallowed: min, max' });
    expect(line).toBe('nodes.hv: has unknown keys "pgx\\u0015", "\\u001b[2J" and "\\u202e"\nallowed: min, max');
    expect(line).not.toMatch(/[\u0000-\u0008\u000b-\u001f\u007f-\u009f\u202e]/);
  });
});
