/**
 * A number written without a unit is read in SI units, but one far from the scale of its field
 * almost always lacks its unit. The rule: a bare time of 1 us or more (clock edges, delays and dead
 * times of these generators are ps to ns) and a bare frequency below 1 kHz (they run at kHz to GHz)
 * are refused, naming the unit the number most likely meant. A number with its unit is taken as
 * written ("2us", "20Hz").
 */
import type { Unit } from './quantity.js';

const PLAIN = /^\s*[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?\s*$/;

/** The message for an implausible unit-less number, or undefined when it is plausible or has a unit. */
export function bareNumberProblem(raw: unknown, value: number, unit: Unit): string | undefined {
  const bare = typeof raw === 'number' || (typeof raw === 'string' && PLAIN.test(raw));
  if (!bare) return undefined;
  const n = String(raw).trim();
  if (unit === 's' && Math.abs(value) >= 1e-6) {
    return `has no unit, so it reads as ${n} s; a time here is ps or ns: write the unit, e.g. "${n}ps" or "${n}ns" (a unit-less time must be below 1e-6)`;
  }
  if (unit === 'Hz' && value > 0 && value < 1e3) {
    return `has no unit, so it reads as ${n} Hz; write the unit, e.g. "${n}MHz" or "${n}kHz" (a unit-less frequency must be at least 1e3; write "${n}Hz" if you mean it)`;
  }
  return undefined;
}
