/**
 * The review page's circuit section as data: a row per corner with each figure, its SI value and
 * its verdict against the circuit requirements, and the chart of output and efficiency against
 * the clock frequency. The HTML and Markdown pages only lay it out.
 */
import type { CornerResult } from '../analysis/evaluate.js';
import { figureErrorText } from '../circuit/figure-error.js';
import type { ResolvedDesign } from '../analysis/resolve.js';
import { circuitSweep, type CircuitSweep } from '../analysis/circuit-sweep.js';
import { CIRCUIT_KINDS, type CheckKind } from '../checks/check.js';
import { formatEngineering } from '../units/format.js';
import { GLYPH } from './palette.js';
import { levelText } from './node-table.js';
import { renderCircuitSweepChart } from './svg/circuit-sweep-chart.js';

export interface CircuitCell {
  readonly text: string;
  /** The figure in SI units (V, ohm, fraction, C, s); null when not computed. */
  readonly value: number | null;
  /** The verdict of the requirement on this figure; null when none is set. */
  readonly pass: boolean | null;
}

export interface CircuitRow {
  readonly corner: string;
  /** Figures in column order; empty when the corner has no circuit figures. */
  readonly cells: readonly CircuitCell[];
  readonly pass: boolean;
  readonly verdict: string;
}

export interface CircuitSection {
  readonly head: readonly string[];
  /** What each column must meet ('' where nothing is required), under the head. */
  readonly required: readonly string[];
  readonly rows: readonly CircuitRow[];
  readonly sweep: CircuitSweep;
  readonly chart: string;
  readonly note: string;
}

export const CIRCUIT_HEAD = [
  'corner',
  'V out',
  'ripple',
  'R out',
  'R ssl',
  'R fsl',
  'efficiency',
  'lost / period',
  'start-up',
  'verdict',
] as const;

const eng =
  (unit: string) =>
  (x: number | null): string =>
    x === null || !Number.isFinite(x) ? '-' : formatEngineering(x, unit);

/** The figure each circuit check kind judges, as the verdict column names it. */
const FIGURE: Readonly<Partial<Record<CheckKind, string>>> = {
  'output-min': 'output min',
  'output-max': 'output max',
  'ripple-max': 'ripple',
  'efficiency-min': 'efficiency',
  'lost-charge-max': 'lost charge',
};

function verdictOf(result: CornerResult, kinds: readonly CheckKind[]): boolean | null {
  const checks = result.checks.filter((c) => kinds.includes(c.kind));
  return checks.length === 0 ? null : checks.every((c) => c.pass);
}

function row(result: CornerResult): CircuitRow {
  const c = result.circuit;
  const failing = result.checks.filter((k) => CIRCUIT_KINDS.has(k.kind) && !k.pass);
  const pass = c !== undefined && failing.length === 0;
  const verdict =
    c === undefined
      ? `${GLYPH.fail} no figures: the generator did not settle`
      : pass
        ? `${GLYPH.pass} pass`
        : `${GLYPH.fail} FAIL: ${[...new Set(failing.map((k) => FIGURE[k.kind] ?? k.kind))].join(', ')}`;
  if (!c) return { corner: result.corner.name, cells: [], pass: false, verdict };
  const v = eng('V');
  const ohm = eng('ohm');
  // Without a steady state the solver's last state is no output: its figures are left blank.
  const settled = c.method !== 'none';
  const cell = (text: string, value: number | null, kinds: readonly CheckKind[] = []): CircuitCell => ({
    text,
    value,
    pass: verdictOf(result, kinds),
  });
  const steady = (text: string, value: number | null, kinds: readonly CheckKind[] = []): CircuitCell =>
    settled ? cell(text, value, kinds) : cell('-', null, kinds);
  const startup =
    c.startupCycles === null
      ? `not reached in ${c.startupLimit} periods`
      : `${c.startupCycles} (${formatEngineering(c.startupTime!, 's')})`;
  return {
    corner: result.corner.name + (settled ? '' : ' (unsettled)'),
    cells: [
      steady(v(c.output), c.output, ['output-min', 'output-max']),
      steady(v(c.ripple), c.ripple, ['ripple-max']),
      steady(ohm(c.outputResistance), c.outputResistance),
      cell(ohm(c.slowLimit), c.slowLimit),
      cell(ohm(c.fastLimit), c.fastLimit),
      steady(c.efficiency === null ? '-' : `${(c.efficiency * 100).toFixed(1)} %`, c.efficiency, ['efficiency-min']),
      steady(eng('C')(c.lostCharge), c.lostCharge, ['lost-charge-max']),
      cell(startup, c.startupTime),
    ],
    pass,
    verdict,
  };
}

/** The section for a design with a circuit; null without one. */
export function circuitSection(resolved: ResolvedDesign, results: readonly CornerResult[]): CircuitSection | null {
  const spec = resolved.design.circuit;
  const sweep = circuitSweep(resolved, results);
  if (!spec || !sweep) return null;
  const req = spec.requirements;
  const output = [req.output?.min ? `≥ ${levelText(req.output.min)}` : '', req.output?.max ? `≤ ${levelText(req.output.max)}` : '']
    .filter((t) => t)
    .join(', ');
  const required = [
    'required',
    output,
    req.ripple ? `≤ ${formatEngineering(req.ripple.max, 'V')}` : '',
    '',
    '',
    '',
    req.efficiency ? `≥ ${(req.efficiency.min * 100).toFixed(1)} %` : '',
    req.lostCharge ? `≤ ${formatEngineering(req.lostCharge.max, 'C')}` : '',
    '',
    '',
  ];
  const load = spec.load ? ('current' in spec.load ? 'the heavier load current' : 'the lower load resistance') : 'no load';
  return {
    head: CIRCUIT_HEAD,
    required,
    rows: results.map(row),
    sweep,
    chart: renderCircuitSweepChart({ design: resolved.design.name, output: spec.output, sweep }, 'sweep'),
    note:
      `Mean output, ripple (peak to peak), output impedance with its slow- and fast-switching asymptotes, efficiency and start-up at ${load}; ` +
      'the output maximum is checked at the lighter load. Efficiency counts the clock generator and the switch gates as input. ' +
      'Lost charge is what flows back through off switches and reverse-biased diodes and through pairs that conduct together, per period. ' +
      'Start-up counts periods from all capacitors discharged to 90 % of the final output. A failing figure is marked ✕ and shaded. ' +
      `${sentence(figureErrorText(resolved.card.name))}.`,
  };
}

/** A line that opens lower-case, as a sentence. */
function sentence(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
