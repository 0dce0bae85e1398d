/** The text report of `phasegap fmax`: the highest safe clock, what limits it, the margins beside it and a verdict. */
import type { FmaxResult } from '../analysis/fmax.js';
import { CAUTIONS } from './cautions.js';
import { formatMargin } from './margin-format.js';
import { formatEngineering } from '../units/format.js';

/** Whether the design clock is at or below fmax (the run's verdict). */
export function fmaxPasses(result: FmaxResult): boolean {
  return result.fmax !== null && result.fmax >= result.designFrequency;
}

export function renderFmaxText(designName: string, result: FmaxResult): string {
  const ok = fmaxPasses(result);
  const lines: string[] = [];
  const lim = result.limiting;
  if (result.fmax === null) {
    lines.push(`${designName}: no safe clock frequency (${result.note})`);
  } else {
    lines.push(
      `${designName}: fmax ${formatEngineering(result.fmax, 'Hz', 4)} (resolution ${(result.resolution * 100).toPrecision(2)} %), design clock ${formatEngineering(result.designFrequency, 'Hz', 4)}, ${(result.fmax / result.designFrequency).toFixed(2)}x headroom`,
    );
    if (result.note) lines.push(`note: ${result.note}`);
  }
  if (lim) {
    const where = result.fmax === null ? 'fails at the design clock' : 'limited by';
    lines.push(`${where}: ${lim.check} (${lim.kind}) at ${lim.corner}`);
    lines.push(...fmaxMarginLines(result));
  }
  lines.push(`verdict: ${ok ? 'PASS' : 'FAIL'} (the design clock ${ok ? 'is at or below' : 'is above'} fmax)`);
  lines.push(`${result.evaluations} corner evaluations`);
  lines.push('', ...CAUTIONS.map((c) => `caution: ${c}`));
  return `${lines.join('\n')}\n`;
}

/**
 * The margins beside the verdict, each with the frequency it belongs to: the least margin at fmax
 * (where every check passes) and the limiting check's margin at the failing probe just above it.
 */
export function fmaxMarginLines(result: FmaxResult): string[] {
  const lines: string[] = [];
  const at = result.atFmax;
  if (result.fmax !== null && at && at.margin !== null) {
    const same = result.limiting !== null && at.check === result.limiting.check && at.corner === result.limiting.corner;
    lines.push(
      `  margin at fmax ${formatEngineering(result.fmax, 'Hz', 4)}: ${formatMargin(at.margin, at.kind)}${same ? '' : ` (${at.check} at ${at.corner})`}`,
    );
  }
  const lim = result.limiting;
  if (lim && lim.margin !== null && result.probeFrequency !== null && result.probeFrequency !== undefined) {
    const above =
      result.fmax === null
        ? 'the design clock'
        : `the first failing probe, ${((result.probeFrequency / result.fmax - 1) * 100).toFixed(2)} % above fmax`;
    lines.push(`  margin at ${formatEngineering(result.probeFrequency, 'Hz', 4)} (${above}): ${formatMargin(lim.margin, lim.kind)}`);
  }
  return lines;
}
