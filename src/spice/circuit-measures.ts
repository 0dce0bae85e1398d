/**
 * The circuit deck's measurements against the solver's figures: the mean output (within 2 % of
 * VDD), the peak-to-peak ripple and the efficiency (within 10 %), and the charge lost per period
 * (shown, not judged). Efficiency is the load's power over everything the deck's sources deliver:
 * each DC source's volts times its charge, the clock source's energy, and for a level-shifted
 * gate (an ideal ramp in the deck, with no supply of its own) its high level times the charge
 * it puts on the gate, counted as the model counts it.
 *
 * Settling: the deck starts at the solver's steady state, so the simulator's output either sits at
 * its own periodic steady state, wobbling by its time-step placement from period to period, or is
 * still moving toward it. The least-squares slope of the last SETTLE_WINDOW period means (V per
 * period) averages the wobble out. A run is settled when any of these holds:
 * - the slope is below SETTLE_FLOOR of VDD per period (the simulator's own noise);
 * - charge balance: the output capacitor gains per period C dV while the load draws about
 *   C times the ripple, so a slope below SETTLE_RIPPLE_FRACTION of the ripple leaves the pump's
 *   delivered charge within that fraction of the load's, and a first-order approach (time constant
 *   R_out C_out) that fraction of the load's drop I R_out still to come; and the window's own
 *   drift, slope times its periods, stays within a tenth of the output tolerance (the band);
 * - a fast geometric approach: the last three means give the change d2 and its ratio r to the one
 *   before, and the change still to come, d2 r / (1 - r) (Aitken's extrapolation), with d2 fits
 *   the band.
 * A waveform periodic within its own wobble passes the second; an output still rising by a
 * percent of its ripple each period, or by a change that does not shrink, passes none.
 */
import { CIRCUIT_TOLERANCE, type CircuitComparison, type CircuitFigureComparison, type CircuitPowers } from '../report/confirm-report.js';
import { SETTLE_WINDOW, type CircuitDeck } from './circuit-deck.js';
import type { SimulatorOutput } from './results.js';

/** Per-period change of the output mean, as a fraction of VDD, below which the run is settled whatever its trend. */
export const SETTLE_FLOOR = 1e-5;
/** Largest per-period drift of the output mean, as a fraction of the ripple, in charge balance. */
export const SETTLE_RIPPLE_FRACTION = 0.01;

/** Least-squares slope of equally spaced values, per step. */
export function meanSlope(values: readonly number[]): number {
  const n = values.length;
  const centre = (n - 1) / 2;
  let mean = 0;
  for (const v of values) mean += v / n;
  let sxy = 0;
  let sxx = 0;
  values.forEach((v, i) => {
    sxy += (i - centre) * (v - mean);
    sxx += (i - centre) * (i - centre);
  });
  return sxx === 0 ? 0 : sxy / sxx;
}

/** What the settle test reads, in volts: the band (a tenth of the output tolerance), the noise floor per period and the ripple. */
export interface SettleLimits {
  readonly band: number;
  readonly floor: number;
  readonly ripple: number;
}

/** Whether the output means of the last periods (oldest first, at least three) show a settled output. */
export function settledOutput(means: readonly number[], limits: SettleLimits): boolean {
  if (means.length < 3) return false;
  const slope = Math.abs(meanSlope(means));
  if (slope <= limits.floor) return true;
  if (slope <= SETTLE_RIPPLE_FRACTION * limits.ripple && slope * (means.length - 1) <= limits.band) return true;
  const [a, b, c] = means.slice(-3) as [number, number, number];
  const d1 = b - a;
  const d2 = c - b;
  const r = d1 === 0 ? Infinity : Math.abs(d2 / d1);
  if (!(r < 1)) return false;
  return Math.abs(d2) * (1 + r / (1 - r)) <= limits.band;
}

