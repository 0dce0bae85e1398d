/**
 * The Monte Carlo part of the review page: the yield line, the corners with the least sigma
 * margin, and the dead-time histogram of the worst corner. Shared by the HTML and Markdown pages.
 */
import { mcPercent, type McReport } from '../report/mc-report.js';
import { formatPsTenths } from '../units/format.js';

export interface McSection {
  readonly report: McReport;
  /** The worst corner's dead-time histogram, SVG text. */
  readonly histogram: string;
}

const ps = formatPsTenths;

function leastSigma(c: McReport['corners'][number]): { value: number; check: string } {
  let best = { value: Infinity, check: '' };
  for (const q of c.quantities) {
    if (q.sigmaMargin !== undefined && q.sigmaMargin !== null && q.sigmaMargin < best.value) best = { value: q.sigmaMargin, check: q.name };
  }
  return best;
}

export function mcHeadline(r: McReport): string {
  const pct = mcPercent(r);
  return (
    `${r.samples} dies (seed ${r.seed}) at each of ${r.corners.length} corners: yield at every corner ${pct(r.yield.value)}` +
    ` (95 % Wilson interval ${pct(r.yield.low)} .. ${pct(r.yield.high)})${r.minYield === null ? '' : `, required ${pct(r.minYield)}`}; worst corner ${r.worstCorner}.`
  );
}

/** Rows for the corners with the lowest yield, then the least sigma margin, at most `count`. */
export function mcRows(r: McReport, count = 8): string[][] {
  const pct = mcPercent(r);
  const ranked = [...r.corners].sort((a, b) => a.yield - b.yield || leastSigma(a).value - leastSigma(b).value).slice(0, count);
  return ranked.map((c) => {
    const dead = c.quantities.filter((q) => q.kind === 'measure' && q.name.startsWith('dead '));
    const least = leastSigma(c);
    return [
      c.name,
      pct(c.yield),
      `${pct(c.yieldInterval.low)} .. ${pct(c.yieldInterval.high)}`,
      ...dead.slice(0, 2).map((d) => `${ps(d.mean)} ± ${ps(d.sigma)}`),
      Number.isFinite(least.value) ? `${least.value.toFixed(1)} (${least.check})` : '-',
      String(c.worstSample.index),
    ];
  });
}

/** Says which corners the table shows when it leaves some out; empty when it shows them all. */
export function mcShownNote(r: McReport, count = 8): string {
  if (r.corners.length <= count) return '';
  return `The table shows the ${count} of ${r.corners.length} corners with the lowest yield (then the least sigma margin); phasegap mc lists every corner.`;
}

export function mcHead(r: McReport): string[] {
  const first = r.corners[0];
  const dead = first
    ? first.quantities.filter((q) => q.kind === 'measure' && q.name.startsWith('dead ')).map((q) => `${q.name} mean ± sigma`)
    : [];
  return ['corner', 'yield', '95 % interval', ...dead.slice(0, 2), 'least sigma margin', 'worst die'];
}
