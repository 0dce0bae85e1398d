/** Reusable zod field types: SI quantities with their unit, range checks with clear wording. */
import * as z from 'zod';
import { formatEngineering } from '../units/format.js';
import { NOT_FINITE, parseQuantity, parseTemperature, type Unit } from '../units/quantity.js';
import { bareNumberProblem } from '../units/bare-number.js';

/**
 * Largest magnitude a quantity of each unit may have where its field sets no upper bound: far
 * beyond any on-chip clock generator, and far enough below the double range that products and
 * sums of them stay finite.
 */
export const PLAUSIBLE: Readonly<Record<Unit, number>> = {
  // the clock is checked against 1 Hz .. 100 GHz; no time within a period can exceed 1 s
  Hz: 100e9,
  s: 1,
  F: 1e-3,
  m: 1,
  V: 1000,
  A: 1000,
  ohm: 1e12,
};

/**
 * Junction temperatures accepted, °C. The device models (alpha-power drive, linear Vth(T),
 * mobility power law) are fitted for the junction ratings in use; common practice for
 * industrial and automotive parts is -40 .. 150 °C, and this range covers it with margin.
 */
export const TEMPERATURE_RANGE = { min: -60, max: 200 } as const;

/** Numbers, with Infinity and NaN (a YAML 1e400 or .inf) refused in words rather than as a type. */
const number = () => z.number({ error: (issue) => (typeof issue.input === 'number' ? NOT_FINITE : undefined) });
const text = () => z.string({ error: (issue) => (typeof issue.input === 'number' ? NOT_FINITE : undefined) });

interface Bounds {
  /** Exclusive lower bound. */
  readonly above?: number;
  /** Inclusive lower bound. */
  readonly atLeast?: number;
  /** Exclusive upper bound. */
  readonly below?: number;
  /** Inclusive upper bound. */
  readonly atMost?: number;
}

function describeBounds(bounds: Bounds, unit: string): string {
  const parts: string[] = [];
  const show = (x: number) => boundText(x, unit);
  if (bounds.above !== undefined) parts.push(`greater than ${show(bounds.above)}`);
  if (bounds.atLeast !== undefined) parts.push(`at least ${show(bounds.atLeast)}`);
  if (bounds.below !== undefined) parts.push(`less than ${show(bounds.below)}`);
  if (bounds.atMost !== undefined) parts.push(`at most ${show(bounds.atMost)}`);
  return parts.join(' and ');
}

/** A bound as people read it: "0 Hz", "1.5 V", and with an SI prefix when large or small ("100 GHz", "1 mF"). */
function boundText(x: number, unit: string): string {
  const magnitude = Math.abs(x);
  if (unit === '' || magnitude === 0 || (magnitude >= 1e-3 && magnitude < 1e4)) return `${x}${unit}`;
  return formatEngineering(x, unit.trim())
    .replace(/(\.\d*?)0+ /, '$1 ')
    .replace('. ', ' ');
}

function outside(value: number, bounds: Bounds): boolean {
  return (
    (bounds.above !== undefined && !(value > bounds.above)) ||
    (bounds.atLeast !== undefined && !(value >= bounds.atLeast)) ||
    (bounds.below !== undefined && !(value < bounds.below)) ||
    (bounds.atMost !== undefined && !(value <= bounds.atMost))
  );
}

/** A quantity with a unit, written as "20MHz" or as a plain SI number; parsed to a number. */
export function quantity(unit: Unit, description: string, given: Bounds = {}) {
  const bounds = plausible(given, unit);
  const words = describeBounds(bounds, unit === 'ohm' ? ' ohm' : ` ${unit}`);
  return z
    .union([number(), text()])
    .transform((raw, ctx) => {
      const parsed = parseQuantity(raw, unit);
      if (!parsed.ok) {
        ctx.addIssue({ code: 'custom', message: parsed.allowed, input: raw });
        return z.NEVER;
      }
      const bare = bareNumberProblem(raw, parsed.value, unit);
      if (outside(parsed.value, bounds)) {
        ctx.addIssue({
          code: 'custom',
          message: `is out of range; it must be ${words}${bare === undefined ? '' : `; it ${bare}`}`,
          input: raw,
          params: { code: 'value.out-of-range' },
        });
        return z.NEVER;
      }
      if (bare !== undefined) {
        ctx.addIssue({ code: 'custom', message: bare, input: raw });
        return z.NEVER;
      }
      return parsed.value;
    })
    .describe(`${description} (${unit}; a number in SI units or a string like ${exampleFor(unit)})${words ? `; ${words}` : ''}`);
}

/** Adds the unit's plausible ceiling (and, for signed fields, floor) where a field sets none. */
function plausible(bounds: Bounds, unit: Unit): Bounds {
  const limit = PLAUSIBLE[unit];
  const upper = bounds.below === undefined && bounds.atMost === undefined ? { atMost: limit } : {};
  const lower = bounds.above === undefined && bounds.atLeast === undefined ? { atLeast: -limit } : {};
  return { ...lower, ...bounds, ...upper };
}

function exampleFor(unit: Unit): string {
  return { Hz: '"20MHz"', s: '"85ps"', F: '"4.7pF"', m: '"0.18um"', V: '"1.8V"', A: '"10uA"', ohm: '"500ohm"' }[unit];
}

/** A temperature in °C, as a number or "125C", within TEMPERATURE_RANGE. */
export function temperature(description: string) {
  const { min, max } = TEMPERATURE_RANGE;
  return z
    .union([number(), text()])
    .transform((raw, ctx) => {
      const parsed = parseTemperature(raw);
      if (!parsed.ok) {
        ctx.addIssue({ code: 'custom', message: parsed.allowed, input: raw });
        return z.NEVER;
      }
      if (!(parsed.value >= min && parsed.value <= max)) {
        ctx.addIssue({
          code: 'custom',
          message: `is outside the temperatures the device models cover; write degrees Celsius from ${min} to ${max}`,
          input: raw,
        });
        return z.NEVER;
      }
      return parsed.value;
    })
    .describe(`${description} (degrees Celsius, a number or a string like "125C"); from ${min} to ${max}`);
}

/** A plain number with bounds, e.g. a duty cycle in (0, 1). */
export function ratio(description: string, bounds: Bounds) {
  const words = describeBounds(bounds, '');
  return number()
    .superRefine((value, ctx) => {
      if (!Number.isFinite(value) || outside(value, bounds)) {
        ctx.addIssue({
          code: 'custom',
          message: `is out of range; it must be ${words}`,
          input: value,
          params: { code: 'value.out-of-range' },
        });
      }
    })
    .describe(`${description}; ${words}`);
}
