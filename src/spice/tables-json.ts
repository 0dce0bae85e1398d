/**
 * The delay-table file as text: numbers to 5 significant digits (well inside what the simulator
 * resolves) and each table row on one line, so a file of many corners stays readable and small.
 */
import type { DelayTables } from '../schema/tables.js';

export function tablesJson(tables: DelayTables): string {
  const text = JSON.stringify(tables, (_key, value: unknown) => (typeof value === 'number' ? Number(value.toPrecision(5)) : value), 1);
  return `${text.replace(/\[\s*((?:-?[\d.e+-]+,\s*)*-?[\d.e+-]+)\s*\]/g, (_m, inner: string) => `[${inner.replace(/\s+/g, '')}]`)}\n`;
}
