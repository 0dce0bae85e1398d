/**
 * Transistor-level subcircuits of the library cells, with the widths the delay model uses
 * (cellWidths: series stacks widened by their depth). Pin order: input 0 is the device at the top
 * of the series stack, next to the output; ports are the inputs, the output and the supply, with
 * ground the global node 0. Diffusions: AD = AS = W * diffusion, PD = PS = W.
 */
import { CELLS, cellWidths, type PrimitiveCell, type UnitWidths } from '../cells/library.js';
import { spiceNumber } from './names.js';

export interface DeviceGeometry {
  /** Channel length, m. */
  readonly l: number;
  /** Diffusion length for junction areas, m. */
  readonly diffusion: number;
  /** Model names of the n and p devices. */
  readonly nModel: string;
  readonly pModel: string;
}

/** Subcircuit name of a cell at a size, e.g. nand2_x2 or inv_x0p25. */
export function cellSubcktName(kind: PrimitiveCell, size: number): string {
  const s = Number(size.toPrecision(6)).toString().replace('.', 'p').replace('-', 'm').replace('+', '');
  return `${kind.toLowerCase()}_x${s}`;
}

export function mosfet(name: string, d: string, g: string, s: string, b: string, model: string, w: number, geo: DeviceGeometry): string {
  const area = spiceNumber(w * geo.diffusion);
  const perimeter = geo.diffusion > 0 ? spiceNumber(w) : '0';
  return `${name} ${d} ${g} ${s} ${b} ${model} W=${spiceNumber(w)} L=${spiceNumber(geo.l)} AD=${area} AS=${area} PD=${perimeter} PS=${perimeter}`;
}

/** The .subckt block of one cell at one size. */
export function cellSubckt(kind: PrimitiveCell, size: number, unit: UnitWidths, geo: DeviceGeometry): string {
  const shape = CELLS[kind];
  const widths = cellWidths(kind, size, unit);
  const inputs = Array.from({ length: shape.inputs }, (_, i) => `a${i}`);
  const lines = [`.subckt ${cellSubcktName(kind, size)} ${inputs.join(' ')} y vdd`, `* ${kind} size ${size}: n ${spiceNumber(widths.wn)} m, p ${spiceNumber(widths.wp)} m per device`];
  // Pull-down: a series stack (input 0 at the top) or parallel devices.
  if (shape.nSeries > 1) {
    inputs.forEach((a, i) => {
      const top = i === 0 ? 'y' : `sn${i}`;
      const bottom = i === inputs.length - 1 ? '0' : `sn${i + 1}`;
      lines.push(mosfet(`mn${i}`, top, a, bottom, '0', geo.nModel, widths.wn, geo));
    });
  } else {
    inputs.forEach((a, i) => lines.push(mosfet(`mn${i}`, 'y', a, '0', '0', geo.nModel, widths.wn, geo)));
  }
  if (shape.pSeries > 1) {
    inputs.forEach((a, i) => {
      const top = i === 0 ? 'y' : `sp${i}`;
      const bottom = i === inputs.length - 1 ? 'vdd' : `sp${i + 1}`;
      lines.push(mosfet(`mp${i}`, top, a, bottom, 'vdd', geo.pModel, widths.wp, geo));
    });
  } else {
    inputs.forEach((a, i) => lines.push(mosfet(`mp${i}`, 'y', a, 'vdd', 'vdd', geo.pModel, widths.wp, geo)));
  }
  lines.push('.ends');
  return lines.join('\n');
}
