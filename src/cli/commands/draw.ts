/** `phasegap draw DESIGN`: an SVG timing diagram of one corner, the worst, or all overlaid; or the margin chart. */
import { evaluateAll } from '../../analysis/evaluate.js';
import { inputError } from '../../errors.js';
import { selectCorner } from '../../analysis/corner-choice.js';
import { buildDiagram } from '../../render/diagram.js';
import { marginChartInput } from '../../render/report-model.js';
import { renderMarginSvg } from '../../render/svg/margins.js';
import { renderTimingSvg } from '../../render/svg/timing.js';
import type { Io } from '../io.js';
import { gatherProvenance } from '../provenance.js';
import { verdictOf } from '../../report/verdict.js';
import { checkReport } from '../../report/check-report.js';
import { withRunMetadata } from '../../render/svg/metadata.js';
import { loadResolved, type ModelOptions } from '../load.js';
import { checkOutput, emit, inputFiles } from '../output.js';
import { parseNets, requireOut } from '../out-options.js';
import { warnTo } from '../warn.js';

export const CHARTS = ['timing', 'margins'] as const;

export interface DrawOptions extends ModelOptions {
  readonly set: readonly string[];
  readonly corner: string;
  readonly nets: string;
  readonly chart: string;
  readonly out?: string;
}

export function runDraw(io: Io, designPath: string, options: DrawOptions): number {
  const out = requireOut(options.out, 'SVG');
  if (!(CHARTS as readonly string[]).includes(options.chart)) {
    throw inputError('option.invalid', '--chart', options.chart, `is not a chart; allowed: ${CHARTS.join(', ')}`);
  }
  const nets = parseNets(options.nets);
  const loaded = loadResolved(designPath, options.set, options, warnTo(io), io.readStdin);
  const { resolved } = loaded;
  const inputs = inputFiles(loaded, options);
  checkOutput(out, inputs);
  const results = evaluateAll(resolved);
  const verdict = verdictOf({ corners: checkReport(resolved, results), mc: null, confirm: null, hints: { montecarlo: 'run phasegap mc', simulator: 'run phasegap confirm' } });
  const record = gatherProvenance(io, loaded, { model: resolved.model.name, options });
  if (options.chart === 'margins') {
    emit(io, withRunMetadata(renderMarginSvg(marginChartInput(resolved, results)), verdict, record), out, inputs);
    return verdict.verdict === 'pass' ? 0 : 1;
  }
  const selection = selectCorner(results, options.corner, true);
  const diagram = buildDiagram(resolved, results, selection, nets);
  emit(io, withRunMetadata(renderTimingSvg(diagram), verdict, record), out, inputs);
  return diagram.verdict.pass ? 0 : 1;
}
