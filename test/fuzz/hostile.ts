/**
 * Hostile values: strings that break out of the formats phasegap writes (ngspice decks, Verilog,
 * VCD, SVG, HTML, Markdown, CSV), numbers at and past the limits of a double, and keys that name
 * JavaScript's prototype machinery. Every injected markup payload carries the token "pgx" so an
 * oracle can tell user text from the tool's own markup.
 */
import fc from 'fast-check';
import { raw, scalar, type Node } from './yaml-tree.js';

/** The file an injected ngspice `shell` command would create in its working folder. */
export const MARKER = 'pgx-marker';

/** Payloads for each output format (the format each one targets is the comment beside it). */
export const PAYLOADS: readonly string[] = [
  `x\n.control\nshell touch ${MARKER}\n.endc\n`, // ngspice: a control block in the deck
  `x\n.endc\n.control\nshell touch ${MARKER}\n`,
  `x\n.include /etc/passwd`, // ngspice: a second include
  `x\rshell touch ${MARKER}`,
  'x $ .control', // ngspice inline comment
  '$end', // VCD: closes a $comment or $var early
  'a $end $enddefinitions $end #0 1!', // VCD: a forged body
  'a b', // VCD and Verilog: a space in an identifier
  '*/ module pgx; endmodule /*', // Verilog: out of a block comment
  'x\nendmodule\nmodule pgx;', // Verilog: out of a line comment
  '\\escaped', // Verilog escaped identifier
  '`define pgx 1',
  '<script>pgx()</script>', // HTML, SVG
  '<img src=x onerror=pgx()>',
  '</title><pgx>',
  ']]><pgx/>', // CDATA end
  '<!--pgx-->',
  '"><pgx x="', // out of an attribute
  "'><pgx x='",
  '&pgx;', // an undefined entity
  '| pgx | <pgx> |', // Markdown table cell
  '[pgx](javascript:pgx())', // Markdown link
  '`pgx`',
  '```', // Markdown code
  '# pgx',
  '\n# pgx\n',
  '"pgx","x"\n1,2', // CSV
  '=cmd|pgx', // spreadsheet formula
  '\u202epgx\u202c', // right-to-left override
  '\u2066pgx\u2069',
  '\u200fpgx',
  '\ufeffpgx',
  '\u200b',
  'pgx\u0000nul',
  '\u0007\u0008\u001b[31mpgx\u001b[0m',
  'pgx\u007f',
  '\u0085pgx\u2028\u2029',
  '\ud800',
  'pgx\udfff', // lone surrogates
  '',
  ' ',
  '\t',
  '\n',
  '\r\n',
  '../../../../tmp/pgx',
  '/dev/zero',
  'C:\\pgx',
  '-o',
  '--help',
  '__proto__',
  'constructor',
  'prototype',
  'toString',
  'hasOwnProperty',
  'valueOf',
  '%s%n%x',
  // biome-ignore lint/suspicious/noTemplateCurlyInString: a literal `${...}` is the hostile text itself
  '${pgx}',
  '{{pgx}}',
  '\\u0000',
  'NaN',
  'Infinity',
  '-Infinity',
  '1e400',
  '-0',
  '0x10',
  '1_000',
  '1e400fF',
  'NaN ps',
  'Infinity MHz',
  '-1e-300V',
  '1e-400s',
  '9e307 pF',
  '0 Hz',
  '-0 MHz',
  'tt/1.8V/27C',
  'worst',
  'all',
  'yes',
  'no',
  'on',
  'off',
  '~',
  'null',
];

/**
 * Names the schema accepts (letters, digits, _ . $ [ ]) that still mean something in an output:
 * Verilog keywords, SPICE's case-insensitive node names and reserved nodes, names that collide once
 * sanitized, a very long identifier.
 */
