/**
 * What a name in a design file or process card may contain. Names reach every output (decks,
 * Verilog, VCD, Markdown, SVG, terminal text), so they hold printable characters only: no C0 or
 * C1 control character or DEL (so no line break or tab), no line or paragraph separator, no format
 * character (bidirectional embeddings, overrides and isolates, zero-width characters, soft hyphen,
 * byte-order mark), no noncharacter U+FFFE/U+FFFF and no unpaired surrogate. A description may
 * span lines: a line feed is its one allowed control character. The patterns are written without
 * Unicode property escapes so `phasegap schema` gives editors a pattern every regex engine reads.
 */
import * as z from 'zod';

/** Longest identifier: a gate, switch, constraint, net, process corner or card name. */
export const IDENTIFIER_MAX = 64;
/** Longest design name. */
export const TITLE_MAX = 200;
/** Longest description. */
export const DESCRIPTION_MAX = 2000;

const NOT_PRINTABLE =
  '\\u0000-\\u001f\\u007f-\\u009f\\u00ad\\u061c\\u180e\\u200b-\\u200f\\u2028-\\u202e\\u2060-\\u206f\\ufeff\\ufff9-\\ufffb\\ufffe\\uffff';

const PRINTABLE = new RegExp(`^[^${NOT_PRINTABLE}]+$`);
const PRINTABLE_LINES = new RegExp(`^[^${NOT_PRINTABLE.replace('\\u0000-\\u001f', '\\u0000-\\u0009\\u000b-\\u001f')}]*$`);
const UNPAIRED_SURROGATE = /[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/;

const RULE =
  'printable characters only (no control character, line break, tab, separator or invisible format character such as a bidirectional override or zero-width space)';
export const IDENTIFIER_ALLOWED = `${RULE}, 1 to ${IDENTIFIER_MAX} characters`;
const TITLE_ALLOWED = `${RULE}, 1 to ${TITLE_MAX} characters`;
const DESCRIPTION_ALLOWED = `printable characters and line feeds only (no other control character, tab, separator or invisible format character), at most ${DESCRIPTION_MAX} characters`;

function text(pattern: RegExp, min: number, max: number, allowed: string) {
  return z
    .string()
    .min(min, `must be ${allowed}`)
    .max(max, `must be ${allowed}`)
    .regex(pattern, `is not allowed; it must be ${allowed}`)
    .refine((value) => !UNPAIRED_SURROGATE.test(value), `is not allowed; it must be ${allowed}`);
}

/** A gate, switch, constraint, process corner or card name, or a net named where a pattern of its own is not needed. */
export const identifier = () => text(PRINTABLE, 1, IDENTIFIER_MAX, IDENTIFIER_ALLOWED);

/** The design's name: one line of free text. */
export const title = () => text(PRINTABLE, 1, TITLE_MAX, TITLE_ALLOWED);

/** A description: free text that may span lines. */
export const description = () => text(PRINTABLE_LINES, 0, DESCRIPTION_MAX, DESCRIPTION_ALLOWED);

/** A name with a stricter pattern of its own (a net, switch or card corner name), held to the identifier length. */
export function patterned(pattern: RegExp, words: string) {
  return z.string().max(IDENTIFIER_MAX, `must be at most ${IDENTIFIER_MAX} characters`).regex(pattern, words);
}
