/**
 * SI quantities as the design file writes them: "20MHz", "85ps", "4.7pF", "0.18um", "1.8V",
 * or a plain number already in SI units.
 */

/** SI prefixes and their scale; '' is no prefix. */
export const PREFIXES: Readonly<Record<string, number>> = {
  f: 1e-15,
  p: 1e-12,
  n: 1e-9,
  u: 1e-6,
  µ: 1e-6,
  μ: 1e-6,
  m: 1e-3,
  '': 1,
  k: 1e3,
  M: 1e6,
  G: 1e9,
};

/** Units a quantity field may carry, with the words used in messages. */
export const UNITS = {
  Hz: 'a frequency',
  s: 'a time',
  F: 'a capacitance',
  m: 'a length',
  V: 'a voltage',
  A: 'a current',
  ohm: 'a resistance',
} as const;
export type Unit = keyof typeof UNITS;

const NUMBER = '[-+]?(?:\\d+\\.?\\d*|\\.\\d+)(?:[eE][-+]?\\d+)?';

export type ParseResult = { ok: true; value: number } | { ok: false; allowed: string };

/**
 * Parses a quantity. A bare number string ("1e-9") is taken as SI. The unit symbol may be
 * omitted after a prefix only for lengths, where "um" style is conventional; otherwise a prefix
 * without its unit is ambiguous ("20M" could mean mega or milli) and is refused.
 */
export function parseQuantity(input: unknown, unit: Unit): ParseResult {
  const allowed = `is not ${UNITS[unit]}; write a number in SI units or a number with an optional SI prefix (f p n u m k M G) and the unit ${unitSymbol(unit)}, e.g. ${example(unit)}`;
  if (typeof input === 'number') return finiteValue(input);
  if (typeof input !== 'string') return { ok: false, allowed };
  const text = input.trim();
  const bare = new RegExp(`^${NUMBER}$`).exec(text);
  if (bare) return finiteValue(Number(text));
  const symbols = unit === 'ohm' ? '(?:ohm|Ohm|Ω)' : unit;
  const match = new RegExp(`^(${NUMBER})\\s*([fpnuµμmkMG]?)${symbols}$`).exec(text);
  if (!match) return { ok: false, allowed };
  const scale = PREFIXES[match[2] ?? ''];
  if (scale === undefined) return { ok: false, allowed };
  return finiteValue(Number(match[1]) * scale);
}

/** Words for a number too large for a double ("1e400" reads as Infinity). */
export const NOT_FINITE = 'is not a finite number; a quantity must lie within about ±1.8e308 in SI units';

function finiteValue(value: number): ParseResult {
  return Number.isFinite(value) ? { ok: true, value } : { ok: false, allowed: NOT_FINITE };
}

function unitSymbol(unit: Unit): string {
  return unit === 'ohm' ? 'ohm' : unit;
}

function example(unit: Unit): string {
  switch (unit) {
    case 'Hz':
      return '"20MHz"';
    case 's':
      return '"85ps"';
    case 'F':
      return '"4.7pF"';
    case 'm':
      return '"0.18um"';
    case 'V':
      return '"1.8V"';
    case 'A':
      return '"10uA"';
    case 'ohm':
      return '"500ohm"';
  }
}

/** Parses a temperature in °C: a number, or "125C", "-40 °C", "27degC". */
export function parseTemperature(input: unknown): ParseResult {
  const allowed = 'is not a temperature; write degrees Celsius as a number or like "125C" or "-40C"';
  if (typeof input === 'number') return finiteValue(input);
  if (typeof input !== 'string') return { ok: false, allowed };
  const match = new RegExp(`^(${NUMBER})\\s*(?:°?C|degC)?$`).exec(input.trim());
  if (!match) return { ok: false, allowed };
  return finiteValue(Number(match[1]));
}
