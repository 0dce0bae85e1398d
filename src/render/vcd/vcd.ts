/**
 * IEEE Std 1364-2005 clause 18 Value Change Dump: a header ($timescale, one $scope per
 * generator with nested scopes, $var wire 1 <id> <name>), $dumpvars at #0, then strictly
 * increasing #<time> markers each followed by the scalar changes at that time ("1!", no space).
 */

export const TIMESCALES = { '1fs': 1e-15, '10fs': 1e-14 } as const;
export type Timescale = keyof typeof TIMESCALES;

export interface VcdChange {
  /** s from the start of the dump. */
  readonly time: number;
  readonly value: 0 | 1;
}

export interface VcdSignal {
  /** Scope path below the top scope ([] for the top scope itself). */
  readonly scope: readonly string[];
  readonly name: string;
  /** Value at time 0. */
  readonly initial: 0 | 1;
  /** Changes after time 0, in time order. */
  readonly changes: readonly VcdChange[];
}

export interface VcdDocument {
  readonly top: string;
  readonly comment: string;
  readonly version: string;
  readonly timescale: Timescale;
  /** End of the dump, s: a final time marker so the last change has a duration. */
  readonly end: number;
  readonly signals: readonly VcdSignal[];
}

/** Identifier codes from printable ASCII 33..126, shortest first: !, ", ..., ~, !!, "!, ... */
export function identifier(index: number): string {
  let n = index;
  let out = '';
  do {
    out += String.fromCharCode(33 + (n % 94));
    n = Math.floor(n / 94) - 1;
  } while (n >= 0);
  return out;
}

/**
 * A VCD reference name: letters, digits and _ only; anything else becomes _. IEEE 1364 allows `$`
 * after the first character, but readers split `a$end` (sigrok-cli reads it as `a`).
 */
export function vcdName(name: string): string {
  const clean = name.replace(/[^A-Za-z0-9_]/g, '_');
  return /^[A-Za-z_]/.test(clean) ? clean : `_${clean}`;
}

/**
 * Text inside a `$comment` or `$version` section, which only `$end` closes: printable ASCII on
 * one line with no `$` at all (removing one `$end` from `$$end` would leave another).
 */
export function vcdText(text: string): string {
  return text
    .replace(/[\t\n\r\v\f\u2028\u2029]/g, ' ')
    .replace(/[^\x20-\x7e]/gu, '?')
    .replace(/\$/g, '_');
}

/** Time in timescale units, rounded to the nearest unit. */
export function ticks(seconds: number, timescale: Timescale): number {
  return Math.round(seconds / TIMESCALES[timescale]);
}

export function renderVcd(doc: VcdDocument): string {
  const lines: string[] = [];
  lines.push('$comment', `  ${vcdText(doc.comment)}`, '$end');
  lines.push(`$version ${vcdText(doc.version)} $end`);
  lines.push(`$timescale ${doc.timescale.replace('fs', ' fs')} $end`);
  const ids = doc.signals.map((_, i) => identifier(i));
  lines.push(...declarations(doc, ids));
  lines.push('$enddefinitions $end');
  lines.push('#0', '$dumpvars', ...doc.signals.map((s, i) => `${s.initial}${ids[i]}`), '$end');
  const byTime = new Map<number, string[]>();
  const last = ticks(doc.end, doc.timescale);
  doc.signals.forEach((s, i) => {
    let value = s.initial;
    for (const c of s.changes) {
      const t = ticks(c.time, doc.timescale);
      if (t <= 0 || t >= last || c.value === value) continue;
      value = c.value;
      const list = byTime.get(t) ?? [];
      list.push(`${c.value}${ids[i]}`);
      byTime.set(t, list);
    }
  });
  for (const t of [...byTime.keys()].sort((a, b) => a - b)) lines.push(`#${t}`, ...byTime.get(t)!);
  lines.push(`#${last}`);
  return `${lines.join('\n')}\n`;
}

function declarations(doc: VcdDocument, ids: readonly string[]): string[] {
  const out: string[] = [`$scope module ${vcdName(doc.top)} $end`];
  let open: string[] = [];
  const order = doc.signals
    .map((s, i) => ({ s, i }))
    .sort((a, b) => a.s.scope.join('\u0000').localeCompare(b.s.scope.join('\u0000')) || a.i - b.i);
  const used = new Set<string>();
  for (const { s, i } of order) {
    let common = 0;
    while (common < open.length && common < s.scope.length && open[common] === s.scope[common]) common++;
    for (let k = open.length; k > common; k--) out.push('$upscope $end');
    for (let k = common; k < s.scope.length; k++) out.push(`$scope module ${vcdName(s.scope[k]!)} $end`);
    open = [...s.scope];
    let name = vcdName(s.name);
    const key = () => `${s.scope.join('.')}.${name}`;
    for (let n = 2; used.has(key()); n++) name = `${vcdName(s.name)}_${n}`;
    used.add(key());
    out.push(`$var wire 1 ${ids[i]} ${name} $end`);
  }
  for (let k = open.length; k > 0; k--) out.push('$upscope $end');
  out.push('$upscope $end');
  return out;
}
