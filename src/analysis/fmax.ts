/**
 * The highest clock frequency at which every check holds at every corner: bracket by doubling or
 * halving from the design's frequency, then bisect to a relative resolution. A design with a
 * circuit section has its output requirements among the checks, so without a settle constraint
 * the output spec (output level, ripple, efficiency, lost charge) sets fmax and the note says so.
 */
import { CornerEvaluator, limitingCheck, type Limiting } from './evaluate.js';
import { CIRCUIT_KINDS, VOLTAGE_KINDS, type CheckKind } from '../checks/check.js';
import type { ResolvedDesign } from './resolve.js';

export interface FmaxOptions {
  /** Relative resolution of the answer, (hi - lo)/lo. */
  readonly resolution?: number;
  /** Search limits, Hz. */
  readonly floor?: number;
  readonly ceiling?: number;
}

export interface FmaxResult {
  /** Highest passing frequency found, Hz; null when none passes down to the floor. */
  readonly fmax: number | null;
  readonly resolution: number;
  /** The design's own clock frequency, Hz. */
  readonly designFrequency: number;
  /** What fails just above fmax (or at the design frequency when nothing passes). */
  readonly limiting: Limiting | null;
  /** The least-margin check at fmax itself (it passes there); null when there is no fmax. */
  readonly atFmax?: Limiting | null;
  /** The frequency, Hz, of the failing probe just above fmax where `limiting` was found; null when none failed. */
  readonly probeFrequency?: number | null;
  /** Words when no answer exists or the ceiling was reached. */
  readonly note: string;
  readonly evaluations: number;
}

export const DEFAULT_RESOLUTION = 1e-3;

export function atFrequency(resolved: ResolvedDesign, frequency: number): ResolvedDesign {
  const design = resolved.design;
  return { ...resolved, design: { ...design, clock: { ...design.clock, frequency } } };
}

export function findFmax(resolved: ResolvedDesign, options: FmaxOptions = {}): FmaxResult {
  const resolution = options.resolution ?? DEFAULT_RESOLUTION;
  const f0 = resolved.design.clock.frequency;
  const floor = options.floor ?? f0 / 1e6;
  const ceiling = options.ceiling ?? Math.max(f0 * 1e4, 1e12);
  let evaluations = 0;
  const trial = (f: number) => {
    const at = atFrequency(resolved, f);
    const evaluator = CornerEvaluator.forProbes(at);
    let pass = true;
    let worst: ReturnType<typeof limitingCheck> = null;
    for (const { corner } of at.corners) {
      const r = evaluator.evaluate(corner);
      pass &&= r.pass;
      worst = limitingCheck([r], worst);
    }
    evaluations += at.corners.length;
    return { pass, limiting: worst };
  };
  const first = trial(f0);
  /** No frequency passes: the design frequency's limiting check says why. */
  const noFmax = (note: string): FmaxResult => ({
    fmax: null,
    resolution,
    designFrequency: f0,
    limiting: first.limiting,
    atFmax: null,
    probeFrequency: f0,
    note,
    evaluations,
  });
  if (!first.pass && first.limiting && VOLTAGE_KINDS.has(first.limiting.kind as CheckKind)) {
    return noFmax(`a switch fails its ${first.limiting.kind} check, which no clock frequency changes`);
  }
  let lo: number;
  let hi: number;
  let failing = first.limiting;
  let passing = first.pass ? first.limiting : null;
  let probe: number | null = first.pass ? null : f0;
  if (first.pass) {
    lo = f0;
    hi = f0 * 2;
    for (;;) {
      if (hi > ceiling) {
        return {
          fmax: lo,
          resolution,
          designFrequency: f0,
          limiting: null,
          atFmax: passing,
          probeFrequency: null,
          note: `still passing at the search ceiling ${ceiling} Hz`,
          evaluations,
        };
      }
      const t = trial(hi);
      if (!t.pass) {
        failing = t.limiting;
        probe = hi;
        break;
      }
      passing = t.limiting;
      lo = hi;
      hi *= 2;
    }
  } else {
    hi = f0;
    lo = f0 / 2;
    for (;;) {
      if (lo < floor) {
        return noFmax(`no frequency down to ${floor} Hz passes; the limiting check does not depend on the clock frequency`);
      }
      const t = trial(lo);
      if (t.pass) {
        passing = t.limiting;
        break;
      }
      hi = lo;
      failing = t.limiting;
      probe = lo;
      lo /= 2;
    }
  }
  while ((hi - lo) / lo > resolution) {
    const mid = Math.sqrt(lo * hi);
    const t = trial(mid);
    if (t.pass) {
      lo = mid;
      passing = t.limiting;
    } else {
      hi = mid;
      failing = t.limiting;
      probe = mid;
    }
  }
  return {
    fmax: lo,
    resolution,
    designFrequency: f0,
    limiting: failing,
    atFmax: passing,
    probeFrequency: probe,
    note: circuitNote(resolved, failing),
    evaluations,
  };
}

/** Words naming the circuit requirement that sets fmax, when one does. */
function circuitNote(resolved: ResolvedDesign, limiting: Limiting | null): string {
  if (!limiting || !CIRCUIT_KINDS.has(limiting.kind as CheckKind)) return '';
  const settle = resolved.design.constraints.settle.length > 0 ? '' : ' (the design has no settle constraint)';
  return `the circuit's output requirement ${limiting.check} sets fmax${settle}`;
}
