/**
 * The shape of a level shifter's output edge: when it crosses each level of its swing, from its
 * 50 % point, in units of its full-swing transition. A linear ramp of the same transition crosses
 * 90 % at +0.4; the deck's shifter output crosses it between +0.29 and +0.54, and 95 % between
 * +0.41 and +0.78. What decides it is how fast the latch node that drives the output inverter moves
 * against the output itself: a latch node faster than the output leaves the output inverter's own
 * step response (a quick start and the triode tail at the top), a slower one drags the start out.
 * So each level's time is fitted on the logarithm of r, the latch node's full-swing transition over
 * the output's (scripts/shifter-fit.mjs: ngspice runs of the deck's shifter, see shifter-sizing.ts);
 * at the too-tight demo's high-side switch the tail is what sets the turn-off instant.
 */

/** Levels the fits give, as fractions of the swing from the low level (the fit script's SHAPE_LEVELS). */
export const SHAPE_LEVELS: readonly number[] = [0.05, 0.1, 0.2, 0.3, 0.4, 0.6, 0.7, 0.8, 0.9, 0.95];

/**
 * One output edge's fit: per level of SHAPE_LEVELS, [a, b, c] with the time from 50 % a + b ln r +
 * c ln^2 r transitions; r is held inside the range the fit was made over.
 */
export interface EdgeShapeFit {
  readonly ratio: readonly [number, number];
  readonly levels: ReadonlyArray<readonly [number, number, number]>;
}

/**
 * Time from the 50 % point to where the edge crosses `fraction` of its swing, in transitions, for a
 * latch node `ratio` times as slow as the output; null outside the levels the fit gives.
 */
export function shapeLag(fit: EdgeShapeFit, ratio: number, fraction: number): number | null {
  const first = SHAPE_LEVELS[0]!;
  const last = SHAPE_LEVELS[SHAPE_LEVELS.length - 1]!;
  if (!(fraction >= first && fraction <= last)) return null;
  const x = Math.log(Math.min(Math.max(ratio, fit.ratio[0]), fit.ratio[1]));
  const lagAt = (i: number): number => {
    const [a, b, c] = fit.levels[i]!;
    return a + x * (b + x * c);
  };
  // The segment of fitted levels that holds the fraction; the 50 % point (time 0) lies inside one.
  let i = 0;
  while (i < SHAPE_LEVELS.length - 2 && SHAPE_LEVELS[i + 1]! < fraction) i++;
  let [lo, loLag] = [SHAPE_LEVELS[i]!, lagAt(i)];
  let [hi, hiLag] = [SHAPE_LEVELS[i + 1]!, lagAt(i + 1)];
  if (lo < 0.5 && hi > 0.5) {
    if (fraction < 0.5) [hi, hiLag] = [0.5, 0];
    else [lo, loLag] = [0.5, 0];
  }
  return loLag + ((fraction - lo) / (hi - lo)) * (hiLag - loLag);
}
