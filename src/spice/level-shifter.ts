/**
 * A switch's level shifter in a deck, as the model describes it at the deck's corner (a delay from its input's 50 %
 * crossing to its output's, and linear output ramps between its own low and high levels), built
 * from ngspice's XSPICE bridges: a comparator at half the supply (adc_bridge, high input
 * impedance, so it loads its net as the model assumes: not at all), a digital buffer or inverter
 * holding the delay, and a ramp source (dac_bridge) whose ramp starts at the digital edge and
 * crosses 50 % half a transition later.
 */
import type { GateWave } from '../switches/conduction.js';
import type { SwitchPlan } from '../switches/plan.js';
import { spiceNumber } from './names.js';
import { spiceComment } from './text.js';

/** Delay of the comparator, s: the smallest the bridge takes, small beside any gate delay. */
const COMPARATOR_DELAY = 1e-12;

/** Deck node of the shifted gate of device `device` of switch `plan` (indices in the design). */
export function shifterNode(plan: number, device: number): string {
  return `ls${plan}_${device}`;
}

/**
 * The digital delays that put each output ramp's 50 % point where the model has it, s, or null
 * when the shifter is faster than half its own output ramp (the bridge cannot start a ramp before
 * its input has switched).
 */
export function shifterDelays(wave: GateWave, delay: number): { rise: number; fall: number } | null {
  const rise = delay - COMPARATOR_DELAY - wave.rise.transition / 2;
  const fall = delay - COMPARATOR_DELAY - wave.fall.transition / 2;
  return rise > 0 && fall > 0 ? { rise, fall } : null;
}

/** The element and model lines of one shifter from `input` to `output`, or why it cannot be built. */
export function shifterLines(id: string, plan: SwitchPlan, input: string, output: string, wave: GateWave, vdd: number, scale = 1): string[] | string {
  const ls = plan.levelShifter!;
  const delay = ls.delay * scale;
  const delays = shifterDelays(wave, delay);
  if (!delays) {
    return `its level shifter's delay (${spiceNumber(ls.delay)} s) is shorter than half its output ramp, which the deck's bridges cannot start early`;
  }
  const { low, high } = wave.rise;
  return [
    spiceComment(`${plan.name}: level shifter, ${spiceNumber(delay)} s, ${spiceNumber(low)} V .. ${spiceNumber(high)} V${ls.invert ? ', inverting' : ''}`
      + ` (ideal: comparator at VDD/2, digital delay, linear ramps of ${spiceNumber(wave.rise.transition)} s up and ${spiceNumber(wave.fall.transition)} s down)`),
    `a${id}_in [${input}] [${id}_d] ${id}_cmp`,
    `.model ${id}_cmp adc_bridge(in_low=${spiceNumber(vdd / 2)} in_high=${spiceNumber(vdd / 2)} rise_delay=${spiceNumber(COMPARATOR_DELAY)} fall_delay=${spiceNumber(COMPARATOR_DELAY)})`,
    `a${id}_dly ${id}_d ${id}_q ${id}_gate`,
    `.model ${id}_gate ${ls.invert ? 'd_inverter' : 'd_buffer'}(rise_delay=${spiceNumber(delays.rise)} fall_delay=${spiceNumber(delays.fall)})`,
    `a${id}_out [${id}_q] [${output}] ${id}_ramp`,
    `.model ${id}_ramp dac_bridge(out_low=${spiceNumber(low)} out_high=${spiceNumber(high)} out_undef=${spiceNumber(low)} t_rise=${spiceNumber(wave.rise.transition)} t_fall=${spiceNumber(wave.fall.transition)})`,
  ];
}
