/**
 * User text in Markdown (CommonMark with GitHub tables). Names and descriptions are data: HTML is
 * written as entities, so no tag reaches the page; the characters that make emphasis, links,
 * code, strike-through and table cells are backslash-escaped; a line break, control or format
 * character cannot start a new block.
 */

const LINE_BREAKS = /[\t\n\r\v\f\u0085\u2028\u2029]/g;
const UNPRINTABLE = /[\p{Cc}\p{Cf}\p{Cs}]/gu;

/** Text inside a line (a heading, a list item, a table cell): one line, HTML and inline markup escaped. */
export function markdownText(text: string): string {
  return text
    .replace(LINE_BREAKS, ' ')
    .replace(UNPRINTABLE, '?')
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/[\\`*_[\]|~!]/g, (c) => `\\${c}`);
}

/** Text that starts a line of its own: also no heading, list, quote, rule or indented-code marker. */
export function markdownLine(text: string): string {
  return markdownText(text)
    .trimStart()
    .replace(/^([#+\-=])/, '\\$1')
    .replace(/^(\d+)([.)])/, '$1\\$2');
}

/** A paragraph that may span lines: every line escaped as a line of its own. */
export function markdownParagraph(text: string): string {
  return text
    .split(/\r\n|\n/)
    .map(markdownLine)
    .join('\n');
}

/** A code span holding the text verbatim (on one line), fenced by more backticks than it contains. */
export function markdownCode(text: string): string {
  const clean = text.replace(LINE_BREAKS, ' ').replace(UNPRINTABLE, '?');
  const longest = Math.max(0, ...[...clean.matchAll(/`+/g)].map((m) => m[0].length));
  const fence = '`'.repeat(longest + 1);
  return `${fence} ${clean} ${fence}`;
}

/** A relative file name as a link destination: every segment percent-encoded (spaces, brackets, # and ? included). */
export function markdownUrl(path: string): string {
  return path
    .replace(/\p{Cs}/gu, '?')
    .split('/')
    .map((segment) => encodeURIComponent(segment).replace(/[()'*!]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`))
    .join('/');
}
