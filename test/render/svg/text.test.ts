import { describe, expect, it } from 'vitest';
import { fitText, textWidth } from '../../../src/render/svg/text.js';

describe('fitText', () => {
  it('keeps a text that fits whole', () => {
    expect(fitText('abcde', 10, 32)).toBe('abcde');
  });

  it('cuts a text that does not fit to the longest start that fits with an ellipsis', () => {
    // 6.4 px a character at 10 px: six characters (five and the ellipsis) take 38.4 px of 40.
    expect(fitText('abcdefghij', 10, 40)).toBe('abcde\u2026');
    expect(textWidth('abcde\u2026', 10)).toBeLessThanOrEqual(40);
  });

  it('measures bold text wider, so it cuts sooner', () => {
    // 7 px a bold character at 10 px: five characters take 35 px of 40.
    expect(fitText('abcdefghij', 10, 40, true)).toBe('abcd\u2026');
  });

  it('keeps at least one character before the ellipsis however narrow the room', () => {
    expect(fitText('abcdef', 10, 1)).toBe('a\u2026');
  });
});
