/**
 * Transistor-level subcircuits of the library cells, with the widths the delay model uses
 * (cellWidths: series stacks widened by their depth). Pin order: input 0 is the device at the top
 * of the series stack, next to the output; ports are the inputs, the output and the supply, with
 * ground the global node 0.
 *
 * Diffusions follow the usual AD/AS/PD/PS convention for a contacted diffusion of length Ldiff
 * beside the gate (common practice): area W * Ldiff, perimeter 2 * (W + Ldiff). A stack's internal
 * nodes are diffusions shared by two devices without a contact; they get no junction (AD/AS and
 * PD/PS zero on that side) unless the card asks for them (spice.stackJunctions), then each side
 * carries half of one shared diffusion.
 */
import { CELLS, cellWidths, type PrimitiveCell, type UnitWidths } from '../cells/library.js';
import { spiceNumber } from './names.js';

export interface DeviceGeometry {
  /** Channel length, m. */
  readonly l: number;
  /** Diffusion length Ldiff beside the gate, for junction areas and perimeters, m. */
  readonly diffusion: number;
  /** Whether a stack's internal (shared) nodes carry junctions; default none. */
  readonly stackJunctions?: boolean;
  /** Model names of the n and p devices. */
  readonly nModel: string;
  readonly pModel: string;
}

/** Which of a device's diffusions are a stack's internal nodes. */
export interface InternalSides {
  readonly drain?: boolean;
  readonly source?: boolean;
}

/** Subcircuit name of a cell at a size, e.g. nand2_x2 or inv_x0p25. */
export function cellSubcktName(kind: PrimitiveCell, size: number): string {
  const s = Number(size.toPrecision(6)).toString().replace('.', 'p').replace('-', 'm').replace('+', '');
  return `${kind.toLowerCase()}_x${s}`;
}

/** Area (m^2) and perimeter (m) of one diffusion side of a device of width w. */
export function diffusion(w: number, geo: DeviceGeometry, internal: boolean): { area: number; perimeter: number } {
  if (geo.diffusion <= 0 || (internal && !geo.stackJunctions)) return { area: 0, perimeter: 0 };
  const area = w * geo.diffusion;
  const perimeter = 2 * (w + geo.diffusion);
  return internal ? { area: area / 2, perimeter: perimeter / 2 } : { area, perimeter };
}

export function mosfet(
  name: string,
  d: string,
  g: string,
  s: string,
  b: string,
  model: string,
  w: number,
  geo: DeviceGeometry,
  internal: InternalSides = {},
): string {
  const drain = diffusion(w, geo, internal.drain === true);
  const source = diffusion(w, geo, internal.source === true);
  return (
    `${name} ${d} ${g} ${s} ${b} ${model} W=${spiceNumber(w)} L=${spiceNumber(geo.l)}` +
    ` AD=${spiceNumber(drain.area)} AS=${spiceNumber(source.area)} PD=${spiceNumber(drain.perimeter)} PS=${spiceNumber(source.perimeter)}`
  );
}

function stack(
  lines: string[],
  inputs: readonly string[],
  series: boolean,
  prefix: 'n' | 'p',
  rail: string,
  model: string,
  w: number,
  geo: DeviceGeometry,
): void {
  inputs.forEach((a, i) => {
    if (!series) {
      lines.push(mosfet(`m${prefix}${i}`, 'y', a, rail, rail, model, w, geo));
      return;
    }
    const top = i === 0 ? 'y' : `s${prefix}${i}`;
    const bottom = i === inputs.length - 1 ? rail : `s${prefix}${i + 1}`;
    lines.push(mosfet(`m${prefix}${i}`, top, a, bottom, rail, model, w, geo, { drain: i > 0, source: i < inputs.length - 1 }));
  });
}

/** The .subckt block of one cell at one size. */
export function cellSubckt(kind: PrimitiveCell, size: number, unit: UnitWidths, geo: DeviceGeometry): string {
  const shape = CELLS[kind];
  const widths = cellWidths(kind, size, unit);
  const inputs = Array.from({ length: shape.inputs }, (_, i) => `a${i}`);
  const lines = [
    `.subckt ${cellSubcktName(kind, size)} ${inputs.join(' ')} y vdd`,
    `* ${kind} size ${size}: n ${spiceNumber(widths.wn)} m, p ${spiceNumber(widths.wp)} m per device`,
  ];
  // Pull-down and pull-up: a series stack (input 0 at the top, next to the output) or parallel devices.
  stack(lines, inputs, shape.nSeries > 1, 'n', '0', geo.nModel, widths.wn, geo);
  stack(lines, inputs, shape.pSeries > 1, 'p', 'vdd', geo.pModel, widths.wp, geo);
  lines.push('.ends');
  return lines.join('\n');
}
