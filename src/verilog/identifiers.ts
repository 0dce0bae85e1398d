/**
 * User text in Verilog source. Identifiers: a simple identifier when the name is one and not a
 * keyword, else an escaped identifier (a backslash, printable ASCII 33..126, a space; IEEE 1364
 * 3.7.1), so no name can end a declaration or start another module. Comments: `//` comments of
 * printable ASCII on one line. Strings: the escapes of IEEE 1364 3.6.
 */
/** Reserved words of IEEE 1364-2005 (19.x) and of SystemVerilog (IEEE 1800), from the standards' keyword lists as remembered: an escaped identifier is legal in any case, so over-escaping is harmless. */
const KEYWORDS = new Set([
  'alias', 'always', 'always_comb', 'always_ff', 'always_latch', 'and', 'assert', 'assign', 'assume',
  'automatic', 'before', 'begin', 'bind', 'bins', 'binsof', 'bit', 'break', 'buf', 'bufif0', 'bufif1',
  'byte', 'case', 'casex', 'casez', 'cell', 'chandle', 'class', 'clocking', 'cmos', 'config', 'const',
  'constraint', 'context', 'continue', 'cover', 'covergroup', 'coverpoint', 'cross', 'deassign', 'default',
  'defparam', 'design', 'disable', 'dist', 'do', 'edge', 'else', 'end', 'endcase', 'endclass', 'endclocking',
  'endconfig', 'endfunction', 'endgenerate', 'endgroup', 'endinterface', 'endmodule', 'endpackage',
  'endprimitive', 'endprogram', 'endproperty', 'endsequence', 'endspecify', 'endtable', 'endtask', 'enum',
  'event', 'expect', 'export', 'extends', 'extern', 'final', 'first_match', 'for', 'force', 'foreach',
  'forever', 'fork', 'forkjoin', 'function', 'generate', 'genvar', 'highz0', 'highz1', 'if', 'iff', 'ifnone',
  'ignore_bins', 'illegal_bins', 'import', 'incdir', 'include', 'initial', 'inout', 'input', 'inside',
  'instance', 'int', 'integer', 'interface', 'intersect', 'join', 'join_any', 'join_none', 'large',
  'liblist', 'library', 'local', 'localparam', 'logic', 'longint', 'macromodule', 'matches', 'medium',
  'modport', 'module', 'nand', 'negedge', 'new', 'nmos', 'nor', 'noshowcancelled', 'not', 'notif0', 'notif1',
  'null', 'or', 'output', 'package', 'packed', 'parameter', 'pmos', 'posedge', 'primitive', 'priority',
  'program', 'property', 'protected', 'pull0', 'pull1', 'pulldown', 'pullup', 'pulsestyle_ondetect',
  'pulsestyle_onevent', 'pure', 'rand', 'randc', 'randcase', 'randsequence', 'rcmos', 'real', 'realtime',
  'ref', 'reg', 'release', 'repeat', 'return', 'rnmos', 'rpmos', 'rtran', 'rtranif0', 'rtranif1', 'scalared',
  'sequence', 'shortint', 'shortreal', 'showcancelled', 'signed', 'small', 'solve', 'specify', 'specparam',
  'static', 'string', 'strong0', 'strong1', 'struct', 'super', 'supply0', 'supply1', 'table', 'tagged',
  'task', 'this', 'throughout', 'time', 'timeprecision', 'timeunit', 'tran', 'tranif0', 'tranif1', 'tri',
  'tri0', 'tri1', 'triand', 'trior', 'trireg', 'type', 'typedef', 'union', 'unique', 'unsigned', 'use',
  'uwire', 'var', 'vectored', 'virtual', 'void', 'wait', 'wait_order', 'wand', 'weak0', 'weak1', 'while',
  'wildcard', 'wire', 'with', 'within', 'wor', 'xnor', 'xor',
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
