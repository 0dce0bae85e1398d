/** `phasegap waves DESIGN --corner NAME`: the corner's steady-state waveforms as an IEEE 1364 VCD file. */
import { evaluateAll } from '../../analysis/evaluate.js';
import { inputError } from '../../errors.js';
import { selectCorner } from '../../analysis/corner-choice.js';
import { vcdSignals } from '../../render/vcd/signals.js';
import { renderVcd, TIMESCALES, type Timescale } from '../../render/vcd/vcd.js';
import type { Io } from '../io.js';
import { gatherProvenance } from '../provenance.js';
import { provenanceLines } from '../../report/provenance.js';
import { VERSION } from '../version.js';
import { loadResolved } from '../load.js';
import { checkOutput, emit, inputFiles } from '../output.js';
import { wholeNumberIn } from '../options.js';
import { MAX_VCD_PERIODS } from '../run-limits.js';
import { parseNets, requireOut } from '../out-options.js';
import { warnTo } from '../warn.js';
import { defineCommand, parsedOption, textOption, type CommandOptions } from '../command.js';
import { DESIGN_ARGUMENT, SET_OPTION, outOption } from '../common-options.js';

function parseTimescale(text: string, flag: string): Timescale {
  const allowed = Object.keys(TIMESCALES);
  if (!allowed.includes(text)) throw inputError('option.invalid', [flag], text, `is not offered; allowed: ${allowed.join(', ')}`);
  return text as Timescale;
}

const OPTIONS = {
  set: SET_OPTION,
  corner: textOption('--corner <NAME>', "a corner name like ss/1.62V/125C or 'worst'", { default: 'worst' }),
  nets: parsedOption('--nets <WHICH>', "'phases' or 'all' (internal nets in scope internal)", parseNets, { default: 'phases' }),
  timescale: parsedOption('--timescale <UNIT>', "'1fs' or '10fs'", parseTimescale, { default: '1fs' }),
  periods: parsedOption('--periods <N>', 'clock periods to dump', wholeNumberIn({ min: 1, max: MAX_VCD_PERIODS, noun: 'clock periods' }), {
    default: '2',
  }),
  out: outOption('the VCD'),
} as const;

export const wavesCommand = defineCommand({
  name: 'waves',
  description: 'steady-state waveforms of a corner as an IEEE 1364 VCD file (50 % crossings, switch conduction)',
  arguments: [DESIGN_ARGUMENT],
  options: OPTIONS,
  run: (io, [design], options) => runWaves(io, design, options),
});

export function runWaves(io: Io, designPath: string, options: CommandOptions<typeof OPTIONS>): number {
  const out = requireOut(options.out, 'VCD');
  const { timescale, periods, nets } = options;
  const loaded = loadResolved(designPath, options.set, options, warnTo(io), io.readStdin);
  const { design, card, resolved } = loaded;
  const inputs = inputFiles(loaded, options);
  checkOutput(out, inputs);
  const results = evaluateAll(resolved);
  const selection = selectCorner(results, options.corner, false);
  const index = selection.kind === 'corner' ? selection.index : selection.reference;
  const result = results[index]!;
  if (!result.measurement.ok) {
    throw inputError(
      'option.invalid',
      ['--corner'],
      result.corner.name,
      `has no steady state to dump (${result.measurement.reason}); pick another corner`,
    );
  }
  const period = result.simulation.period;
  const text = renderVcd({
    top: design.name,
    comment:
      `phasegap waveforms of ${design.name} at corner ${result.corner.name} (${resolved.model.name} model, card ${card.name}): ` +
      `50 % crossings of the steady-state period, repeated ${periods} times; time 0 is the clock's rising 50 % point; ` +
      'scope switches: 1 while each switch conducts. Model estimate, not a sign-off. ' +
      provenanceLines(gatherProvenance(io, loaded, { model: resolved.model.name, options })).join('; '),
    version: `phasegap ${VERSION}`,
    timescale,
    end: periods * period,
    signals: vcdSignals(result, resolved.netlist, nets, periods),
  });
  emit(io, text, out, inputs);
  return result.pass ? 0 : 1;
}
