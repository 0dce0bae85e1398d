/**
 * User text in a deck. ngspice reads a deck line by line: a line break in a name would start a
 * new line (a dot command, a `.control` block, a `shell` command), and a comment line that begins
 * `*#` is run as a command. So a comment carries printable ASCII on one line and always starts
 * `* `; identifiers keep only the characters SPICE names use; an .include path is quoted and may
 * not hold a quote or a line break.
 */
import { inputError, type IssuePath } from '../errors.js';

/** Text for a comment: printable ASCII only (anything else is `?`, a line break a space), no trailing backslash. */
export function spiceCommentText(text: string): string {
  return text
    .replace(/[\t\n\r\v\f\u2028\u2029]/g, ' ')
    .replace(/[^\x20-\x7e]/gu, '?')
    .replace(/[\s\\]+$/, '');
}

/** A whole comment line. */
export function spiceComment(text: string): string {
  return `* ${spiceCommentText(text)}`;
}

/** An end-of-line comment to append to an element line. */
export function spiceInlineComment(text: string): string {
  return ` $ ${spiceCommentText(text)}`;
}

/** A model or parameter name: letters, digits, _ and . only (anything else becomes _). */
export function spiceIdentifier(name: string): string {
  const clean = name.replace(/[^A-Za-z0-9_.]/g, '_');
  return /^[A-Za-z_]/.test(clean) ? clean : `_${clean}`;
}

/** `.include "PATH"`; a path that cannot be quoted (a double quote, a control character) is refused. */
export function spiceInclude(path: string, field: IssuePath = ['process', 'spice', 'models']): string {
  if (/["\p{Cc}\u2028\u2029]/u.test(path)) {
    throw inputError(
      'value.invalid',
      field,
      path,
      "cannot be written in a deck's .include line (it comes from the process card or --models): a model file path may not contain a double quote, a line break or another control character; rename the file or its folder",
    );
  }
  return `.include "${path}"`;
}