/** Powers the simulator measured over the last period, W, or null when a measurement is missing. */
export function simulatedPowers(deck: CircuitDeck, value: (name: string) => number | null): CircuitPowers | null {
  const T = deck.period;
  let input = 0;
  let generator = 0;
  for (const s of deck.supplies) {
    const q = value(`q_${s.source}`);
    if (q === null) return null;
    // i(V) flows into the source's positive terminal: the charge it delivers is -q.
    const energy = -q * s.volts;
    if (s.feeds === 'circuit') input += energy;
    else generator += energy;
  }
  const clock = value('e_clock');
  if (clock === null) return null;
  generator += clock;
  const mean = value(`vout_${SETTLE_WINDOW}`);
  // The load's power: a current source's is exact from the mean, a resistor's from the rms.
  let output: number;
  if (deck.load.resistance !== null) {
    const rms = value('vout_rms');
    if (rms === null) return null;
    output = (rms * rms) / deck.load.resistance;
  } else {
    if (mean === null) return null;
    output = deck.load.current * mean;
  }
  return { input: input / T, generator: generator / T, output };
}

/** Charge lost per period in the simulation: through each switch while its gate is off, and backwards through each diode, C. */
export function simulatedLostCharge(deck: CircuitDeck, value: (name: string) => number | null): number | null {
  let lost = 0;
  for (const name of deck.measures) {
    if (!name.startsWith('qoff_') && !name.startsWith('qrev_')) continue;
    const q = value(name);
    if (q === null) return null;
    lost += Math.abs(q);
  }
  return lost;
}

function relative(model: number | null, sim: number | null, scale: number | null): number | null {
  if (model === null || sim === null || scale === null || scale === 0) return null;
  return (model - sim) / scale;
}

function judged(
  figure: CircuitFigureComparison['figure'],
  unit: CircuitFigureComparison['unit'],
  model: number | null,
  simulator: number | null,
  difference: number | null,
  tolerance: number,
): CircuitFigureComparison {
  return { figure, unit, model, simulator, difference, tolerance, pass: difference !== null && Math.abs(difference) <= tolerance };
}

export function compareCircuit(deck: CircuitDeck, output: SimulatorOutput): CircuitComparison {
  const value = (name: string) => output.values.get(name) ?? null;
  const means = Array.from({ length: SETTLE_WINDOW }, (_, i) => value(`vout_${i + 1}`));
  const complete = means.every((m): m is number => m !== null);
  const ripple = value('vout_pp');
  const limits = { band: 0.1 * CIRCUIT_TOLERANCE.output * deck.vdd, floor: SETTLE_FLOOR * deck.vdd, ripple: ripple ?? 0 };
  const settled = complete && settledOutput(means as number[], limits);
  const drift = complete ? meanSlope(means as number[]) : null;
  const mean = means[SETTLE_WINDOW - 1] ?? null;
  const power = simulatedPowers(deck, value);
  const drawn = power === null ? 0 : power.input + power.generator;
  const efficiency = power === null || !(drawn > 0) ? null : power.output / drawn;
  const m = deck.model;
  const out = judged('output', 'V', m.output, mean, relative(m.output, mean, deck.vdd), CIRCUIT_TOLERANCE.output);
  const figures: CircuitFigureComparison[] = [
    { ...out, pass: out.pass && settled },
    judged(
      'ripple',
      'V',
      m.ripple,
      ripple,
      relative(m.ripple, ripple, ripple === null ? null : Math.abs(ripple)),
      CIRCUIT_TOLERANCE.ripple,
    ),
    judged(
      'efficiency',
      '',
      m.efficiency,
      efficiency,
      relative(m.efficiency, efficiency, efficiency === null ? null : Math.abs(efficiency)),
      CIRCUIT_TOLERANCE.efficiency,
    ),
    {
      figure: 'lost charge',
      unit: 'C',
      model: m.lostCharge,
      simulator: simulatedLostCharge(deck, value),
      difference: null,
      tolerance: null,
      pass: true,
    },
  ];
  return {
    periods: deck.periods,
    drift,
    settled,
    figures,
    power: { model: m.power, simulator: power },
    pass: settled && figures.every((f) => f.pass),
  };
}
