/** `phasegap verilog DESIGN --corner NAME -o FILE.v`: structural Verilog with the corner's gate delays. */
import { inputError } from '../../errors.js';
import { resolveDesign } from '../../analysis/resolve.js';
import { chooseCorners, oneCornerName } from '../../analysis/corner-choice.js';
import { steadyStateDelays } from '../../verilog/delays.js';
import { verilogModule, verilogTestbench } from '../../verilog/export.js';
import type { Io } from '../io.js';
import { gatherProvenance } from '../provenance.js';
import { provenanceLines } from '../../report/provenance.js';
import { loadDesign, loadModel } from '../load.js';
import { emit, checkedInputs } from '../output.js';
import { wholeNumberIn } from '../options.js';
import { MAX_TESTBENCH_PERIODS } from '../run-limits.js';
import { noteTo, warnTo } from '../warn.js';
import { defineCommand, flagOption, parsedOption, textOption, type CommandOptions } from '../command.js';
import { DESIGN_ARGUMENT, SET_OPTION, outOption } from '../common-options.js';

const OPTIONS = {
  set: SET_OPTION,
  corner: textOption('--corner <NAME>', 'the corner, e.g. tt/1.8V/27C, or worst (the limiting corner)', { default: 'worst' }),
  testbench: flagOption('--testbench', 'append a testbench that drives the clock and dumps a VCD file', false),
  periods: parsedOption(
    '--periods <N>',
    'clock periods the testbench runs (default 6)',
    wholeNumberIn({ min: 3, max: MAX_TESTBENCH_PERIODS, noun: 'clock periods' }),
    { fallback: 6 },
  ),
  vcd: textOption('--vcd <FILE>', 'VCD file the testbench writes (default <module>.vcd)'),
  out: outOption('the Verilog'),
} as const;

export const verilogCommand = defineCommand({
  name: 'verilog',
  description: "write a structural Verilog model of the generator with the corner's rise/fall gate delays",
  arguments: [DESIGN_ARGUMENT],
  options: OPTIONS,
  run: (io, [design], options) => runVerilog(io, design, options),
});

export function moduleName(designName: string): string {
  const base = designName.replace(/[^A-Za-z0-9_]/g, '_');
  return /^[A-Za-z_]/.test(base) ? base : `m_${base}`;
}

export function runVerilog(io: Io, designPath: string, options: CommandOptions<typeof OPTIONS>): number {
  const loaded = loadDesign(designPath, options.set, io.readStdin);
  const { design, card, cardDir } = loaded;
  const inputs = checkedInputs(loaded, options);
  const cornerSpec = options.corner ?? 'worst';
  if (cornerSpec === 'all' || cornerSpec.includes(','))
    throw inputError('option.invalid', ['--corner'], cornerSpec, 'must name one corner or worst');
  const periods = options.periods;
  const resolved = resolveDesign(design, card, loadModel(card, cardDir, options, warnTo(io)));
  const corner = chooseCorners(resolved, oneCornerName(resolved, cornerSpec), '--corner')[0]!;
  const delays = steadyStateDelays(resolved, corner);
  const module = verilogModule(resolved.netlist, delays, moduleName(design.name), [
    `${design.name} at ${corner.name}: structural model written by phasegap`,
    `gate delays #(rise, fall) from the ${resolved.model.name} model in its periodic steady state at this corner`,
    'a model estimate for top-level simulation, not a sign-off',
    ...provenanceLines(gatherProvenance(io, loaded, { model: resolved.model.name, options })),
  ]);
  let text = module.text;
  if (options.testbench) {
    text += verilogTestbench(module, 1 / design.clock.frequency, corner.duty, periods, options.vcd ?? `${module.name}.vcd`);
  }
  emit(io, text, options.out, inputs);
  if (options.out !== undefined && options.out !== '-')
    noteTo(io, `wrote ${options.out} (${corner.name}, ${resolved.netlist.gateCount} gates)`);
  return 0;
}
