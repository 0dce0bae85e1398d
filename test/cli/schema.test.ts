import { describe, it, expect } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { parse as parseYaml } from 'yaml';
import { cli, fixture, tempDir } from '../helpers.js';
import { starterDesign } from '../../src/cli/starter.js';

type Schema = Record<string, unknown>;

/**
 * The subset of JSON Schema 2020-12 that the printed schema uses (type, properties, required,
 * additionalProperties, items, prefixItems, enum, const, anyOf, oneOf, string and number bounds),
 * enough to check the shipped designs against it. Returns the paths that fail.
 */
function violations(schema: Schema, value: unknown, path = '$'): string[] {
  const errors: string[] = [];
  const fail = (why: string) => errors.push(`${path}: ${why}`);
  const type = schema.type as string | string[] | undefined;
  if (type !== undefined) {
    const types = Array.isArray(type) ? type : [type];
    const actual = value === null ? 'null' : Array.isArray(value) ? 'array' : typeof value;
    const ok = types.some((t) => t === actual || (t === 'integer' && Number.isInteger(value)) || (t === 'number' && actual === 'number'));
    if (!ok) return [`${path}: ${actual} is not ${types.join('|')}`];
  }
  if (schema.enum && !(schema.enum as unknown[]).includes(value)) fail(`${JSON.stringify(value)} not in enum`);
  if ('const' in schema && schema.const !== value) fail(`${JSON.stringify(value)} is not ${JSON.stringify(schema.const)}`);
  if (typeof value === 'string') {
    if (typeof schema.minLength === 'number' && value.length < schema.minLength) fail('too short');
    if (typeof schema.pattern === 'string' && !new RegExp(schema.pattern, 'u').test(value))
      fail(`${value} does not match ${schema.pattern}`);
  }
  if (typeof value === 'number') {
    if (typeof schema.minimum === 'number' && value < schema.minimum) fail('below minimum');
    if (typeof schema.maximum === 'number' && value > schema.maximum) fail('above maximum');
    if (typeof schema.exclusiveMinimum === 'number' && value <= schema.exclusiveMinimum) fail('not above exclusiveMinimum');
    if (typeof schema.exclusiveMaximum === 'number' && value >= schema.exclusiveMaximum) fail('not below exclusiveMaximum');
  }
  if (Array.isArray(value)) {
    if (typeof schema.minItems === 'number' && value.length < schema.minItems) fail('too few items');
    if (typeof schema.maxItems === 'number' && value.length > schema.maxItems) fail('too many items');
    const prefix = (schema.prefixItems as Schema[] | undefined) ?? [];
    value.forEach((item, i) => {
      const sub = i < prefix.length ? prefix[i] : (schema.items as Schema | undefined);
      if (sub && typeof sub === 'object') errors.push(...violations(sub, item, `${path}[${i}]`));
    });
  }
  if (value !== null && typeof value === 'object' && !Array.isArray(value)) {
    const props = (schema.properties as Record<string, Schema> | undefined) ?? {};
    for (const key of (schema.required as string[] | undefined) ?? []) if (!(key in value)) fail(`missing ${key}`);
    for (const [key, v] of Object.entries(value)) {
      if (props[key]) errors.push(...violations(props[key]!, v, `${path}.${key}`));
      else if (schema.additionalProperties === false) fail(`unknown key ${key}`);
      else if (schema.additionalProperties && typeof schema.additionalProperties === 'object') {
        errors.push(...violations(schema.additionalProperties as Schema, v, `${path}.${key}`));
      }
    }
  }
  if (schema.anyOf) {
    const branches = (schema.anyOf as Schema[]).map((s) => violations(s, value, path));
    if (!branches.some((b) => b.length === 0)) fail(`matches no anyOf branch (${branches.flat().slice(0, 2).join('; ')})`);
  }
  if (schema.oneOf) {
    const branches = (schema.oneOf as Schema[]).map((s) => violations(s, value, path));
    const matching = branches.filter((b) => b.length === 0).length;
    if (matching !== 1) fail(`matches ${matching} oneOf branches (${branches.flat().slice(0, 2).join('; ')})`);
  }
  return errors;
}

describe('phasegap schema', () => {
  const run = cli('schema');
  const schema = JSON.parse(run.stdout) as Schema;

  it('prints JSON Schema with exit 0 and nothing on stderr', () => {
    expect(run.code).toBe(0);
    expect(run.stderr).toBe('');
    expect(schema.$schema).toBe('https://json-schema.org/draft/2020-12/schema');
    expect(schema.type).toBe('object');
    expect(schema.title).toBe('phasegap design file');
  });

  it('describes clock.frequency as a number or a quantity string in Hz, from 1 Hz to 100 GHz', () => {
    const clock = (schema.properties as Record<string, Schema>).clock!;
    const frequency = (clock.properties as Record<string, Schema>).frequency!;
    expect(frequency.type).toEqual(['number', 'string']);
    expect(frequency.description).toContain('Hz');
    expect(frequency.description).toContain('"20MHz"');
    expect(frequency.description).toContain('at least 1 Hz and at most 100 GHz');
    expect(clock.required).toContain('frequency');
  });

  it('requires the sections a design cannot do without and refuses unknown top-level keys', () => {
    expect(schema.required).toEqual(expect.arrayContaining(['name', 'process', 'clock', 'generator']));
    expect(schema.additionalProperties).toBe(false);
  });

  const designs = readdirSync(fixture('designs')).filter((f) => f.endsWith('.yaml'));
  it.each(designs)('accepts the shipped design %s', (file) => {
    const data = parseYaml(readFileSync(fixture('designs', file), 'utf8')) as unknown;
    expect(violations(schema, data)).toEqual([]);
  });

  it.each(['nand', 'nor'] as const)('accepts the %s starter design', (template) => {
    expect(violations(schema, parseYaml(starterDesign(template)))).toEqual([]);
  });

  it('flags a misspelt key, so editors can warn as the checker does', () => {
    const data = parseYaml(readFileSync(fixture('designs', 'bad', 'unknown-key.yaml'), 'utf8')) as unknown;
    expect(violations(schema, data).join('\n')).toContain('unknown key stage');
  });

  it('writes the same schema to a file with -o', () => {
    const out = join(tempDir(), 'design.schema.json');
    expect(cli('schema', '-o', out).code).toBe(0);
    expect(readFileSync(out, 'utf8')).toBe(run.stdout);
  });
});
