/**
 * The circuit's output and efficiency against the clock frequency: the whole corner (generator,
 * conduction instants, circuit) re-evaluated at each frequency, at the typical corner and at the
 * corner where the circuit requirements are closest to failing.
 */
import { CIRCUIT_KINDS } from '../checks/check.js';
import { levelAt } from '../schema/level.js';
import { CornerEvaluator, type CornerResult } from './evaluate.js';
import { atFrequency } from './fmax.js';
import type { ResolvedDesign } from './resolve.js';

/** Ten clock frequencies from 1/4 to 2 times the design's, evenly on a log axis; the seventh is the design's own. */
export const SWEEP_FACTORS: readonly number[] = Array.from({ length: 10 }, (_, k) => 2 ** (k / 3 - 2));

export interface SweepPoint {
  /** Hz */
  readonly frequency: number;
  /** Mean output, V, and efficiency (fraction); null where the generator or the circuit reached no steady state. */
  readonly output: number | null;
  readonly efficiency: number | null;
  /** Every circuit check holds at this frequency; null where nothing could be computed. */
  readonly pass: boolean | null;
  /** The output checks (minimum at the heavier load, maximum at the lighter) and the efficiency check hold; null when not required or not computed. */
  readonly outputPass: boolean | null;
  readonly efficiencyPass: boolean | null;
}

export interface SweepSeries {
  readonly corner: string;
  /** Why this corner: typical (nominal process, supply and temperature), worst (least circuit margin), or both. */
  readonly role: 'typical' | 'worst' | 'typical, worst';
  readonly points: readonly SweepPoint[];
  /** The output requirement at this corner's supply, V; null when not required. */
  readonly outputMin: number | null;
  readonly outputMax: number | null;
}

export interface CircuitSweep {
  /** The design's clock frequency, Hz. */
  readonly designFrequency: number;
  readonly series: readonly SweepSeries[];
  /** Least efficiency required (fraction); null when not required. */
  readonly efficiencyMin: number | null;
}

/**
 * The typical corner: the card's tt process if the design has it (else its first), the supply
 * nearest the card's nominal, the temperature nearest 27 °C and the duty nearest the clock's.
 */
export function typicalCornerIndex(resolved: ResolvedDesign): number {
  const corners = resolved.corners.map((c) => c.corner);
  const processes = corners.map((c) => c.process);
  const process = processes.includes('tt') ? 'tt' : processes[0];
  let best = 0;
  let bestScore = Infinity;
  corners.forEach((c, i) => {
    if (c.process !== process) return;
    const score =
      Math.abs(c.vdd - resolved.card.vddNominal) * 1e6 + Math.abs(c.temperature - 27) * 1e2 + Math.abs(c.duty - resolved.design.clock.duty);
    if (score < bestScore) {
      bestScore = score;
      best = i;
    }
  });
  return best;
}

/** A circuit check's margin over its requirement's size, so output, ripple, efficiency and charge compare. */
function relativeMargin(resolved: ResolvedDesign, r: CornerResult, kind: string, margin: number): number {
  const req = resolved.design.circuit!.requirements;
  const vdd = r.corner.vdd;
  const size =
    kind === 'output-min' && req.output?.min
      ? Math.abs(levelAt(req.output.min, vdd))
      : kind === 'output-max' && req.output?.max
        ? Math.abs(levelAt(req.output.max, vdd))
        : kind === 'ripple-max'
          ? (req.ripple?.max ?? 1)
          : kind === 'efficiency-min'
            ? (req.efficiency?.min ?? 1)
            : (req.lostCharge?.max ?? 1);
  return size > 0 ? margin / size : margin;
}

/**
 * The corner whose circuit checks come closest to failing (a check that cannot be computed first,
 * then the least margin relative to its requirement); without circuit checks, the corner with the
 * least output magnitude. -1 when no corner has circuit figures.
 */
export function circuitWorstIndex(resolved: ResolvedDesign, results: readonly CornerResult[]): number {
  let best = -1;
  let bestScore = Infinity;
  results.forEach((r, i) => {
    let score = Infinity;
    for (const c of r.checks) {
      if (!CIRCUIT_KINDS.has(c.kind)) continue;
      score = Math.min(score, c.margin === null ? -Infinity : relativeMargin(resolved, r, c.kind, c.margin));
    }
    if (score === Infinity) score = r.circuit ? 1e9 + Math.abs(r.circuit.output) : Infinity;
    if (score < bestScore) {
      bestScore = score;
      best = i;
    }
  });
  return best;
}

function point(result: CornerResult, frequency: number): SweepPoint {
  const c = result.circuit;
  if (!c || c.method === 'none') return { frequency, output: null, efficiency: null, pass: null, outputPass: null, efficiencyPass: null };
  const checks = result.checks.filter((k) => CIRCUIT_KINDS.has(k.kind));
  const holds = (kinds: readonly string[]) => {
    const some = checks.filter((k) => kinds.includes(k.kind));
    return some.length === 0 ? null : some.every((k) => k.pass);
  };
  return {
    frequency,
    output: c.output,
    efficiency: c.efficiency,
    pass: checks.every((k) => k.pass),
    outputPass: holds(['output-min', 'output-max']),
    efficiencyPass: holds(['efficiency-min']),
  };
}

/** The sweep at the typical and the worst corner; null without a circuit section. */
export function circuitSweep(
  resolved: ResolvedDesign,
  results: readonly CornerResult[],
  factors: readonly number[] = SWEEP_FACTORS,
): CircuitSweep | null {
  const spec = resolved.design.circuit;
  if (!spec) return null;
  const typical = typicalCornerIndex(resolved);
  const worst = circuitWorstIndex(resolved, results);
  const picked: Array<{ index: number; role: SweepSeries['role'] }> =
    worst < 0 || worst === typical
      ? [{ index: typical, role: worst === typical ? 'typical, worst' : 'typical' }]
      : [
          { index: typical, role: 'typical' },
          { index: worst, role: 'worst' },
        ];
  const f0 = resolved.design.clock.frequency;
  const points = picked.map(() => [] as SweepPoint[]);
  for (const factor of factors) {
    const frequency = f0 * factor;
    // A point reads the output, the efficiency and the checks: the other figures are left out.
    const evaluator = new CornerEvaluator(atFrequency(resolved, frequency), {
      borrowScratch: false,
      warmStart: false,
      circuit: 'checked-figures',
    });
    picked.forEach((p, s) => {
      points[s]!.push(point(evaluator.evaluate(resolved.corners[p.index]!.corner), frequency));
    });
  }
  const req = spec.requirements;
  return {
    designFrequency: f0,
    efficiencyMin: req.efficiency?.min ?? null,
    series: picked.map((p, s) => {
      const vdd = resolved.corners[p.index]!.corner.vdd;
      return {
        corner: resolved.corners[p.index]!.corner.name,
        role: p.role,
        points: points[s]!,
        outputMin: req.output?.min ? levelAt(req.output.min, vdd) : null,
        outputMax: req.output?.max ? levelAt(req.output.max, vdd) : null,
      };
    }),
  };
}
