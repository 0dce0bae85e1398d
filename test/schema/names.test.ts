import { describe, expect, it } from 'vitest';
import { existsSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import * as z from 'zod';
import { description, identifier, IDENTIFIER_MAX, title } from '../../src/schema/names.js';
import { cli, fixture, inputErrorMessage, inputIssues, tempDir } from '../helpers.js';
import { formatPath } from '../../src/errors.js';
import { loadDesign, loadProcess } from '../../src/cli/load.js';
import { parseWith } from '../../src/schema/validate.js';
import { PLAIN_YAML } from './hostile.js';

const ok = (schema: z.ZodType, value: string) => schema.safeParse(value).success;

describe('identifier', () => {
  it.each([
    'u_inv',
    'flying-cap charge',
    'bottom plate opens first',
    'Ø-Schalter',
    '開關1',
    's1 (φ1)',
    'switch \ud83d\ude00',
    'a'.repeat(IDENTIFIER_MAX),
  ])('accepts %j', (name) => {
    expect(ok(identifier(), name)).toBe(true);
  });

  it.each([
    ['a newline', 'x\n.control'],
    ['a carriage return', 'x\r'],
    ['a tab', 'x\ty'],
    ['NUL', 'x\u0000'],
    ['ESC', '\u001b[31mred'],
    ['DEL', 'x\u007f'],
    ['a C1 control', 'x\u009b'],
    ['a line separator', 'x\u2028y'],
    ['a paragraph separator', 'x\u2029y'],
    ['a right-to-left override', 'abc\u202edef'],
    ['a left-to-right isolate', '\u2066x'],
    ['a pop directional isolate', 'x\u2069'],
    ['a zero-width space', 'x\u200by'],
    ['a byte-order mark', '\ufeffx'],
    ['a soft hyphen', 'x\u00ady'],
    ['a lone surrogate', 'x\ud800'],
    ['a lone low surrogate', '\udc00x'],
    ['nothing', ''],
    ['too many characters', 'a'.repeat(IDENTIFIER_MAX + 1)],
  ])('refuses %s', (_, name) => {
    expect(ok(identifier(), name)).toBe(false);
  });
});

describe('the JSON Schema pattern', () => {
  it('reads the same without the Unicode flag, as editors may compile it', () => {
    const schema = identifier().toJSONSchema() as { pattern: string };
    const plain = new RegExp(schema.pattern);
    for (const name of ['u_inv', 'Ø-Schalter', 's1 (φ1)']) expect(plain.test(name), name).toBe(true);
    for (const name of ['x\n', 'x\u202e', '\u2066x', 'x\u0085']) expect(plain.test(name), JSON.stringify(name)).toBe(false);
  });
});

describe('title and description', () => {
  it('lets a design name be a 200-character line and a description span lines', () => {
    expect(ok(title(), 'x'.repeat(200))).toBe(true);
    expect(ok(title(), 'x'.repeat(201))).toBe(false);
    expect(ok(title(), 'a\nb')).toBe(false);
    expect(ok(description(), 'first line\nsecond line')).toBe(true);
    expect(ok(description(), 'x'.repeat(2001))).toBe(false);
    expect(ok(description(), 'a\r\nb')).toBe(false);
    expect(ok(description(), 'a\u202eb')).toBe(false);
  });
});

describe('the design schema', () => {
  const hostile = 'x\n.control\nshell touch /tmp/x\n.endc';
  const PRINTABLE = /is not allowed; it must be printable characters only/;
  const variants: Array<[string, (text: string) => string, RegExp]> = [
    ['name', (t) => t.replace('name: plain', `name: ${JSON.stringify(hostile)}`), PRINTABLE],
    [
      'description',
      (t) => t.replace('name: plain', `name: plain\ndescription: "ok\\u202e"`),
      /it must be printable characters and line feeds only/,
    ],
    ['generator.gates[0].name', (t) => t.replace('name: g_inv,', `name: ${JSON.stringify(hostile)},`), PRINTABLE],
    [
      'switches[0].name',
      (t) => t.replace('name: sa,', `name: ${JSON.stringify(hostile)},`),
      /must start with a letter or _ and use letters, digits, _ \. -/,
    ],
    ['switches[0].gate', (t) => t.replace('gate: p1,', `gate: ${JSON.stringify(hostile)},`), PRINTABLE],
    ['constraints.breakBeforeMake[0].name', (t) => t.replace('name: handover,', `name: ${JSON.stringify(hostile)},`), PRINTABLE],
    ['constraints.settle[0].name', (t) => t.replace('name: sampling,', `name: ${JSON.stringify(hostile)},`), PRINTABLE],
    ['corners.process[0]', (t) => t.replace('process: [tt]', `process: [${JSON.stringify(hostile)}]`), PRINTABLE],
    [
      'loads',
      (t) => t.replace('loads: { p1: 100fF', `loads: { ${JSON.stringify(hostile)}: 100fF`),
      /is not allowed as a key here: must start with a letter/,
    ],
  ];

  it.each(variants)('refuses a hostile %s, naming the field, the escaped value and the allowed pattern', (path, edit, allowed) => {
    const dir = tempDir();
    const file = join(dir, 'd.yaml');
    writeFileSync(file, edit(PLAIN_YAML));
    expect(inputIssues(() => loadDesign(file)).map((i) => formatPath(i.path))).toEqual([path]);
    const message = inputErrorMessage(() => loadDesign(file));
    expect(message).toContain(`${path}: `);
    expect(message).not.toMatch(/[\n\u202e]/);
    expect(message).toMatch(/"(x\\n\.control\\nshell touch \/tmp\/x\\n\.endc|ok\\u202e)"/);
    expect(message).toMatch(allowed);
  });

  it('shows the hostile value escaped, as JSON with every control and format character as \\uXXXX', () => {
    const dir = tempDir();
    const file = join(dir, 'd.yaml');
    writeFileSync(file, PLAIN_YAML.replace('name: g_inv,', 'name: "a\\nb\\u202ec\\u0085",'));
    expect(inputErrorMessage(() => loadDesign(file))).toBe(
      'generator.gates[0].name: "a\\nb\\u202ec\\u0085" is not allowed; it must be printable characters only (no control character, line break, tab, separator or invisible format character such as a bidirectional override or zero-width space), 1 to 64 characters',
    );
  });

  it('phasegap check exits 2 on a design named with an ngspice control block, writing nothing and running nothing', () => {
    const dir = tempDir();
    const marker = join(dir, 'ran');
    const file = join(dir, 'd.yaml');
    writeFileSync(file, PLAIN_YAML.replace('name: plain', `name: ${JSON.stringify(`x\n.control\nshell touch ${marker}\n.endc`)}`));
    const out = join(dir, 'out.json');
    const run = cli('check', file, '--json', '-o', out);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(
      /^phasegap: error: name: "x\\n\.control\\nshell touch .*\\n\.endc" is not allowed; it must be printable characters only/m,
    );
    expect(existsSync(out)).toBe(false);
    expect(existsSync(marker)).toBe(false);
  });

  it('refuses a hostile card name and card corner name', () => {
    const dir = tempDir();
    const card = join(dir, 'card.yaml');
    const text = readCard().replace(/^name: .*$/m, 'name: "card\\n.control"');
    writeFileSync(card, text);
    expect(inputErrorMessage(() => loadProcess(card))).toMatch(
      /name: "card\\n\.control" is not allowed; it must be printable characters only/,
    );
    writeFileSync(card, readCard().replace(/^ {2}tt:/m, '  "t\\u2028t":'));
    expect(inputIssues(() => loadProcess(card))).toEqual([
      expect.objectContaining({ code: 'field.not-allowed', file: card, path: ['corners'], value: '"t\\u2028t"' }),
    ]);
    expect(inputErrorMessage(() => loadProcess(card))).toBe(
      `${card}: corners: "t\\u2028t" is not allowed as a key here: must use letters, digits, _ and -`,
    );
  });
});

function readCard(): string {
  return readFileSync(fixture('processes', 'generic180.yaml'), 'utf8');
}

describe('shipped fixtures', () => {
  it('every demo design and process card still validates', () => {
    const designs = readdirSync(fixture('designs')).filter((f) => f.endsWith('.yaml'));
    expect(designs.length).toBeGreaterThanOrEqual(4);
    for (const f of designs) expect(() => loadDesign(fixture('designs', f)), f).not.toThrow();
    for (const f of readdirSync(fixture('processes'))) expect(() => loadProcess(fixture('processes', f)), f).not.toThrow();
  });
});

describe('parseWith', () => {
  it('reports a name that is too long with its length rule', () => {
    const message = inputErrorMessage(() => parseWith(z.object({ n: identifier() }), { n: 'x'.repeat(65) }));
    expect(message).toMatch(/^n: "x{65}" is out of range: must be printable characters only .*, 1 to 64 characters$/);
  });
});
