import { describe, expect, it } from 'vitest';
import { markdownCode, markdownLine, markdownParagraph, markdownText, markdownUrl } from '../../src/render/markdown/text.js';
import { hostileName } from '../schema/hostile.js';

describe('markdownText', () => {
  it('writes HTML as entities', () => {
    expect(markdownText('<script>alert(1)</script> & <img src=x onerror=y>')).toBe(
      '&lt;script&gt;alert(1)&lt;/script&gt; &amp; &lt;img src=x onerror=y&gt;',
    );
  });

  it('escapes emphasis, code, links, images, strike-through and table pipes', () => {
    expect(markdownText('*a* _b_ `c` [d](e) ![f](g) ~~h~~ | \\')).toBe(
      '\\*a\\* \\_b\\_ \\`c\\` \\[d\\](e) \\!\\[f\\](g) \\~\\~h\\~\\~ \\| \\\\',
    );
  });

  it.each(['a\nb', 'a\r\n# b', 'a\u2028b', 'a\u0085b', 'a\u202eb\u0000', hostileName('/tmp/x', 'all')])(
    'keeps %j on one line without control or format characters',
    (text) => {
      const out = markdownText(text);
      expect(out).not.toMatch(/[\p{Cc}\p{Cf}\u2028\u2029]/u);
      expect(out).not.toMatch(/<[a-z/!]/i);
    },
  );
});

describe('markdownLine', () => {
  it.each([
    ['# not a heading', '\\# not a heading'],
    ['- not a list', '\\- not a list'],
    ['+ no', '\\+ no'],
    ['1. no', '1\\. no'],
    ['2) no', '2\\) no'],
    ['=== no', '\\=== no'],
    ['    not code', 'not code'],
    ['> no quote', '&gt; no quote'],
  ])('writes %j as %j', (text, expected) => {
    expect(markdownLine(text)).toBe(expected);
  });
});

describe('markdownParagraph', () => {
  it('keeps the lines of a description, each escaped on its own', () => {
    expect(markdownParagraph('first\n# second\n<b>third</b>')).toBe('first\n\\# second\n&lt;b&gt;third&lt;/b&gt;');
  });
});

describe('markdownCode', () => {
  it('fences text with more backticks than it holds', () => {
    expect(markdownCode('a.yaml')).toBe('` a.yaml `');
    expect(markdownCode('a``b`')).toBe('``` a``b` ```');
    expect(markdownCode('a\nb')).toBe('` a b `');
  });
});

describe('markdownUrl', () => {
  it('percent-encodes each path segment', () => {
    expect(markdownUrl('review-all.svg')).toBe('review-all.svg');
    expect(markdownUrl('my review (v2)#1?.svg')).toBe('my%20review%20%28v2%29%231%3F.svg');
    expect(markdownUrl('a/<b>.svg')).toBe('a/%3Cb%3E.svg');
  });
});
