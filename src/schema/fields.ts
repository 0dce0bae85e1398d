/** Reusable zod field types: SI quantities with their unit, range checks with clear wording. */
import * as z from 'zod';
import { parseQuantity, parseTemperature, type Unit } from '../units/quantity.js';

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
  if (bounds.above !== undefined) parts.push(`greater than ${bounds.above}${unit}`);
  if (bounds.atLeast !== undefined) parts.push(`at least ${bounds.atLeast}${unit}`);
  if (bounds.below !== undefined) parts.push(`less than ${bounds.below}${unit}`);
  if (bounds.atMost !== undefined) parts.push(`at most ${bounds.atMost}${unit}`);
  return parts.join(' and ');
}

function outside(value: number, bounds: Bounds): boolean {
  return (bounds.above !== undefined && !(value > bounds.above))
    || (bounds.atLeast !== undefined && !(value >= bounds.atLeast))
    || (bounds.below !== undefined && !(value < bounds.below))
    || (bounds.atMost !== undefined && !(value <= bounds.atMost));
}

/** A quantity with a unit, written as "20MHz" or as a plain SI number; parsed to a number. */
export function quantity(unit: Unit, description: string, bounds: Bounds = {}) {
  const words = describeBounds(bounds, unit === 'ohm' ? ' ohm' : ` ${unit}`);
  return z
    .union([z.number(), z.string()])
    .transform((raw, ctx) => {
      const parsed = parseQuantity(raw, unit);
      if (!parsed.ok) {
        ctx.addIssue({ code: 'custom', message: parsed.allowed, input: raw });
        return z.NEVER;
      }
      if (outside(parsed.value, bounds)) {
        ctx.addIssue({ code: 'custom', message: `is out of range; it must be ${words}`, input: raw });
        return z.NEVER;
      }
      return parsed.value;
    })
    .describe(`${description} (${unit}; a number in SI units or a string like ${exampleFor(unit)})${words ? `; ${words}` : ''}`);
}

function exampleFor(unit: Unit): string {
  return { Hz: '"20MHz"', s: '"85ps"', F: '"4.7pF"', m: '"0.18um"', V: '"1.8V"', A: '"10uA"', ohm: '"500ohm"' }[unit];
}

/** A temperature in °C, as a number or "125C". */
export function temperature(description: string) {
  return z
    .union([z.number(), z.string()])
    .transform((raw, ctx) => {
      const parsed = parseTemperature(raw);
      if (!parsed.ok) {
        ctx.addIssue({ code: 'custom', message: parsed.allowed, input: raw });
        return z.NEVER;
      }
      if (parsed.value <= -273.15) {
        ctx.addIssue({ code: 'custom', message: 'is at or below absolute zero; write degrees Celsius above -273.15', input: raw });
        return z.NEVER;
      }
      return parsed.value;
    })
    .describe(`${description} (degrees Celsius, a number or a string like "125C")`);
}

/** A plain number with bounds, e.g. a duty cycle in (0, 1). */
export function ratio(description: string, bounds: Bounds) {
  const words = describeBounds(bounds, '');
  return z
    .number()
    .superRefine((value, ctx) => {
      if (!Number.isFinite(value) || outside(value, bounds)) {
        ctx.addIssue({ code: 'custom', message: `is out of range; it must be ${words}`, input: value });
      }
    })
    .describe(`${description}; ${words}`);
}
