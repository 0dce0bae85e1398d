/**
 * A structural IEEE 1364 Verilog model of the generator: one gate primitive per cell (not, nand,
 * nor) with the corner's #(rise, fall) delays, the clock as the only input and the phases (and
 * their complements and early phases) as outputs. Delays are written in the timescale's unit,
 * rounded to its precision.
 */
import type { CompiledNetlist } from '../netlist/netlist.js';
import type { PrimitiveCell } from '../cells/library.js';
import type { FixedDelays } from './fixed.js';
import { verilogComment, verilogIdentifier, verilogString } from './identifiers.js';
import { finite } from '../units/finite.js';
import { prefixedUnits } from '../units/format.js';

export interface Timescale {
  /** Unit of delay numbers, s (1e-9 for 1ns). */
  readonly unit: number;
  /** Precision, s (1e-12 for 1ps). */
  readonly precision: number;
}

export const DEFAULT_TIMESCALE: Timescale = { unit: 1e-9, precision: 1e-12 };

const PRIMITIVE: Readonly<Record<PrimitiveCell, string>> = { INV: 'not', NAND2: 'nand', NAND3: 'nand', NOR2: 'nor', NOR3: 'nor' };

export function timescaleText(t: Timescale): string {
  const show = (s: number) => {
    for (const [scale, unit] of prefixedUnits('s', 1, 1e-15)) {
      const n = Math.round(s / scale);
      if ([1, 10, 100].includes(n) && Math.abs(n * scale - s) < 1e-3 * s) return `${n}${unit}`;
    }
    throw new Error(`internal: ${s} s is not a Verilog time unit`);
  };
  return `\`timescale ${show(t.unit)} / ${show(t.precision)}`;
}

/** A delay in timescale units, rounded to the precision, as text. */
export function delayText(seconds: number, t: Timescale): string {
  const steps = Math.round(finite(seconds, ['Verilog delay']) / t.precision);
  const digits = Math.max(0, Math.round(Math.log10(t.unit / t.precision)));
  return ((steps * t.precision) / t.unit).toFixed(digits);
}

/** The delay actually simulated, s: rounded to the precision. */
export function roundedDelay(seconds: number, t: Timescale): number {
  return Math.round(seconds / t.precision) * t.precision;
}

export interface VerilogModule {
  readonly name: string;
  readonly text: string;
  readonly inputs: readonly string[];
  readonly outputs: readonly string[];
}

export function verilogModule(
  netlist: CompiledNetlist,
  delays: FixedDelays,
  name: string,
  header: readonly string[],
  t: Timescale = DEFAULT_TIMESCALE,
): VerilogModule {
  const src = netlist.source;
  const clock = netlist.netNames[netlist.clock]!;
  const outputs = [...src.phases, ...Object.values(src.complements), ...Object.values(src.early)];
  const id = verilogIdentifier;
  const internal = netlist.netNames.filter((n) => n !== clock && !outputs.includes(n));
  const lines = [
    ...header.map(verilogComment),
    timescaleText(t),
    '',
    `module ${id(name)} (${[clock, ...outputs].map(id).join(', ')});`,
    `  input ${id(clock)};`,
    `  output ${outputs.map(id).join(', ')};`,
  ];
  if (internal.length > 0) lines.push(`  wire ${internal.map(id).join(', ')};`);
  lines.push('');
  src.gates.forEach((gate, g) => {
    const d = `#(${delayText(delays.rise[g]!, t)}, ${delayText(delays.fall[g]!, t)})`;
    lines.push(`  ${PRIMITIVE[gate.cell]} ${d} ${id(gate.name)} (${[gate.output, ...gate.inputs].map(id).join(', ')});`);
  });
  lines.push('endmodule', '');
  return { name, text: lines.join('\n'), inputs: [clock], outputs };
}

/**
 * A testbench that drives the clock like the engine does (low for one period, then rising every
 * period at the given duty), dumps every signal to a VCD file and stops after `periods` periods.
 */
export function verilogTestbench(
  module: VerilogModule,
  period: number,
  duty: number,
  periods: number,
  vcdFile: string,
  t: Timescale = DEFAULT_TIMESCALE,
): string {
  const id = verilogIdentifier;
  const clock = module.inputs[0]!;
  const high = delayText(duty * period, t);
  const low = delayText((1 - duty) * period, t);
  return [
    '',
    `module ${id(`${module.name}_tb`)};`,
    `  reg ${id(clock)};`,
    `  wire ${module.outputs.map(id).join(', ')};`,
    `  ${id(module.name)} dut (${[clock, ...module.outputs].map((n) => `.${id(n)}(${id(n)})`).join(', ')});`,
    '  initial begin',
    `    $dumpfile(${verilogString(vcdFile)});`,
    `    $dumpvars(0, ${id(`${module.name}_tb`)});`,
    `    ${id(clock)} = 1'b0;`,
    `    #${delayText(period, t)};`,
    `    forever begin ${id(clock)} = 1'b1; #${high}; ${id(clock)} = 1'b0; #${low}; end`,
    '  end',
    `  initial #${delayText(periods * period, t)} $finish;`,
    'endmodule',
    '',
  ].join('\n');
}
