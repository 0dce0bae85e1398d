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
import { loadResolved, type ModelOptions } from '../load.js';
import { checkOutput, emit, inputFiles } from '../output.js';
import { wholeNumber } from '../options.js';
import { MAX_VCD_PERIODS } from '../run-limits.js';
import { parseNets, requireOut } from '../out-options.js';
import { warnTo } from '../warn.js';

export interface WavesOptions extends ModelOptions {
  readonly set: readonly string[];
  readonly corner: string;
  readonly nets: string;
  readonly timescale: string;
  readonly periods: string;
  readonly out?: string;
}

export function runWaves(io: Io, designPath: string, options: WavesOptions): number {
  const out = requireOut(options.out, 'VCD');
  const allowed = Object.keys(TIMESCALES);
  if (!allowed.includes(options.timescale)) throw inputError('option.invalid', '--timescale', options.timescale, `is not offered; allowed: ${allowed.join(', ')}`);
  const timescale = options.timescale as Timescale;
  const periods = wholeNumber('--periods', options.periods, { min: 1, max: MAX_VCD_PERIODS, noun: 'clock periods' });
  const nets = parseNets(options.nets);
  const loaded = loadResolved(designPath, options.set, options, warnTo(io), io.readStdin);
  const { design, card, resolved } = loaded;
  const inputs = inputFiles(loaded, options);
  checkOutput(out, inputs);
  const results = evaluateAll(resolved);
  const selection = selectCorner(results, options.corner, false);
  const index = selection.kind === 'corner' ? selection.index : selection.reference;
  const result = results[index]!;
  if (!result.measurement.ok) {
    throw inputError('option.invalid', '--corner', result.corner.name, `has no steady state to dump (${result.measurement.reason}); pick another corner`);
  }
  const period = result.simulation.period;
  const text = renderVcd({
    top: design.name,
    comment: `phasegap waveforms of ${design.name} at corner ${result.corner.name} (${resolved.model.name} model, card ${card.name}): `
      + `50 % crossings of the steady-state period, repeated ${periods} times; time 0 is the clock's rising 50 % point; `
      + 'scope switches: 1 while each switch conducts. Model estimate, not a sign-off. '
      + provenanceLines(gatherProvenance(io, loaded, { model: resolved.model.name, options })).join('; '),
    version: `phasegap ${VERSION}`,
    timescale,
    end: periods * period,
    signals: vcdSignals(result, resolved.netlist, nets, periods),
  });
  emit(io, text, out, inputs);
  return result.pass ? 0 : 1;
}
