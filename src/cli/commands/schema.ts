/** `phasegap schema`: the design file's JSON Schema, generated from the one zod schema. */
import * as z from 'zod';
import { designSchema } from '../../schema/design.js';
import type { Io } from '../io.js';
import { emit, toJson } from '../output.js';
import { defineCommand, type CommandOptions } from '../command.js';
import { outOption } from '../common-options.js';

const OPTIONS = { out: outOption('the schema') } as const;

export const schemaCommand = defineCommand({
  name: 'schema',
  description: 'print the JSON Schema of the design file',
  arguments: [],
  options: OPTIONS,
  run: (io, _args, options) => runSchema(io, options),
});

export function designJsonSchema(): Record<string, unknown> {
  const schema = z.toJSONSchema(designSchema, { io: 'input', unrepresentable: 'any' }) as Record<string, unknown>;
  return { ...schema, $id: 'https://phasegap.dev/schema/design.json', title: 'phasegap design file' };
}

export function runSchema(io: Io, options: CommandOptions<typeof OPTIONS>): number {
  emit(io, toJson(designJsonSchema()), options.out, []);
  return 0;
}
