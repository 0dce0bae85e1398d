/** `phasegap spice DESIGN --corner NAME -o FILE.cir`: a runnable ngspice testbench of one corner. */
import { dirname, relative, resolve } from 'node:path';
import { inputError } from '../../errors.js';
import { resolveDesign } from '../../analysis/resolve.js';
import { generatorDeck } from '../../spice/deck.js';
import { chooseCorners, oneCornerName } from '../../analysis/corner-choice.js';
import type { Io } from '../io.js';
import { loadDesign, loadModel } from '../load.js';
import { modelFile } from '../model-file.js';
import { noteTo, warnTo } from '../warn.js';
import { gatherProvenance } from '../provenance.js';
import { provenanceLines } from '../../report/provenance.js';
import { spiceComment } from '../../spice/text.js';
import { emit, checkedInputs } from '../output.js';
import { shellCommand } from '../../report/shell-quote.js';
import { defineCommand, textOption, type CommandOptions } from '../command.js';
import { DESIGN_ARGUMENT, MODELS_OPTION, SET_OPTION, outOption } from '../common-options.js';

const OPTIONS = {
  set: SET_OPTION,
  corner: textOption('--corner <NAME>', 'the corner, e.g. ss/1.62V/125C, or worst (the limiting corner)', { default: 'worst' }),
  models: MODELS_OPTION,
  out: outOption('the deck'),
} as const;

export const spiceCommand = defineCommand({
  name: 'spice',
  description: 'write a runnable ngspice testbench of the generator and its switches at one corner',
  arguments: [DESIGN_ARGUMENT],
  options: OPTIONS,
  run: (io, [design], options) => runSpice(io, design, options),
});

export function runSpice(io: Io, designPath: string, options: CommandOptions<typeof OPTIONS>): number {
  const loaded = loadDesign(designPath, options.set, io.readStdin);
  const { design, card, cardDir } = loaded;
  const inputs = checkedInputs(loaded, options);
  const cornerSpec = options.corner ?? 'worst';
  const resolved = resolveDesign(design, card, loadModel(card, cardDir, options, warnTo(io)));
  if (cornerSpec === 'all' || cornerSpec.includes(',')) {
    throw inputError(
      'option.invalid',
      ['--corner'],
      cornerSpec,
      'must name one corner (a deck simulates one corner) or worst; use phasegap confirm for several',
    );
  }
  const corner = chooseCorners(resolved, oneCornerName(resolved, cornerSpec), '--corner')[0]!;
  const absolute = modelFile(card, cardDir, options.models);
  const toFile = options.out !== undefined && options.out !== '-';
  const modelPath = toFile ? relative(dirname(resolve(options.out!)), absolute) || absolute : absolute;
  const deck = generatorDeck(resolved, corner, { modelPath });
  const record = provenanceLines(gatherProvenance(io, loaded, { model: resolved.model.name, options, spice: true }));
  // The first line of a deck is its title; the record follows it as comment lines.
  const [title, ...rest] = deck.text.split('\n');
  emit(io, [title, ...record.map(spiceComment), ...rest].join('\n'), options.out, inputs);
  if (toFile)
    noteTo(
      io,
      `wrote ${options.out} (${corner.name}, ${deck.quantities.length} measurements); run: ${shellCommand(['ngspice', '-b', options.out!])}`,
    );
  return 0;
}
