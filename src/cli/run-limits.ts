/**
 * Upper bounds on the sizes a command line can ask for, checked before anything is allocated or
 * run: each one keeps a typo (1e12 for 1e3) from running for days or exhausting memory.
 */

/** Monte Carlo dies per corner (`mc --samples`, `report --mc`, the design's montecarlo.samples). */
export const MAX_SAMPLES = 10_000_000;

/** Points of one sweep grid (the product of the axis lengths). */
export const MAX_SWEEP_POINTS = 1_000_000;

/** Threads for mc and sweep, ngspice runs at once for confirm and characterize. */
export const MAX_WORKERS = 256;

/** Tune proposals listed. */
export const MAX_TOP = 1000;

/** Seeds are mixed as 32-bit words (src/variation/mismatch.ts), so larger seeds would repeat smaller ones. */
export const MAX_SEED = 0xffff_ffff;

/**
 * Relative resolution of the fmax bisection: below about 1e-15 the bracket stops shrinking in
 * double precision and the search would never end; 1e-9 is far finer than any model's accuracy.
 */
export const MIN_FMAX_RESOLUTION = 1e-9;
export const MAX_FMAX_RESOLUTION = 0.5;

/** Clock periods in a VCD dump and in a Verilog testbench. */
export const MAX_VCD_PERIODS = 1000;
export const MAX_TESTBENCH_PERIODS = 10_000;
