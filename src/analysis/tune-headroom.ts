/**
 * The headroom a proposal must keep on every margin, and its Monte Carlo yield. By default: the
 * model's measured dead-time error band on the card (its largest |error|, which covers minima and
 * maxima alike, a fraction of the dead time, src/delay/error-band.ts, taken of the candidate's largest dead time so that it covers every
 * corner; the gap checks carry their own band) plus z sigma, sigma the spread of the least margin per
 * die in a short seeded Monte Carlo at the candidate's limiting corners and z = Φ⁻¹(minYield)
 * (3 without one), plus whatever the simulator found missing when the proposal was confirmed.
 */
import { montecarloSettings, type Design } from '../schema/design.js';
import type { CornerResult } from './evaluate.js';
import type { ResolvedDesign } from './resolve.js';
import { VOLTAGE_KINDS, type Check } from '../checks/check.js';
import { chunkPlan, runChunk } from './montecarlo.js';
import { normalQuantile } from '../variation/normal-quantile.js';
import { deadTimeBand } from '../delay/error-band.js';
import { wilsonInterval } from '../variation/stats.js';

/** The automatic headroom: the model's error band plus z sigma of mismatch. */
export interface AutoHeadroom {
  /** Sigmas of mismatch to cover. */
  readonly z: number;
  /** Monte Carlo dies per limiting corner. */
  readonly dies: number;
  /** Limiting corners (least margins) the Monte Carlo runs at. */
  readonly corners: number;
  readonly seed: number;
}

/** The headroom a candidate is held to. */
export interface Headroom {
  /** The model's error band on the candidate's largest dead time, s. */
  readonly band: number;
  /** Largest sigma of the least margin per die over the Monte Carlo corners, s (0 with a fixed headroom). */
  readonly sigma: number;
  readonly z: number;
  /** What ngspice found the model's margins short by on an earlier confirmation of this chain, s (0 when none). */
  readonly simulator: number;
  /** band + z sigma + simulator, or the fixed headroom, s. */
  readonly total: number;
  /** Corners the Monte Carlo ran at. */
  readonly corners: readonly string[];
  readonly dies: number;
}

/** Monte Carlo yield at one corner with its 95 % Wilson interval. */
export interface CornerYield {
  readonly corner: string;
  readonly passes: number;
  readonly dies: number;
  readonly low: number;
  readonly high: number;
}

/** Sigmas of mismatch covered without a minYield (99.87 % per corner, one-sided). */
export const DEFAULT_Z = 3;
/** Yield a proposal must show without a minYield: 3 sigma two-sided (common practice). */
export const DEFAULT_YIELD = 0.9973;
export const HEADROOM_DIES = 200;
export const HEADROOM_CORNERS = 3;

/** z = Φ⁻¹(minYield) for the per-corner yield, or DEFAULT_Z. */
export function autoHeadroom(design: Design): AutoHeadroom {
  const y = design.requirements.minYield;
  return {
    z: y === undefined ? DEFAULT_Z : normalQuantile(y),
    dies: HEADROOM_DIES,
    corners: HEADROOM_CORNERS,
    seed: montecarloSettings(design).seed,
  };
}

export function yieldTarget(design: Design): number {
  return design.requirements.minYield ?? DEFAULT_YIELD;
}

/** Least timing margin of one corner's checks (a failing voltage check counts; null margin: -Infinity). */
export function leastMargin(checks: readonly Check[]): number {
  let least = Infinity;
  for (const c of checks) {
    if (c.margin === null) return -Infinity;
    if (c.pass && VOLTAGE_KINDS.has(c.kind)) continue;
    least = Math.min(least, c.margin);
  }
  return least;
}

export interface MismatchRun {
  readonly sigma: number;
  readonly corners: readonly string[];
  readonly yields: readonly CornerYield[];
}

/**
 * A seeded Monte Carlo of `dies` dies at the `count` corners with the least margins: the largest
 * sigma of the least margin per die (Infinity when a die cannot be measured) and each corner's yield.
 */
export function mismatchAtLimits(
  resolved: ResolvedDesign,
  results: readonly CornerResult[],
  count: number,
  dies: number,
  seed: number,
): MismatchRun {
  const limiting = results
    .map((r, i) => ({ i, least: leastMargin(r.checks) }))
    .sort((a, b) => a.least - b.least || a.i - b.i)
    .slice(0, count);
  const sub: ResolvedDesign = { ...resolved, corners: limiting.map(({ i }) => resolved.corners[i]!) };
  const chunks = chunkPlan(dies).map(({ start, count: n }) => runChunk(sub, seed, start, n, { circuit: true }));
  let sigma = 0;
  const yields: CornerYield[] = [];
  for (let c = 0; c < sub.corners.length; c++) {
    let n = 0;
    let mean = 0;
    let m2 = 0;
    let passes = 0;
    for (const chunk of chunks) {
      const corner = chunk.corners[c]!;
      passes += corner.passes;
      for (const x of corner.leastMargin) {
        if (!Number.isFinite(x)) {
          m2 = Infinity;
          continue;
        }
        n++;
        const d = x - mean;
        mean += d / n;
        m2 += d * (x - mean);
      }
    }
    sigma = Math.max(sigma, n > 1 ? Math.sqrt(m2 / (n - 1)) : Infinity);
    const { low, high } = wilsonInterval(passes, dies);
    yields.push({ corner: sub.corners[c]!.corner.name, passes, dies, low, high });
  }
  return { sigma, corners: sub.corners.map((c) => c.corner.name), yields };
}

/** The headroom a candidate needs, from its Monte Carlo run; `simulator` is added on top. */
export function candidateHeadroom(
  resolved: ResolvedDesign,
  deadMax: number,
  auto: AutoHeadroom,
  run: MismatchRun,
  simulator = 0,
): Headroom {
  const band = deadTimeBand(resolved.model.name, resolved.card.name) * deadMax;
  return {
    band,
    sigma: run.sigma,
    z: auto.z,
    simulator,
    total: band + auto.z * run.sigma + simulator,
    corners: run.corners,
    dies: auto.dies,
  };
}

/** A fixed headroom (`--margin`). */
export function fixedHeadroom(total: number, run: MismatchRun, dies: number): Headroom {
  return { band: 0, sigma: run.sigma, z: 0, simulator: 0, total, corners: run.corners, dies };
}
