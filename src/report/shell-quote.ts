/**
 * A word of a command line the user may copy into a POSIX shell: left as it is when it holds only
 * characters no shell treats specially, else in single quotes (a quote inside written '\'').
 * Control characters are shown as \xNN so a printed hint cannot move the cursor or hide text;
 * such a hint is then not copyable as it stands, which is the point.
 */
export function shellQuote(word: string): string {
  if (/^[A-Za-z0-9_@%+=:,./-]+$/.test(word)) return word;
  const visible = word.replace(/[\p{Cc}\p{Cf}\p{Zl}\p{Zp}]/gu, (c) => `\\x${c.charCodeAt(0).toString(16).padStart(2, '0')}`);
  return `'${visible.replace(/'/g, `'\\''`)}'`;
}

/** A whole command line from its words. */
export function shellCommand(words: readonly string[]): string {
  return words.map(shellQuote).join(' ');
}
