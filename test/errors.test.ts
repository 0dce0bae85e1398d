import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ISSUE_CODES, formatPath, inFile, inputError, issuePath, renderIssue } from '../src/errors.js';
import { ROOT } from './helpers.js';

describe('renderIssue', () => {
  it('escapes control and format characters a schema message quotes from the file, keeping its own line breaks', () => {
    const line = renderIssue({
      code: 'field.unknown',
      path: ['nodes', 'hv'],
      expected: 'has unknown keys "pgx\u0015", "\u001b[2J" and "\u202e"\nallowed: min, max',
    });
    expect(line).toBe('nodes.hv: has unknown keys "pgx\\u0015", "\\u001b[2J" and "\\u202e"\nallowed: min, max');
    expect(line).not.toMatch(/[\u0000-\u0008\u000b-\u001f\u007f-\u009f\u202e]/);
  });

  it('leaves the code out of the words: it is data for programs', () => {
    expect(renderIssue({ code: 'value.out-of-range', path: ['clock', 'duty'], value: '1.2', expected: 'is out of range' })).toBe(
      'clock.duty: 1.2 is out of range',
    );
  });

  it('names the field path, the value and what is expected, in that order', () => {
    expect(renderIssue({ code: 'reference.unknown', path: ['switches', 2, 'nodes', 'a'], value: '"vx"', expected: 'is not a node' })).toBe(
      'switches[2].nodes.a: "vx" is not a node',
    );
  });

  it('says (top level) for an empty path and puts the file before the path inside it', () => {
    expect(renderIssue({ code: 'field.unknown', path: [], expected: 'has an unknown key' })).toBe('(top level): has an unknown key');
    expect(renderIssue({ code: 'file.syntax', path: [], file: 'card.yaml', expected: 'is not YAML' })).toBe('card.yaml: is not YAML');
    expect(renderIssue({ code: 'value.invalid', path: ['nmos', 'vth0'], file: 'card.yaml', value: '-1', expected: 'is negative' })).toBe(
      'card.yaml: nmos.vth0: -1 is negative',
    );
  });
});

describe('formatPath', () => {
  it('joins keys with dots and puts list indices in brackets', () => {
    expect(formatPath(['corners', 'list', 3, 'vdd'])).toBe('corners.list[3].vdd');
    expect(formatPath([0, 'a'])).toBe('[0].a');
    expect(formatPath([])).toBe('');
  });

  it("spaces an option's argument after the option", () => {
    expect(formatPath(['--vary', 'clock.frequency'])).toBe('--vary clock.frequency');
    expect(formatPath(['--model'])).toBe('--model');
  });

  it('quotes a key a terminal could act on', () => {
    expect(formatPath(['nodes', 'a\u001b'])).toBe('nodes["a\\u001b"]');
  });
});

describe('inputError', () => {
  it('carries its code, path, shown value and expected words as one issue', () => {
    expect(inputError('option.invalid', ['--nets'], 'some', 'is not a net selection').issues).toEqual([
      { code: 'option.invalid', path: ['--nets'], value: '"some"', expected: 'is not a net selection' },
    ]);
  });

  it('leaves the value out when there is none', () => {
    expect(inputError('field.required', ['circuit'], undefined, 'is missing').issues[0]!.value).toBeUndefined();
  });
});

describe('inFile', () => {
  it('places every issue inside the file and keeps a file an issue already names', () => {
    const error = inFile(inputError('value.invalid', ['nmos', 'vth0'], -1, 'is negative'), 'card.yaml');
    expect(error.issues).toEqual([
      { code: 'value.invalid', path: ['nmos', 'vth0'], file: 'card.yaml', value: '-1', expected: 'is negative' },
    ]);
    expect(inFile(error, 'other.yaml').issues[0]!.file).toBe('card.yaml');
    expect(error.message).toBe('card.yaml: nmos.vth0: -1 is negative');
  });
});

describe('issuePath', () => {
  it('keeps string and number keys and turns a symbol into its description', () => {
    expect(issuePath(['a', 1, Symbol('s')])).toEqual(['a', 1, 'Symbol(s)']);
  });
});

describe('ISSUE_CODES', () => {
  it('lists exactly the codes of the table in DEVELOPERS.md ("Errors"), in its order', () => {
    const guide = readFileSync(join(ROOT, 'DEVELOPERS.md'), 'utf8');
    const table = guide.slice(guide.indexOf('| code | meaning |'));
    const rows = table.slice(0, table.indexOf('\n\n')).split('\n').slice(2);
    const documented = rows.map((row) => /^\| `([^`]+)` \|/.exec(row)?.[1] ?? `unparsed row: ${row}`);
    expect(documented).toEqual([...ISSUE_CODES]);
  });

  it('names each kind <area>.<problem> in lower case, once', () => {
    for (const code of ISSUE_CODES) expect(code).toMatch(/^[a-z]+\.[a-z]+(-[a-z]+)*$/);
    expect(new Set(ISSUE_CODES).size).toBe(ISSUE_CODES.length);
  });
});
