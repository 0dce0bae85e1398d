/**
 * A proposal's margins in the transistor-level simulator: the design's dead-time, gap and width
 * requirements and its break-before-make pairs, worked out from what the simulator measured at the
 * proposal's worst corners. The simulation itself is the caller's (it starts processes): tune only
 * receives its measurements, in the shape `confirm` compares them.
 */
import type { Design } from '../schema/design.js';
import type { ResolvedDesign } from './resolve.js';
import { formatTime } from '../units/format.js';

/** One corner as the simulator measured it (the fields of a confirm comparison tune reads). */
export interface SimulatedCorner {
  readonly corner: string;
  /** Dead times, clean gaps and phase widths: `dead p1->p2`, `gap p1->p2`, `width p1`; s. */
  readonly quantities: ReadonlyArray<{
    readonly quantity: string;
    readonly kind: string;
    readonly model: number;
    readonly simulator: number | null;
  }>;
  /** Break-before-make margins, s. */
  readonly breakBeforeMake: ReadonlyArray<{ readonly check: string; readonly model: number; readonly simulator: number | null }>;
}

export interface SimulatorRun {
  /** The simulator and its version, e.g. ngspice-39. */
  readonly simulator: string;
  readonly corners: readonly SimulatedCorner[];
}

/** Simulates a candidate at its worst corners (injected by the command line, which may start ngspice); null when it could not. */
export type Simulate = (resolved: ResolvedDesign) => SimulatorRun | null;

export interface SimulatedCheck {
  readonly check: string;
  readonly corner: string;
  /** Margins, s; simulator null when it could not measure the quantity. */
  readonly model: number;
  readonly simulator: number | null;
}

export interface Confirmation {
  readonly simulator: string;
  readonly corners: readonly string[];
  readonly checks: readonly SimulatedCheck[];
  /** The least simulator margin (-Infinity when something was not measured), and where. */
  readonly least: number;
  readonly limiting: SimulatedCheck | null;
  /** Every requirement and pair holds in the simulator. */
  readonly pass: boolean;
  /** It holds with the mismatch part of the headroom (z sigma) to spare. */
  readonly meets: boolean;
}

function requirementChecks(design: Design, corner: SimulatedCorner): SimulatedCheck[] {
  const req = design.requirements;
  const out: SimulatedCheck[] = [];
  const add = (check: string, model: number, simulator: number | null) => out.push({ check, corner: corner.corner, model, simulator });
  for (const q of corner.quantities) {
    const sim = q.simulator;
    if (q.kind === 'dead') {
      const min = req.deadTime?.min;
      const max = req.deadTime?.max;
      if (min !== undefined) add(`${q.quantity} >= ${formatTime(min)}`, q.model - min, sim === null ? null : sim - min);
      if (max !== undefined) add(`${q.quantity} <= ${formatTime(max)}`, max - q.model, sim === null ? null : max - sim);
      if (min === undefined && max === undefined) add(`${q.quantity} > 0`, q.model, sim);
    } else if (q.kind === 'gap' && req.gap?.min !== undefined) {
      add(`${q.quantity} >= ${formatTime(req.gap.min)}`, q.model - req.gap.min, sim === null ? null : sim - req.gap.min);
    } else if (q.kind === 'width' && req.width?.min !== undefined) {
      add(`${q.quantity} >= ${formatTime(req.width.min)}`, q.model - req.width.min, sim === null ? null : sim - req.width.min);
    }
  }
  for (const b of corner.breakBeforeMake) add(b.check, b.model, b.simulator);
  return out;
}

/** The simulator's margins of a run; `spare` is the mismatch headroom (z sigma, s) it must keep to meet. */
export function confirmation(design: Design, run: SimulatorRun, spare: number): Confirmation {
  const checks = run.corners.flatMap((c) => requirementChecks(design, c));
  let least = Infinity;
  let limiting: SimulatedCheck | null = null;
  for (const c of checks) {
    const m = c.simulator ?? -Infinity;
    if (m < least) {
      least = m;
      limiting = c;
    }
  }
  return {
    simulator: run.simulator,
    corners: run.corners.map((c) => c.corner),
    checks,
    least,
    limiting,
    pass: least >= 0,
    meets: least >= spare,
  };
}
