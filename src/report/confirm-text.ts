/** The side-by-side table of `phasegap confirm`. */
import { formatEngineering, formatSignedTime, formatTime } from '../units/format.js';
import { left, right, renderTable, type Column } from './text-table.js';
import type {
  BreakBeforeMakeComparison,
  CircuitComparison,
  CircuitFigureComparison,
  CircuitPowers,
  CornerComparison,
  QuantityComparison,
} from './confirm-report.js';
import { RON_TOLERANCE, worstDifference } from './confirm-report.js';

/** Ohms with three significant figures: 119 ohm, 1.23 kohm. */
export function formatOhms(r: number): string {
  return r >= 1e3 ? `${(r / 1e3).toPrecision(3)} kohm` : `${r.toPrecision(3)} ohm`;
}

export interface ConfirmSummary {
  readonly design: string;
  readonly model: string;
  readonly simulator: string;
  readonly tolerance: number;
  readonly corners: readonly CornerComparison[];
}

/** A relative difference as a signed percentage: +1.6 %. */
export function percent(x: number): string {
  return `${x >= 0 ? '+' : ''}${(x * 100).toFixed(1)} %`;
}

/** A timing quantity's cells before its verdict: corner, quantity, model, simulator, relative difference. */
export function quantityCells(corner: string, q: QuantityComparison): string[] {
  return [
    corner,
    q.quantity,
    formatTime(q.model),
    q.simulator === null ? 'not measured' : formatTime(q.simulator),
    q.relativeError === null ? '-' : percent(q.relativeError),
  ];
}

/** A break-before-make pair's cells before its verdict: corner, check, model margin, simulator margin. */
export function breakBeforeMakeCells(corner: string, b: BreakBeforeMakeComparison): string[] {
  return [corner, b.check, formatSignedTime(b.model), formatSignedTime(b.simulator, 'not measured')];
}

export function renderConfirmText(s: ConfirmSummary): string {
  const rows = s.corners.flatMap((c) => c.quantities.map((q) => [...quantityCells(c.corner, q), q.pass ? 'within' : 'over']));
  const out = [
    `${s.design}: ${s.model} model vs ${s.simulator}, tolerance ${(s.tolerance * 100).toFixed(1)} %, ${s.corners.length} corner${s.corners.length === 1 ? '' : 's'}`,
    '',
    renderTable(comparisonColumns('quantity', s.simulator), rows),
    '',
  ];
  const pairs = s.corners.flatMap((c) =>
    c.breakBeforeMake.map((b) => [...breakBeforeMakeCells(c.corner, b), b.agrees ? 'alike' : 'DISAGREES']),
  );
  if (pairs.length > 0) {
    out.push('break-before-make at the switches (margin, model vs simulator; they must agree on pass or fail):', '');
    out.push(renderTable([left('corner'), left('check'), right('model'), right(s.simulator), left('verdicts')], pairs), '');
  }
  const rons = s.corners.flatMap((c) =>
    c.ron.map((r) => [
      c.corner,
      r.label,
      formatOhms(r.model),
      r.simulator === null ? 'not measured' : formatOhms(r.simulator),
      r.relativeError === null ? '-' : percent(r.relativeError),
      r.pass ? 'within' : 'OVER',
    ]),
  );
  if (rons.length > 0) {
    out.push(`switch on-resistance (deep triode, gate fully on; tolerance ${(RON_TOLERANCE * 100).toFixed(0)} %):`, '');
    out.push(renderTable(comparisonColumns('switch', s.simulator), rons), '');
  }
  out.push(...circuitLines(s));
  for (const c of s.corners) for (const e of c.errors.slice(0, 3)) out.push(`${c.corner}: simulator: ${e}`);
  const worst = worstDifference(s.corners);
  if (worst) out.push(`largest difference: ${percent(worst.relativeError)} (${worst.quantity} at ${worst.corner})`);
  const failed = s.corners.filter((c) => !c.pass).length;
  const within = s.corners.filter((c) => c.quantities.every((q) => q.pass)).length;
  const ronOver = rons.filter((r) => r[5] !== 'within').length;
  if (rons.length > 0)
    out.push(
      ronOver === 0
        ? `switch R_on: all ${rons.length} within ${(RON_TOLERANCE * 100).toFixed(0)} %`
        : `switch R_on: ${ronOver} of ${rons.length} over ${(RON_TOLERANCE * 100).toFixed(0)} %`,
    );
  const differ = pairs.filter((p) => p[4] !== 'alike').length;
  const alike =
    pairs.length === 0
      ? ''
      : differ === 0
        ? `, break-before-make verdicts alike for ${pairs.length === 1 ? 'the one pair' : `all ${pairs.length} pairs`}`
        : `, break-before-make verdicts disagree for ${differ} of ${pairs.length} pair${pairs.length === 1 ? '' : 's'}`;
  const circuits = s.corners.filter((c) => c.circuit);
  const circuitWords =
    circuits.length === 0
      ? ''
      : `, circuit figures within tolerance at ${circuits.filter((c) => c.circuit!.pass).length}/${circuits.length} corners`;
  out.push(
    `verdict: ${failed === 0 ? 'AGREE' : 'DISAGREE'} (${within}/${s.corners.length} corners within tolerance${alike}${circuitWords})`,
  );
  return `${out.join('\n')}\n`;
}

