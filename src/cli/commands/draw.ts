/** `phasegap draw DESIGN`: an SVG timing diagram of one corner, the worst, or all overlaid; or the margin chart. */
import { evaluateAll } from '../../analysis/evaluate.js';
import { inputError } from '../../errors.js';
import { selectCorner } from '../../analysis/corner-choice.js';
import type { Io } from '../io.js';
import { gatherProvenance } from '../provenance.js';
import { verdictOf } from '../../report/verdict.js';
import { checkReport } from '../../report/check-report.js';
import { loadResolved } from '../load.js';
import { checkOutput, emit, inputFiles } from '../output.js';
import { parseNets, requireOut } from '../out-options.js';
import { warnTo } from '../warn.js';
import { defineCommand, parsedOption, textOption, type CommandOptions } from '../command.js';
import { DESIGN_ARGUMENT, SET_OPTION, outOption } from '../common-options.js';

export const CHARTS = ['timing', 'margins'] as const;

function parseChart(text: string, flag: string): (typeof CHARTS)[number] {
  if (!(CHARTS as readonly string[]).includes(text))
    throw inputError('option.invalid', [flag], text, `is not a chart; allowed: ${CHARTS.join(', ')}`);
  return text as (typeof CHARTS)[number];
}

const OPTIONS = {
  set: SET_OPTION,
  corner: textOption('--corner <NAME>', "a corner name like ss/1.62V/125C, 'worst' (the corner of the limiting check) or 'all'", {
    default: 'worst',
  }),
  nets: parsedOption('--nets <WHICH>', "'phases' (clock, phases, complements, early phases) or 'all' (every internal net too)", parseNets, {
    default: 'phases',
  }),
  chart: parsedOption('--chart <KIND>', "'timing' (waveforms) or 'margins' (every check's margin at every corner)", parseChart, {
    default: 'timing',
  }),
  out: outOption('the SVG'),
} as const;

export const drawCommand = defineCommand({
  name: 'draw',
  description: 'SVG timing diagram of a corner (or worst, or all overlaid as edge envelopes), or the margin chart',
  arguments: [DESIGN_ARGUMENT],
  options: OPTIONS,
  run: (io, [design], options) => runDraw(io, design, options),
});

export async function runDraw(io: Io, designPath: string, options: CommandOptions<typeof OPTIONS>): Promise<number> {
  const out = requireOut(options.out, 'SVG');
  const nets = options.nets;
  // The SVG stack loads only when a drawing is made.
  const { buildDiagram } = await import('../../render/diagram.js');
  const { marginChartInput } = await import('../../render/report-model.js');
  const { renderMarginSvg } = await import('../../render/svg/margins.js');
  const { renderTimingSvg } = await import('../../render/svg/timing.js');
  const { withRunMetadata } = await import('../../render/svg/metadata.js');
  const loaded = loadResolved(designPath, options.set, options, warnTo(io), io.readStdin);
  const { resolved } = loaded;
  const inputs = inputFiles(loaded, options);
  checkOutput(out, inputs);
  const results = evaluateAll(resolved);
  const verdict = verdictOf({
    corners: checkReport(resolved, results),
    mc: null,
    confirm: null,
    hints: { montecarlo: 'run phasegap mc', simulator: 'run phasegap confirm' },
  });
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
