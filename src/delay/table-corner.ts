/**
 * The tables of one corner: the characterized corner itself, or, between characterized corners of
 * the same process corner that form a grid in supply and temperature, a linear blend of the
 * neighbours (outside the grid the end segment is extended, with a warning).
 */
import { inputError } from '../errors.js';
import type { Corner } from '../process/corner.js';
import type { CornerTables, DelayTables, PinTables } from '../schema/tables.js';
import { bracket } from './interpolate.js';

const SAME = 1e-9;

function unique(values: readonly number[]): number[] {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted.filter((v, i) => i === 0 || v - sorted[i - 1]! > SAME);
}

function blendGrid(a: readonly (readonly number[])[], b: readonly (readonly number[])[], t: number): number[][] {
  return a.map((row, i) => row.map((v, j) => v + (b[i]![j]! - v) * t));
}

function blendCorner(a: CornerTables, b: CornerTables, t: number, name: string): CornerTables {
  if (t === 0) return a;
  const cells: CornerTables['cells'] = {};
  for (const [cell, entry] of Object.entries(a.cells) as Array<
    [keyof CornerTables['cells'], NonNullable<CornerTables['cells'][keyof CornerTables['cells']]>]
  >) {
    const other = b.cells[cell];
    if (!other) continue;
    cells[cell] = {
      pins: entry.pins.map((pin, p): PinTables => {
        const q = other.pins[p]!;
        return {
          capacitance: pin.capacitance + (q.capacitance - pin.capacitance) * t,
          rise: { delay: blendGrid(pin.rise.delay, q.rise.delay, t), transition: blendGrid(pin.rise.transition, q.rise.transition, t) },
          fall: { delay: blendGrid(pin.fall.delay, q.fall.delay, t), transition: blendGrid(pin.fall.transition, q.fall.transition, t) },
        };
      }),
    };
  }
  return {
    name,
    process: a.process,
    vdd: a.vdd + (b.vdd - a.vdd) * t,
    temperature: a.temperature + (b.temperature - a.temperature) * t,
    cells,
  };
}

export function cornerTables(tables: DelayTables, corner: Corner, warn: (message: string) => void): CornerTables {
  const same = tables.corners.filter((c) => c.process === corner.process);
  const exact = same.find((c) => Math.abs(c.vdd - corner.vdd) < SAME && Math.abs(c.temperature - corner.temperature) < SAME);
  if (exact) return exact;
  const listed = tables.corners.map((c) => c.name).join(', ');
  if (same.length === 0) {
    throw inputError(
      'reference.unknown',
      ['tables'],
      corner.name,
      `has no tables for process corner "${corner.process}"; the file holds ${listed}`,
    );
  }
  const vdds = unique(same.map((c) => c.vdd));
  const temps = unique(same.map((c) => c.temperature));
  const at = (v: number, t: number) => same.find((c) => Math.abs(c.vdd - v) < SAME && Math.abs(c.temperature - t) < SAME);
  if (vdds.some((v) => temps.some((t) => !at(v, t)))) {
    throw inputError(
      'tables.invalid',
      ['tables'],
      corner.name,
      `is not characterized and the ${corner.process} corners do not form a supply x temperature grid to interpolate in; the file holds ${listed}`,
    );
  }
  const vb = vdds.length > 1 ? bracket(vdds, corner.vdd) : { i: 0, t: 0, outside: corner.vdd !== vdds[0] };
  const tb = temps.length > 1 ? bracket(temps, corner.temperature) : { i: 0, t: 0, outside: corner.temperature !== temps[0] };
  if (vb.outside || tb.outside || vdds.length === 1 || temps.length === 1) {
    if ((vdds.length === 1 && corner.vdd !== vdds[0]) || (temps.length === 1 && corner.temperature !== temps[0])) {
      throw inputError(
        'tables.invalid',
        ['tables'],
        corner.name,
        `is not characterized and cannot be interpolated (one supply or temperature only); the file holds ${listed}`,
      );
    }
    if (vb.outside || tb.outside)
      warn(`table model: ${corner.name} lies outside the characterized supplies/temperatures of ${corner.process}; extrapolating`);
  }
  const v0 = vdds[vb.i]!;
  const v1 = vdds[Math.min(vb.i + 1, vdds.length - 1)]!;
  const t0 = temps[tb.i]!;
  const t1 = temps[Math.min(tb.i + 1, temps.length - 1)]!;
  const lowT = blendCorner(at(v0, t0)!, at(v1, t0)!, vb.t, corner.name);
  const highT = blendCorner(at(v0, t1)!, at(v1, t1)!, vb.t, corner.name);
  return blendCorner(lowT, highT, tb.t, corner.name);
}