export const IDENTIFIERS: readonly string[] = [
  'module',
  'endmodule',
  'input',
  'output',
  'wire',
  'reg',
  'initial',
  'always',
  'assign',
  'begin',
  'end',
  'timescale',
  'vdd',
  'VDD',
  'gnd',
  'GND',
  'P1',
  'P2',
  'CLK',
  'Clk',
  'clkb',
  'tran',
  'x',
  'X0',
  'a.b',
  'a$b',
  'a$end',
  'a[0]',
  'a[0].b',
  'p1_',
  'p1.',
  'p1$',
  'p1[1]',
  '_',
  'pgx.control',
  'shell',
  'a'.repeat(5000),
  'Ω',
  'ä',
];

export const KEYS: readonly string[] = [
  '__proto__',
  'constructor',
  'prototype',
  'toString',
  'hasOwnProperty',
  '__defineGetter__',
  'polluted',
  '',
  ' ',
  'a.b',
  'a[0]',
  '[0]',
  'p1',
  'name',
  'x\n.control',
  '<pgx>',
  '$end',
  'valueOf',
  'length',
];

/** Numbers as raw YAML text, so values JavaScript cannot hold (1e400, 2^64+1) reach the parser. */
export const RAW_NUMBERS: readonly string[] = [
  '0',
  '-0',
  '0.0',
  '-0.0',
  '1e400',
  '-1e400',
  '1e-400',
  '-1e-300',
  '1e-300',
  '5e-324',
  '1.7976931348623157e308',
  '.nan',
  '.NaN',
  '.inf',
  '-.inf',
  '+.inf',
  '9007199254740993',
  '-9007199254740993',
  '18446744073709551617',
  '123456789012345678901234567890',
  '4294967295',
  '4294967296',
  '2147483648',
  '-2147483649',
  '1e21',
  '1e9',
  '1e7',
  '0x7fffffff',
  '0o777',
  '-1',
  '-2',
  '0.5',
  '1.5',
  '2.5',
  '1e-15',
  '3',
  '100000',
  '1000000',
];

const controlChars = fc.string({ unit: fc.integer({ min: 0, max: 0x1f }).map((c) => String.fromCharCode(c)), maxLength: 6 });

/** A hostile string: a payload, a random unicode string, control characters, or a very long string. */
export const hostileString: fc.Arbitrary<string> = fc.oneof(
  { weight: 8, arbitrary: fc.constantFrom(...PAYLOADS) },
  { weight: 4, arbitrary: fc.constantFrom(...IDENTIFIERS) },
  { weight: 2, arbitrary: fc.tuple(fc.constantFrom(...PAYLOADS), fc.constantFrom(...PAYLOADS)).map(([a, b]) => a + b) },
  { weight: 2, arbitrary: fc.string({ unit: 'binary', maxLength: 12 }) },
  { weight: 1, arbitrary: controlChars.map((s) => `pgx${s}`) },
  {
    weight: 1,
    arbitrary: fc
      .tuple(fc.constantFrom('a', 'pgx ', '<pgx>', '\n'), fc.constantFrom(1000, 100_000, 1_000_000))
      .map(([s, n]) => s.repeat(Math.ceil(n / s.length))),
  },
);

/** A hostile value for any slot of the tree. */
export const hostileValue: fc.Arbitrary<Node> = fc.oneof(
  { weight: 5, arbitrary: hostileString.map(scalar) },
  { weight: 4, arbitrary: fc.constantFrom(...RAW_NUMBERS).map(raw) },
  { weight: 1, arbitrary: fc.double().map(scalar) },
  { weight: 1, arbitrary: fc.integer().map(scalar) },
  {
    weight: 1,
    arbitrary: fc.constantFrom<Node>(
      scalar(true),
      scalar(false),
      scalar(null),
      raw('~'),
      raw('{}'),
      raw('[]'),
      raw('[[]]'),
      raw('{a: }'),
      raw('!!binary aGk='),
      raw('!!str 1'),
      raw('!!float 1e400'),
      raw('!!int 1e3'),
      raw('!!js/function "x"'),
      raw('!pgx x'),
    ),
  },
);
