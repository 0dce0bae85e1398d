/** `phasegap schema`: the design file's JSON Schema, generated from the one zod schema. */
import * as z from 'zod';
import { designSchema } from '../../schema/design.js';
import type { Io } from '../io.js';
import { emit, toJson } from '../output.js';

export function designJsonSchema(): Record<string, unknown> {
  const schema = z.toJSONSchema(designSchema, { io: 'input', unrepresentable: 'any' }) as Record<string, unknown>;
  return { ...schema, $id: 'https://phasegap.dev/schema/design.json', title: 'phasegap design file' };
}

export function runSchema(io: Io, options: { readonly out?: string }): number {
  emit(io, toJson(designJsonSchema()), options.out, []);
  return 0;
}
