/** The Monte Carlo report: plain data for --json, and its table for people. */
import { min } from 'd3-array';
import type { McResult, McCornerReport } from '../analysis/montecarlo.js';
import { histogramQuantile, type StreamingHistogram } from '../variation/histogram.js';
import { CAUTIONS } from './cautions.js';
import { formatMargin, formatSpread } from './margin-format.js';
import { left, right, renderTable } from './text-table.js';
import { psTenthsNumber } from '../units/format.js';
import { shellCommand } from './shell-quote.js';
import { formatPercent, percentDecimals } from '../units/format.js';

/**
 * Quantiles reported for the dead times: the ±3 sigma tails and the median, from each corner's
 * streaming histogram (error at most one bin width, see variation/histogram.ts).
 */
export const QUANTILES = [0.00135, 0.5, 0.99865] as const;

export interface McReport {
  readonly tool: 'phasegap';
  readonly design: string;
  readonly process: string;
  /** Delay model the dies were evaluated with. */
  readonly model: string;
  readonly samples: number;
  readonly seed: number;
  readonly minYield: number | null;
  /** Fraction of dies passing at every corner, with its 95 % Wilson interval. */
  readonly yield: { readonly value: number; readonly low: number; readonly high: number };
  readonly verdict: 'pass' | 'fail';
  /** Corner with the lowest yield, then the least sigma margin. */
  readonly worstCorner: string;
  readonly corners: ReadonlyArray<McCornerReport & { readonly deadTimeQuantiles: ReadonlyArray<Readonly<Record<string, number>>> }>;
  readonly cautions: readonly string[];
}

function quantiles(h: StreamingHistogram): Record<string, number> {
  const out: Record<string, number> = {};
  for (const q of QUANTILES) out[`q${q}`] = histogramQuantile(h, q);
  return out;
}

function leastSigma(c: McCornerReport): number {
  return min(c.quantities, (q) => q.sigmaMargin) ?? Infinity;
}

/**
 * The one yield rule of every command: the yield must reach requirements.minYield; without one,
 * every drawn die must pass at every corner (as every corner must pass in check), so a design
 * that accepts losing dies says how many.
 */
export function yieldMeets(value: number, minYield: number | undefined | null): boolean {
  return minYield === undefined || minYield === null ? value === 1 : value >= minYield;
}

export function mcReport(design: string, process: string, mc: McResult, minYield: number | undefined, model = 'analytic'): McReport {
  const corners = mc.corners.map((c, i) => ({ ...c, deadTimeQuantiles: mc.deadTimes[i]!.map(quantiles) }));
  let worst = corners[0]!;
  for (const c of corners) {
    if (c.yield < worst.yield || (c.yield === worst.yield && leastSigma(c) < leastSigma(worst))) worst = c;
  }
  const pass = yieldMeets(mc.yieldEverywhere, minYield);
  return {
    tool: 'phasegap',
    design,
    process,
    model,
    samples: mc.samples,
    seed: mc.seed,
    minYield: minYield ?? null,
    yield: { value: mc.yieldEverywhere, ...mc.yieldEverywhereInterval },
    verdict: pass ? 'pass' : 'fail',
    worstCorner: worst.name,
    corners,
    cautions: CAUTIONS,
  };
}

const ps = psTenthsNumber;

/**
 * `invocation`: the words that rerun this analysis (program, command, design path, --set and model
 * options); the replay hint adds the seed and the worst die to them.
 */
/**
 * Percent formatting for everything a Monte Carlo report shows (its text, the review page's
 * section, the verdict line): one precision, fine enough that no yield short of 100 % reads as 100 %.
 */
export function mcPercent(r: McReport): (fraction: number) => string {
  const decimals = percentDecimals([
    r.yield.value,
    r.yield.low,
    r.yield.high,
    ...(r.minYield === null ? [] : [r.minYield]),
    ...r.corners.flatMap((c) => [c.yield, c.yieldInterval.low, c.yieldInterval.high]),
  ]);
  return (x) => formatPercent(x, decimals);
}

export function renderMcText(r: McReport, invocation: readonly string[] = ['phasegap', 'mc', 'DESIGN']): string {
  const lines: string[] = [];
  const pct = mcPercent(r);
  lines.push(
    `${r.design}: Monte Carlo mismatch on ${r.process} (${r.model} model), ${r.samples} dies x ${r.corners.length} corners, seed ${r.seed}`,
  );
  lines.push('');
  const dead = (c: McCornerReport, k: number) => c.quantities.find((q) => q.kind === 'measure' && q.name.startsWith('dead ') && k-- === 0);
  const rows = r.corners.map((c) => {
    const d0 = dead(c, 0);
    const d1 = dead(c, 1);
    const sigma = leastSigma(c);
    return [
      c.name,
      pct(c.yield),
      `${pct(c.yieldInterval.low)} .. ${pct(c.yieldInterval.high)}`,
      d0 ? `${ps(d0.mean)} / ${ps(d0.sigma)}` : '-',
      d0 ? ps(d0.min) : '-',
      d1 ? `${ps(d1.mean)} / ${ps(d1.sigma)}` : '-',
      d1 ? ps(d1.min) : '-',
      Number.isFinite(sigma) ? sigma.toFixed(1) : '-',
      String(c.worstSample.index),
    ];
  });
  const first = r.corners[0];
  const deadNames = first ? first.quantities.filter((q) => q.kind === 'measure' && q.name.startsWith('dead ')).map((q) => q.name) : [];
  lines.push(
    renderTable(
      [
        left('corner'),
        right('yield'),
        right('95 % interval'),
        right(`${deadNames[0] ?? 'dead'} mean/sigma ps`),
        right('min ps'),
        right(`${deadNames[1] ?? 'dead'} mean/sigma ps`),
        right('min ps'),
        right('least sigma margin'),
        right('worst die'),
      ],
      rows,
    ),
  );
  const worst = r.corners.find((c) => c.name === r.worstCorner)!;
  lines.push('');
  lines.push(`checks at the worst corner ${worst.name} (sigma margin = mean margin / sigma):`);
  const checkRows = worst.quantities
    .filter((q) => q.kind !== 'measure')
    .map((q) => [
      q.kind,
      q.name,
      formatMargin(q.mean, q.kind, '-'),
      formatSpread(q.sigma, q.kind),
      formatMargin(q.min, q.kind, '-'),
      q.sigmaMargin === null || q.sigmaMargin === undefined ? '-' : q.sigmaMargin.toFixed(1),
      String(q.failures ?? 0),
    ]);
  lines.push(
    renderTable(
      [left('kind'), left('check'), right('mean margin'), right('sigma'), right('worst'), right('sigma margin'), right('failing dies')],
      checkRows,
    ),
  );
  lines.push('');
  lines.push(
    `yield at every corner: ${pct(r.yield.value)} (95 % Wilson interval ${pct(r.yield.low)} .. ${pct(r.yield.high)})${r.minYield === null ? '' : `, required ${pct(r.minYield)}`}`,
  );
  lines.push(
    `replay the worst die: ${shellCommand([...invocation, '--seed', String(r.seed), '--replay', String(worst.worstSample.index)])}`,
  );
  lines.push(`verdict: ${r.verdict === 'pass' ? 'PASS' : 'FAIL'}`);
  lines.push('', ...r.cautions.map((c) => `caution: ${c}`));
  return `${lines.join('\n')}\n`;
}
