import { describe, expect, it } from 'vitest';
import { spiceComment, spiceCommentText, spiceIdentifier, spiceInclude, spiceInlineComment } from '../../src/spice/text.js';
import { InputError } from '../../src/errors.js';
import { hostileName } from '../schema/hostile.js';

const HOSTILE = [
  'a\n.control\nshell touch /tmp/x\n.endc',
  'a\r.control',
  'a\u2028.control',
  'a\u0085.control',
  'a\u000b\u000c.end',
  '\n*# shell touch /tmp/x',
  'ends in a backslash \\',
  'µ-é-\u202e-\ud800',
  hostileName('/tmp/x', 'all'),
];

describe('spiceComment', () => {
  it.each(HOSTILE)('writes %j as one line of printable ASCII that starts "* "', (text) => {
    const line = spiceComment(text);
    expect(line.startsWith('* ')).toBe(true);
    expect(line).toMatch(/^[\x20-\x7e]*$/);
    expect(line).not.toMatch(/\\$/);
  });

  it('keeps printable ASCII as it is and marks everything else', () => {
    expect(spiceCommentText('doubler-clock at ss/1.62V/125C')).toBe('doubler-clock at ss/1.62V/125C');
    expect(spiceCommentText('a\nb\tc')).toBe('a b c');
    expect(spiceCommentText('5 µm')).toBe('5 ?m');
  });
});

describe('spiceInlineComment', () => {
  it.each(HOSTILE)('appends %j as " $ " and one line of printable ASCII', (text) => {
    expect(spiceInlineComment(text)).toMatch(/^ \$ [\x20-\x7e]*$/);
  });
});

describe('spiceIdentifier', () => {
  it('keeps model names and replaces anything else with _', () => {
    expect(spiceIdentifier('nch.1')).toBe('nch.1');
    expect(spiceIdentifier('n ch\n.control')).toBe('n_ch_.control');
    expect(spiceIdentifier('1n')).toBe('_1n');
  });
});

describe('spiceInclude', () => {
  it('quotes a path with spaces and single quotes', () => {
    expect(spiceInclude("/tmp/my models/o'brien.lib")).toBe('.include "/tmp/my models/o\'brien.lib"');
  });

  it.each(['/tmp/a"b.lib', '/tmp/a\nb.lib', '/tmp/a\rb.lib', '/tmp/a\u0000b.lib', '/tmp/a\u2028b.lib'])(
    'refuses %j with an input error naming the field and the path',
    (path) => {
      let error: unknown;
      try {
        spiceInclude(path);
      } catch (e) {
        error = e;
      }
      expect(error).toBeInstanceOf(InputError);
      const issue = (error as InputError).issues[0]!;
      expect(issue.code).toBe('value.invalid');
      expect(issue.path).toEqual(['process', 'spice', 'models']);
      expect(issue.value).toBe(JSON.stringify(path).replace(/\u2028/, '\\u2028'));
      expect(issue.expected).toMatch(/may not contain a double quote, a line break or another control character/);
    },
  );
});
