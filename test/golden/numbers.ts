/**
 * The key numbers of a demo design, pinned in `test/golden/<design>.json`: per corner the verdict,
 * dead times (50 % points and clean gaps), widths, overlap, every check margin (requirements,
 * switch constraints and bias, circuit checks) and the circuit figures, and the design's fmax.
 * Taken from the `check --json` and `fmax --json` reports, so they pin what a user reads.
 * No vitest import: `npm run golden` runs this compiled.
 */

/** A pinned value: a number (SI, as the JSON reports) or a verdict string, compared exactly. */
export type Pinned = number | string;

export interface GoldenNumbers {
  readonly design: string;
  /** The fmax report's fmax, Hz. */
  readonly fmax: number;
  /** Per corner name, its pinned values by key. */
  readonly corners: Readonly<Record<string, Readonly<Record<string, Pinned>>>>;
}

/**
 * Two numbers agree when |a - b| <= RELATIVE * |golden| + ABSOLUTE. 1e-9 relative is far below any
 * physical meaning (an attosecond on a nanosecond) and fails on any real model change, yet leaves
 * room for the last-bit differences between Node builds' Math.exp/pow; the absolute floor, in SI
 * units, lets a value that is zero in one build and 1e-30 in another agree.
 */
export const TOLERANCE = { relative: 1e-9, absolute: 1e-18 } as const;

interface CheckJson {
  kind: string;
  name: string;
  margin: number;
  phase?: string;
}
interface CornerJson {
  name: string;
  verdict: string;
  checks: CheckJson[];
  deadTimes?: { from: string; to: string; t50: number; gap: number | null }[];
  widths?: Record<string, number>;
  overlap?: number;
  circuit?: Record<string, unknown>;
}

/** The pinned numbers of one design from its `check --json` and `fmax --json` report texts. */
export function goldenNumbers(design: string, checkJson: string, fmaxJson: string): GoldenNumbers {
  const check = JSON.parse(checkJson) as { corners: CornerJson[] };
  const fmax = JSON.parse(fmaxJson) as { fmax: number };
  const corners: Record<string, Record<string, Pinned>> = {};
  for (const corner of check.corners) corners[corner.name] = cornerNumbers(corner);
  return { design, fmax: fmax.fmax, corners };
}

function cornerNumbers(corner: CornerJson): Record<string, Pinned> {
  const out: Record<string, Pinned> = { verdict: corner.verdict };
  for (const d of corner.deadTimes ?? []) {
    out[`dead ${d.from}->${d.to} t50`] = d.t50;
    if (d.gap !== null) out[`dead ${d.from}->${d.to} gap`] = d.gap;
  }
  for (const [phase, width] of Object.entries(corner.widths ?? {})) out[`width ${phase}`] = width;
  if (corner.overlap !== undefined) out.overlap = corner.overlap;
  for (const c of corner.checks) {
    const base = `margin ${c.kind}: ${c.name}${c.phase ? ` (${c.phase})` : ''}`;
    let key = base;
    for (let n = 2; Object.hasOwn(out, key); n++) key = `${base} #${n}`;
    out[key] = c.margin;
  }
  for (const [name, value] of Object.entries(corner.circuit ?? {})) {
    if (typeof value === 'number' || typeof value === 'string') out[`circuit ${name}`] = value;
  }
  return out;
}

/** Every pinned value under one flat key (`fmax`, `CORNER / KEY`). */
export function flatten(numbers: GoldenNumbers): Map<string, Pinned> {
  const flat = new Map<string, Pinned>([['fmax', numbers.fmax]]);
  for (const [corner, values] of Object.entries(numbers.corners)) {
    for (const [key, value] of Object.entries(values)) flat.set(`${corner} / ${key}`, value);
  }
  return flat;
}

/** True when `actual` agrees with `golden` within TOLERANCE (strings: equal). */
export function agrees(actual: Pinned | undefined, golden: Pinned | undefined): boolean {
  if (typeof actual === 'number' && typeof golden === 'number') {
    return Math.abs(actual - golden) <= TOLERANCE.relative * Math.abs(golden) + TOLERANCE.absolute;
  }
  return actual === golden;
}

/** One line per value that differs beyond the tolerance, appeared or disappeared: `key: golden -> actual (relative change)`. */
export function differences(actual: GoldenNumbers, golden: GoldenNumbers): string[] {
  const a = flatten(actual);
  const g = flatten(golden);
  const keys = [...new Set([...g.keys(), ...a.keys()])];
  return keys.filter((key) => !agrees(a.get(key), g.get(key))).map((key) => differenceLine(key, g.get(key), a.get(key)));
}

function differenceLine(key: string, golden: Pinned | undefined, actual: Pinned | undefined): string {
  const show = (v: Pinned | undefined): string => (v === undefined ? '(none)' : String(v));
  const change =
    typeof golden === 'number' && typeof actual === 'number' && golden !== 0
      ? ` (${(((actual - golden) / Math.abs(golden)) * 100).toPrecision(3)} %)`
      : '';
  return `${key}: ${show(golden)} -> ${show(actual)}${change}`;
}

/** The golden file's text: stable key order, one trailing newline. */
export function goldenText(numbers: GoldenNumbers): string {
  return `${JSON.stringify(numbers, null, 2)}\n`;
}