/** A circuit figure's value for people: 3.33 V, 19.9 mV, 48.1 %, 271 fC. */
export function formatCircuitFigure(f: Pick<CircuitFigureComparison, 'unit'>, v: number | null): string {
  if (v === null) return 'not measured';
  return f.unit === '' ? `${(v * 100).toFixed(1)} %` : formatEngineering(v, f.unit);
}

/** The circuit figures at periodic steady state, model against simulator, and each run's settling and powers. */
function circuitLines(s: ConfirmSummary): string[] {
  const corners = s.corners.filter((c) => c.circuit);
  if (corners.length === 0) return [];
  const rows = corners.flatMap((c) => c.circuit!.figures.map((f) => [...circuitFigureCells(c.corner, f), circuitFigureVerdict(f)]));
  const out = [
    'circuit at periodic steady state (output within 2 % of VDD, ripple and efficiency within 10 %; lost charge shown, not judged):',
    '',
  ];
  out.push(renderTable(comparisonColumns('figure', s.simulator), rows), '');
  for (const c of corners) out.push(`${c.corner}: ${circuitRunText(c.circuit!, s.simulator)}`);
  out.push('');
  return out;
}

/** A circuit figure's difference: "+0.1 % of VDD" for the output, "-0.4 %" for the others, "-" when not judged. */
function circuitDifference(f: CircuitFigureComparison): string {
  return f.difference === null ? '-' : `${percent(f.difference)}${f.figure === 'output' ? ' of VDD' : ''}`;
}

/** A circuit figure's cells before its verdict: corner, figure, model, simulator, difference. */
export function circuitFigureCells(corner: string, f: CircuitFigureComparison): string[] {
  return [
    corner,
    f.figure,
    f.model === null ? '-' : formatCircuitFigure(f, f.model),
    formatCircuitFigure(f, f.simulator),
    circuitDifference(f),
  ];
}

/** A circuit figure's verdict: within or OVER its tolerance, or shown when it is not judged. */
export function circuitFigureVerdict(f: CircuitFigureComparison): string {
  return f.tolerance === null ? 'shown' : f.pass ? 'within' : 'OVER';
}

/** The largest allowed difference in words: "±2.0 % of VDD", "±10.0 %", or "not judged". */
export function circuitFigureTolerance(f: CircuitFigureComparison): string {
  return f.tolerance === null ? 'not judged' : `±${(f.tolerance * 100).toFixed(1)} %${f.figure === 'output' ? ' of VDD' : ''}`;
}

/** How the circuit's simulation ran: periods, whether it settled, and the powers of the model and the simulator. */
export function circuitRunText(k: CircuitComparison, simulator: string): string {
  const drift = k.drift === null ? 'not measured' : `${formatEngineering(k.drift, 'V')} per period`;
  const power = (p: CircuitPowers) =>
    `rails ${formatEngineering(p.input, 'W')}, generator ${formatEngineering(p.generator, 'W')}, load ${formatEngineering(p.output, 'W')}`;
  return (
    `${k.periods} periods from the solver's steady state, ${k.settled ? 'settled' : 'NOT SETTLED'} (drift ${drift});` +
    ` model ${k.power.model === null ? 'no periodic steady state' : power(k.power.model)}; ${simulator} ${k.power.simulator === null ? 'not measured' : power(k.power.simulator)}`
  );
}

/** Columns of a model-against-simulator table whose rows carry a difference judged against a tolerance. */
function comparisonColumns(subject: string, simulator: string): Column[] {
  return [left('corner'), left(subject), right('model'), right(simulator), right('difference'), left('tolerance')];
}
