/** Formatting of SI numbers for people; only the output edge calls these. */

/** The SI prefixes from giga to femto, largest first (micro written u): the one table every unit label is chosen from. */
export const SI_PREFIXES: ReadonlyArray<readonly [number, string]> = [
  [1e9, 'G'],
  [1e6, 'M'],
  [1e3, 'k'],
  [1, ''],
  [1e-3, 'm'],
  [1e-6, 'u'],
  [1e-9, 'n'],
  [1e-12, 'p'],
  [1e-15, 'f'],
];

/** `unit` with each prefix from `largest` down to `smallest` (scales of SI_PREFIXES): [[1e-9, 'ns'], [1e-12, 'ps']]. */
export function prefixedUnits(unit: string, largest: number, smallest: number): ReadonlyArray<readonly [number, string]> {
  return SI_PREFIXES.filter(([scale]) => scale <= largest && scale >= smallest).map(
    ([scale, prefix]) => [scale, `${prefix}${unit}`] as const,
  );
}

/** The prefixed unit for a magnitude: the largest of `units` (largest first) it reaches, else the smallest. */
export function unitFor(magnitude: number, units: ReadonlyArray<readonly [number, string]>): readonly [number, string] {
  return units.find(([scale]) => magnitude >= scale) ?? units[units.length - 1]!;
}

/** Formats a time with an engineering prefix chosen for the magnitude: 812 ps, 1.23 ns, 25.0 ns. */
export function formatTime(seconds: number, digits = 3): string {
  return formatEngineering(seconds, 's', digits);
}

export function formatEngineering(value: number, unit: string, digits = 3): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return `0 ${unit}`;
  const [scale, prefix] = prefixOf(value);
  return `${trimNumber(value / scale, digits)} ${prefix}${unit}`;
}

/** The SI prefix formatEngineering writes a value with: the largest it reaches (to rounding), else femto. */
function prefixOf(value: number): readonly [number, string] {
  const magnitude = Math.abs(value);
  return SI_PREFIXES.find(([scale]) => magnitude >= scale * 0.9995) ?? SI_PREFIXES[SI_PREFIXES.length - 1]!;
}

/**
 * A value a design states (a requirement, a guard), in as few significant digits from 3 to 6 as
 * give it back: 500 ps, 979.5 ps, 12.25 ps, so a check's name never rounds its own limit.
 */
export function formatStated(value: number, unit: string): string {
  const [scale] = prefixOf(value);
  for (let digits = 3; digits < 6; digits++) {
    const text = formatEngineering(value, unit, digits);
    if (Math.abs(Number.parseFloat(text) * scale - value) <= 1e-9 * Math.abs(value)) return text;
  }
  return formatEngineering(value, unit, 6);
}

/** Fixed number of significant digits, but never exponent notation. */
function trimNumber(value: number, digits: number): string {
  const magnitude = Math.abs(value);
  const decimals = magnitude >= 100 ? Math.max(0, digits - 3) : magnitude >= 10 ? Math.max(0, digits - 2) : Math.max(0, digits - 1);
  return value.toFixed(decimals);
}

/**
 * A margin with its sign always shown: +316 ps, -1.20 ns; never in fs (+0.53 ps, a timing model is
 * not that fine); `fallback` for a missing or infinite value.
 */
export function formatSignedTime(seconds: number | null, fallback = 'n/a'): string {
  if (seconds === null || !Number.isFinite(seconds)) return fallback;
  const magnitude = Math.abs(seconds);
  const text = magnitude < 0.9995e-12 ? `${(magnitude * 1e12).toFixed(2)} ps` : formatTime(magnitude);
  return `${seconds < 0 ? '-' : '+'}${text}`;
}

/** A time for labels: whole ps below 10 ns (972 ps, 9999 ps), else ns with two decimals (14.10 ns). */
export function formatPs(seconds: number): string {
  if (Number.isFinite(seconds) && Math.abs(seconds) >= 9.9995e-9) return formatNs(seconds);
  return `${Math.round(seconds * 1e12)} ps`;
}

/** Nanoseconds with two decimals, bare for a table column: 14.10. */
export function nsNumber(seconds: number): string {
  return (seconds * 1e9).toFixed(2);
}

/** Nanoseconds with two decimals and the unit: 14.10 ns. */
export function formatNs(seconds: number): string {
  return `${nsNumber(seconds)} ns`;
}

/** A fraction as a percentage with `decimals` digits: 0.958 -> "95.8 %". */
export function formatPercent(fraction: number, decimals: number): string {
  return `${(fraction * 100).toFixed(decimals)} %`;
}

/**
 * The one number of decimals a table of fractions is printed with: enough that no value other
 * than exactly 0 or 1 rounds to 0 % or 100 %, at least `least`, at most 4.
 */
export function percentDecimals(fractions: readonly number[], least = 1): number {
  let decimals = least;
  for (const f of fractions) {
    if (!Number.isFinite(f) || f <= 0 || f >= 1) continue;
    while (decimals < 4 && ((f * 100).toFixed(decimals) === (100).toFixed(decimals) || Number((f * 100).toFixed(decimals)) === 0))
      decimals++;
  }
  return decimals;
}

/** Supply in corner names: 1.62V, 1.8V, 0.9V (up to 3 decimals, trailing zeros dropped). */
export function formatVolts(volts: number): string {
  return `${Number(volts.toFixed(3))}V`;
}

/** Temperature in corner names: -40C, 27C, 125C. */
export function formatCelsius(celsius: number): string {
  return `${Number(celsius.toFixed(2))}C`;
}

/** Time in whole picoseconds, the number alone (a column headed "ps"). */
export function psNumber(seconds: number): string {
  return `${Math.round(seconds * 1e12)}`;
}

/** formatPs with the sign always shown: +12 ps, -3 ps (a value that rounds to zero is +0 ps). */
export function formatSignedPs(seconds: number): string {
  const ps = Math.round(seconds * 1e12);
  return `${ps >= 0 ? '+' : '-'}${Math.abs(ps)} ps`;
}

/** Time in picoseconds to one decimal, the number alone: 812.4; '-' when not finite. */
export function psTenthsNumber(seconds: number): string {
  return Number.isFinite(seconds) ? `${(seconds * 1e12).toFixed(1)}` : '-';
}

/** Time in picoseconds to one decimal: 812.4 ps; '-' when not finite. */
export function formatPsTenths(seconds: number): string {
  return Number.isFinite(seconds) ? `${(seconds * 1e12).toFixed(1)} ps` : '-';
}

/** Time to the nearest 0.1 ps without a trailing .0: 12 ps, 12.5 ps. */
export function formatPsShort(seconds: number): string {
  return `${Math.round(seconds * 1e13) / 10} ps`;
}

/** A signed time in ps below 1 ns, else ns or us to three or four figures: +850 ps, -1.25 ns, +12.3 ns, +1.50 us. */
export function formatSignedTimeShort(seconds: number): string {
  const a = Math.abs(seconds);
  const ps = a * 1e12;
  const text =
    ps < 1000 ? `${Math.round(ps)} ps` : ps < 1e6 ? `${(ps / 1000).toFixed(ps < 1e4 ? 2 : 1)} ns` : `${(ps / 1e6).toFixed(2)} us`;
  return `${seconds < 0 ? '-' : '+'}${text}`;
}
