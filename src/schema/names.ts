/**
 * What a name in a design file or process card may contain. Names reach every output (decks,
 * Verilog, VCD, Markdown, SVG, terminal text), so they hold printable characters only: Unicode
 * letters, marks, digits, punctuation, symbols and spaces. Control characters (C0, DEL, C1),
 * line and paragraph separators, and format characters (bidirectional overrides and isolates,
 * zero-width characters) are refused, as is any line break in a name. A description may span
 * lines (a newline is its only allowed control character).
 */
import * as z from 'zod';

/** Longest identifier: a gate, switch, constraint, process corner or card name. */
export const IDENTIFIER_MAX = 64;
/** Longest design name. */
export const TITLE_MAX = 200;
/** Longest description. */
export const DESCRIPTION_MAX = 2000;

const IDENTIFIER = /^[\p{L}\p{M}\p{N}\p{P}\p{S} ]+$/u;
const TITLE = /^[\p{L}\p{M}\p{N}\p{P}\p{S}\p{Zs}]+$/u;
const DESCRIPTION = /^[\p{L}\p{M}\p{N}\p{P}\p{S}\p{Zs}\n]*$/u;

export const IDENTIFIER_ALLOWED = `printable characters only (letters, digits, punctuation, symbols and spaces; no control, format or line-break characters), 1 to ${IDENTIFIER_MAX} characters`;
const TITLE_ALLOWED = `printable characters only (letters, digits, punctuation, symbols and spaces; no control, format or line-break characters), 1 to ${TITLE_MAX} characters`;
const DESCRIPTION_ALLOWED = `printable characters and line breaks only (no other control or format characters), at most ${DESCRIPTION_MAX} characters`;

function text(pattern: RegExp, min: number, max: number, allowed: string) {
  return z.string().min(min, `must be ${allowed}`).max(max, `must be ${allowed}`).regex(pattern, `is not allowed; it must be ${allowed}`);
}

/** A gate, switch, constraint, process corner or card name. */
export const identifier = () => text(IDENTIFIER, 1, IDENTIFIER_MAX, IDENTIFIER_ALLOWED);

/** The design's name: one line of free text. */
export const title = () => text(TITLE, 1, TITLE_MAX, TITLE_ALLOWED);

/** A description: free text that may span lines. */
export const description = () => text(DESCRIPTION, 0, DESCRIPTION_MAX, DESCRIPTION_ALLOWED);

/** A name that is also restricted to a pattern of its own (a net, switch or corner name). */
export function patterned(pattern: RegExp, words: string) {
  return z.string().max(IDENTIFIER_MAX, `must be at most ${IDENTIFIER_MAX} characters`).regex(pattern, words);
}
