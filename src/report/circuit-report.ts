/** The circuit figures of one corner as report data (SI units), and their text table. */
import type { CircuitFigures } from '../circuit/figures.js';
import { figureErrorText } from '../circuit/figure-error.js';
import { formatEngineering } from '../units/format.js';
import { left, renderTable, right, type Column } from './text-table.js';

/** The figures a report carries, in the order its JSON writes them (units as in `CircuitFigures`). */
const REPORT_KEYS = [
  'method',
  'output',
  'ripple',
  'noLoadOutput',
  'loadCurrent',
  'outputResistance',
  'slowLimit',
  'fastLimit',
  'efficiency',
  'inputPower',
  'outputPower',
  'generatorPower',
  'lostCharge',
  'reverseCharge',
  'shootThroughCharge',
  'startupCycles',
  'startupTime',
] as const satisfies readonly (keyof CircuitFigures)[];

export type CircuitReport = Pick<CircuitFigures, (typeof REPORT_KEYS)[number]>;

export function circuitReport(c: CircuitFigures): CircuitReport {
  return Object.fromEntries(REPORT_KEYS.map((key) => [key, c[key]])) as unknown as CircuitReport;
}

const eng = (unit: string) => (x: number | null) => (x === null || !Number.isFinite(x) ? '-' : formatEngineering(x, unit));

/** The per-corner figures table, with the measured error on `card`; empty when no corner has circuit figures. */
export function renderCircuitTable(rows: readonly { readonly name: string; readonly circuit?: CircuitReport }[], card: string): string[] {
  const withCircuit = rows.filter((r) => r.circuit);
  if (withCircuit.length === 0) return [];
  const v = eng('V');
  const ohm = eng('ohm');
  const q = eng('C');
  const columns: Column[] = ['corner', 'V out', 'ripple', 'R out', 'R ssl', 'R fsl', 'efficiency', 'lost/period', 'start-up'].map(
    (header, i) => (i === 0 ? left(header) : right(header)),
  );
  const table = withCircuit.map((r) => {
    const c = r.circuit!;
    const startup = c.startupCycles === null ? 'not reached' : `${c.startupCycles} (${formatEngineering(c.startupTime!, 's')})`;
    // Without a steady state the solver's last state is no output: its figures are left blank.
    const settled = c.method !== 'none';
    const steady = (text: string) => (settled ? text : '-');
    return [
      r.name + (settled ? '' : ' (unsettled)'),
      steady(v(c.output)),
      steady(v(c.ripple)),
      steady(ohm(c.outputResistance)),
      ohm(c.slowLimit),
      ohm(c.fastLimit),
      steady(c.efficiency === null ? '-' : `${(c.efficiency * 100).toFixed(1)} %`),
      steady(q(c.lostCharge)),
      startup,
    ];
  });
  return [
    'circuit figures (mean output and ripple at the heavier load; start-up in periods from all capacitors discharged to 90 % of the output):',
    figureErrorText(card),
    renderTable(columns, table),
  ];
}
