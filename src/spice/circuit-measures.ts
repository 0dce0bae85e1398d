/**
 * The circuit deck's measurements against the solver's figures: the mean output (within 2 % of
 * VDD), the peak-to-peak ripple and the efficiency (within 10 %), and the charge lost per period
 * (shown, not judged). Efficiency is the load's power over everything the deck's sources deliver:
 * each DC source's volts times its charge, the clock source's energy, and for a level-shifted
 * gate (an ideal ramp in the deck, with no supply of its own) its high level times the charge
 * it puts on the gate, counted as the model counts it.
 *
 * Settling: the output means of the last three periods give the per-period change d2 and its
 * ratio r to the one before; the change still to come is d2 r / (1 - r) for a geometric approach
 * (Aitken's extrapolation). The run counts as settled when that and d2 together stay within a
 * tenth of the output tolerance, or d2 is below SETTLE_FLOOR of VDD (the simulator's own noise).
 */
import { CIRCUIT_TOLERANCE, type CircuitComparison, type CircuitFigureComparison, type CircuitPowers } from '../report/confirm-report.js';
import type { CircuitDeck } from './circuit-deck.js';
import type { SimulatorOutput } from './results.js';

/** Per-period change of the output mean, as a fraction of VDD, below which the run is settled whatever its trend. */
export const SETTLE_FLOOR = 1e-5;

/** Whether three successive period means show a settled output; vdd and the tolerance in volts. */
export function settledOutput(means: readonly [number, number, number], band: number, floor: number): boolean {
  const d1 = means[1] - means[0];
  const d2 = means[2] - means[1];
  if (Math.abs(d2) <= floor) return true;
  const r = d1 === 0 ? Infinity : Math.abs(d2 / d1);
  if (!(r < 1)) return false;
  return Math.abs(d2) * (1 + r / (1 - r)) <= band;
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
  const mean = value('vout_3');
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
  const means = [value('vout_1'), value('vout_2'), value('vout_3')];
  const complete = means.every((m): m is number => m !== null);
  const band = 0.1 * CIRCUIT_TOLERANCE.output * deck.vdd;
  const settled = complete && settledOutput(means as [number, number, number], band, SETTLE_FLOOR * deck.vdd);
  const drift = complete ? means[2]! - means[1]! : null;
  const mean = means[2] ?? null;
  const ripple = value('vout_pp');
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
    power: { model: { input: m.inputPower, generator: m.generatorPower, output: m.outputPower }, simulator: power },
    pass: settled && figures.every((f) => f.pass),
  };
}
