/**
 * Verilog identifiers for net and instance names: a simple identifier when the name is one and
 * not a keyword, else an escaped identifier (backslash, the name, a space; IEEE 1364).
 */
const KEYWORDS = new Set([
  'always', 'and', 'assign', 'begin', 'buf', 'case', 'default', 'else', 'end', 'endcase', 'endmodule', 'for', 'forever',
  'if', 'initial', 'inout', 'input', 'integer', 'module', 'nand', 'nor', 'not', 'or', 'output', 'parameter', 'real',
  'reg', 'supply0', 'supply1', 'time', 'tri', 'wire', 'xnor', 'xor',
]);

export function verilogIdentifier(name: string): string {
  if (/^[A-Za-z_][A-Za-z0-9_$]*$/.test(name) && !KEYWORDS.has(name)) return name;
  return `\\${name.replace(/\s/g, '_')} `;
}
