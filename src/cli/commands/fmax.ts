/** `phasegap fmax DESIGN`: the highest safe clock frequency and what limits it. */
import { findFmax } from '../../analysis/fmax.js';
import { formatMargin } from '../../report/margin-format.js';
import type { FmaxResult } from '../../analysis/fmax.js';
import { CAUTIONS } from '../../report/cautions.js';
import { formatEngineering } from '../../units/format.js';
import { inputError } from '../../errors.js';
import type { Io } from '../io.js';
import { loadResolved, type ModelOptions } from '../load.js';
import { checkOutput, emit, inputFiles, toJson } from '../output.js';
import { relativeNumber } from '../options.js';
import { MAX_FMAX_RESOLUTION, MIN_FMAX_RESOLUTION } from '../run-limits.js';
import { warnTo } from '../warn.js';

export interface FmaxCommandOptions extends ModelOptions {
  readonly set: readonly string[];
  readonly json: boolean;
  readonly out?: string;
  readonly resolution?: string;
}

function parseResolution(text: string | undefined): number | undefined {
  if (text === undefined) return undefined;
  const value = relativeNumber(text);
  if (!(value >= MIN_FMAX_RESOLUTION && value < MAX_FMAX_RESOLUTION)) {
    throw inputError('option.invalid', '--resolution', text, `must be a relative step from ${MIN_FMAX_RESOLUTION} up to (not including) ${MAX_FMAX_RESOLUTION}, e.g. 0.001 or 0.1%`);
  }
  return value;
}

export function runFmax(io: Io, designPath: string, options: FmaxCommandOptions): number {
  const loaded = loadResolved(designPath, options.set, options, warnTo(io), io.readStdin);
  const { design, resolved } = loaded;
  const inputs = inputFiles(loaded, options);
  checkOutput(options.out, inputs);
  const result = findFmax(resolved, { resolution: parseResolution(options.resolution) });
  const ok = result.fmax !== null && result.fmax >= result.designFrequency;
  if (options.json) {
    emit(io, toJson({ tool: 'phasegap', design: design.name, ...result, verdict: ok ? 'pass' : 'fail', cautions: CAUTIONS }), options.out, inputs);
    return ok ? 0 : 1;
  }
  const lines: string[] = [];
  const lim = result.limiting;
  if (result.fmax === null) {
    lines.push(`${design.name}: no safe clock frequency (${result.note})`);
  } else {
    lines.push(`${design.name}: fmax ${formatEngineering(result.fmax, 'Hz', 4)} (resolution ${(result.resolution * 100).toPrecision(2)} %), design clock ${formatEngineering(result.designFrequency, 'Hz', 4)}, ${(result.fmax / result.designFrequency).toFixed(2)}x headroom`);
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
  emit(io, `${lines.join('\n')}\n`, options.out, inputs);
  return ok ? 0 : 1;
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
    lines.push(`  margin at fmax ${formatEngineering(result.fmax, 'Hz', 4)}: ${formatMargin(at.margin, at.kind)}${same ? '' : ` (${at.check} at ${at.corner})`}`);
  }
  const lim = result.limiting;
  if (lim && lim.margin !== null && result.probeFrequency !== null && result.probeFrequency !== undefined) {
    const above = result.fmax === null ? 'the design clock' : `the first failing probe, ${((result.probeFrequency / result.fmax - 1) * 100).toFixed(2)} % above fmax`;
    lines.push(`  margin at ${formatEngineering(result.probeFrequency, 'Hz', 4)} (${above}): ${formatMargin(lim.margin, lim.kind)}`);
  }
  return lines;
}
