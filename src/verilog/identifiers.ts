/**
 * User text in Verilog source. Identifiers: a simple identifier when the name is one and not a
 * keyword, else an escaped identifier (a backslash, printable ASCII 33..126, a space; IEEE 1364
 * 3.7.1), so no name can end a declaration or start another module. Comments: `//` comments of
 * printable ASCII on one line. Strings: the escapes of IEEE 1364 3.6.
 */
const KEYWORDS = new Set([
  'always', 'and', 'assign', 'begin', 'buf', 'case', 'default', 'else', 'end', 'endcase', 'endmodule', 'for', 'forever',
  'if', 'initial', 'inout', 'input', 'integer', 'module', 'nand', 'nor', 'not', 'or', 'output', 'parameter', 'real',
  'reg', 'supply0', 'supply1', 'time', 'tri', 'wire', 'xnor', 'xor',
]);

export function verilogIdentifier(name: string): string {
  if (/^[A-Za-z_][A-Za-z0-9_$]*$/.test(name) && !KEYWORDS.has(name)) return name;
  return `\\${name.replace(/[^\x21-\x7e]/gu, '_') || '_'} `;
}

/** A `//` comment line: printable ASCII only (anything else is `?`, a line break a space), no trailing backslash. */
export function verilogComment(text: string): string {
  const clean = text.replace(/[\t\n\r\v\f\u2028\u2029]/g, ' ').replace(/[^\x20-\x7e]/gu, '?').replace(/[\s\\]+$/, '');
  return `// ${clean}`;
}

/** A string literal: quote and backslash escaped, anything outside printable ASCII as an octal escape per byte. */
export function verilogString(text: string): string {
  const bytes = new TextEncoder().encode(text);
  let out = '';
  for (const b of bytes) {
    if (b === 0x22 || b === 0x5c) out += `\\${String.fromCharCode(b)}`;
    else if (b >= 0x20 && b <= 0x7e) out += String.fromCharCode(b);
    else out += `\\${b.toString(8).padStart(3, '0')}`;
  }
  return `"${out}"`;
}
