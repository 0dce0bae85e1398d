/**
 * User text in SVG. XML 1.0 (section 2.2, production Char) allows only tab, line feed, carriage
 * return, U+0020..U+D7FF, U+E000..U+FFFD and U+10000..U+10FFFF; any other character makes the
 * document unreadable. Labels also drop what a reader cannot see but a renderer acts on: C1
 * controls, line separators, bidirectional overrides and isolates, zero-width characters.
 */

/** Characters XML 1.0 forbids (lone surrogates included). */
const NOT_XML =
  /[\u0000-\u0008\u000b\u000c\u000e-\u001f\ufffe\uffff]|[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/g;

/** A whole serialized document with every character XML forbids removed. */
export function xmlDocument(text: string): string {
  return text.replace(NOT_XML, '');
}

/** Label or attribute text: valid XML on one line, without invisible controls (each becomes `?`). */
export function xmlText(text: string): string {
  return xmlDocument(text)
    .replace(/[\t\n\r\u2028\u2029\u0085]/g, ' ')
    .replace(/[\p{Cc}\p{Cf}]/gu, '?');
}
