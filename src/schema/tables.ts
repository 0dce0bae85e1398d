/**
 * The delay-table file written by `phasegap characterize` and read by the table model
 * (layout `phasegap-tables/1`, all numbers SI):
 *
 * - `size`: the cell size the tables were characterized at; the model scales loads by
 *   size / (its gate's size), since every width and every parasitic scales with the size.
 * - `transitions`: the input-transition axis (full-swing ramp time, s), ascending.
 * - `loads`: the output-load axis (external capacitance at `size`, F), ascending.
 * - `corners[]`: one per characterized corner (process corner name, supply V, temperature °C),
 *   each with `cells[KIND].pins[i]`: `capacitance` (effective input capacitance of pin i, F) and
 *   `rise`/`fall` (output edge) tables `delay` and `transition`, indexed [input transition][load],
 *   in seconds. Delay is input 50 % to output 50 %; transition is the output's 10-90 % time / 0.8.
 *   Optional `ron`: R_on * W/L (ohm) of an n and a p device at minimum length in deep triode,
 *   gate at the corner's supply, source and body at their rail.
 */
import * as z from 'zod';
import { MAX_TABLE_AXIS, MAX_TABLE_CORNERS } from './limits.js';

const axis = (what: string) =>
  z
    .array(z.number().positive())
    .min(2)
    .max(MAX_TABLE_AXIS)
    .refine((a) => a.every((v, i) => i === 0 || v > a[i - 1]!), { message: 'must be strictly ascending' })
    .describe(what);

/** One table row checked in a single loop: a file holds some 150,000 of these numbers. */
const row = z.custom<number[]>(
  (v) => Array.isArray(v) && v.length >= 2 && v.length <= MAX_TABLE_AXIS && v.every((x) => typeof x === 'number' && Number.isFinite(x)),
  { message: `must be a list of 2 to ${MAX_TABLE_AXIS} finite numbers` },
);

const grid = z.array(row).min(2).max(MAX_TABLE_AXIS);

const edgeTables = z.strictObject({
  delay: grid.describe('Delay, s, [input transition][load]'),
  transition: grid.describe('Output transition, s, [input transition][load]'),
});

const pinTables = z.strictObject({
  capacitance: z.number().positive().describe('Effective input capacitance of the pin, F'),
  rise: edgeTables.describe('Output rising'),
  fall: edgeTables.describe('Output falling'),
});

export const TABLE_CELLS = ['INV', 'NAND2', 'NAND3', 'NOR2', 'NOR3'] as const;

const cornerRon = z.strictObject({
  n: z.number().positive().describe('R_on * W/L of the n device, ohm'),
  p: z.number().positive().describe('R_on * W/L of the p device, ohm'),
});

export const cornerTablesSchema = z.strictObject({
  name: z.string().min(1),
  process: z.string().min(1),
  vdd: z.number().positive(),
  temperature: z.number(),
  cells: z.partialRecord(z.enum(TABLE_CELLS), z.strictObject({ pins: z.array(pinTables).min(1).max(3) })),
  ron: cornerRon.optional().describe('Deep-triode on-resistance, gate at the supply (switch R_on)'),
});

export const tablesSchema = z.strictObject({
  format: z.literal('phasegap-tables/1'),
  process: z.string().min(1).describe('Process card the tables were characterized for'),
  description: z.string().optional(),
  size: z.number().positive(),
  transitions: axis('Input transition axis, s'),
  loads: axis('Output load axis, F at the characterized size'),
  corners: z.array(cornerTablesSchema).min(1).max(MAX_TABLE_CORNERS),
});

export type DelayTables = z.output<typeof tablesSchema>;
export type CornerTables = z.output<typeof cornerTablesSchema>;
export type CornerRon = z.output<typeof cornerRon>;
export type PinTables = z.output<typeof pinTables>;
export type EdgeTables = z.output<typeof edgeTables>;
