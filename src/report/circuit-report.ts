/** The circuit figures of one corner as report data (SI units), and their text table. */
import type { CornerCircuit } from '../circuit/corner-circuit.js';
import { formatEngineering } from '../units/format.js';
import { renderTable, type Column } from './text-table.js';

export interface CircuitReport {
  /** How the steady state was found: 'direct' (fixed point), 'periods' (run to rest) or 'none'. */
  readonly method: string;
  /** Mean output and peak-to-peak ripple, V. */
  readonly output: number;
  readonly ripple: number;
  readonly noLoadOutput: number;
  /** Mean load current, A. */
  readonly loadCurrent: number;
  /** Output impedance and its slow- and fast-switching asymptotes, ohm. */
  readonly outputResistance: number | null;
  readonly slowLimit: number | null;
  readonly fastLimit: number | null;
  readonly efficiency: number | null;
  /** W */
  readonly inputPower: number;
  readonly outputPower: number;
  readonly generatorPower: number;
  /** Charge lost per period, C. */
  readonly lostCharge: number;
  readonly reverseCharge: number;
  readonly shootThroughCharge: number;
  readonly startupCycles: number | null;
  /** s */
  readonly startupTime: number | null;
}

export function circuitReport(c: CornerCircuit): CircuitReport {
  return {
    method: c.method, output: c.output, ripple: c.ripple, noLoadOutput: c.noLoadOutput, loadCurrent: c.loadCurrent,
    outputResistance: c.outputResistance, slowLimit: c.slowLimit, fastLimit: c.fastLimit, efficiency: c.efficiency,
    inputPower: c.inputPower, outputPower: c.outputPower, generatorPower: c.generatorPower,
    lostCharge: c.lostCharge, reverseCharge: c.reverseCharge, shootThroughCharge: c.shootThroughCharge,
    startupCycles: c.startupCycles, startupTime: c.startupTime,
  };
}

const eng = (unit: string) => (x: number | null) => (x === null || !Number.isFinite(x) ? '-' : formatEngineering(x, unit));

/** The per-corner figures table; empty when no corner has circuit figures. */
export function renderCircuitTable(rows: readonly { readonly name: string; readonly circuit?: CircuitReport }[]): string[] {
  const withCircuit = rows.filter((r) => r.circuit);
  if (withCircuit.length === 0) return [];
  const v = eng('V');
  const ohm = eng('ohm');
  const q = eng('C');
  const columns: Column[] = ['corner', 'V out', 'ripple', 'R out', 'R ssl', 'R fsl', 'efficiency', 'lost/period', 'start-up']
    .map((header, i) => ({ header, align: i === 0 ? 'left' : 'right' }));
  const table = withCircuit.map((r) => {
    const c = r.circuit!;
    const startup = c.startupCycles === null ? 'not reached' : `${c.startupCycles} (${formatEngineering(c.startupTime!, 's')})`;
    return [r.name + (c.method === 'none' ? ' (unsettled)' : ''), v(c.output), v(c.ripple), ohm(c.outputResistance), ohm(c.slowLimit), ohm(c.fastLimit),
      c.efficiency === null ? '-' : `${(c.efficiency * 100).toFixed(1)} %`, q(c.lostCharge), startup];
  });
  return ['circuit figures (mean output and ripple at the heavier load; start-up in periods from all capacitors discharged to 90 % of the output):',
    renderTable(columns, table)];
}
