/** `phasegap spice DESIGN --corner NAME -o FILE.cir`: a runnable ngspice testbench of one corner. */
import { dirname, relative, resolve } from 'node:path';
import { inputError } from '../../errors.js';
import { resolveDesign } from '../../analysis/resolve.js';
import { evaluateAll, limitingCheck } from '../../analysis/evaluate.js';
import type { ProcessCard, SpiceSection } from '../../schema/process.js';
import { generatorDeck } from '../../spice/deck.js';
import { spiceSection } from '../../spice/models.js';
import { chooseCorners } from '../../spice/corner-choice.js';
import type { Io } from '../io.js';
import { checkModelFile, loadDesign, loadModel, type ModelOptions } from '../load.js';
import { checkOutput, emit, inputFiles } from '../output.js';
import { shellCommand } from '../../report/shell-quote.js';

export interface SpiceOptions extends ModelOptions {
  readonly set: readonly string[];
  readonly corner?: string;
  readonly out?: string;
  readonly models?: string;
}

/** The device-model file: `--models FILE`, else the card's spice.models relative to the card. */
export function modelFile(card: ProcessCard, cardDir: string, override?: string): string {
  const path = override === undefined ? resolve(cardDir, spiceSection(card).models) : resolve(override);
  const defined = checkModelFile(path, override === undefined ? 'process.spice.models' : '--models');
  if (defined) checkModelNames(spiceSection(card), defined, path);
  return path;
}

/** Every device model the card names must be defined in the model file, or ngspice stops on the deck. */
function checkModelNames(spice: SpiceSection, defined: ReadonlySet<string>, path: string): void {
  const named: Array<[string, string | undefined]> = [['process.spice.n', spice.n], ['process.spice.p', spice.p]];
  for (const [corner, models] of Object.entries(spice.corners)) named.push([`process.spice.corners.${corner}.n`, models.n], [`process.spice.corners.${corner}.p`, models.p]);
  for (const [field, name] of named) {
    if (name !== undefined && !defined.has(name.toLowerCase())) {
      const known = [...defined].filter((n) => /^[a-z0-9_.-]{1,32}$/.test(n)).slice(0, 8).join(', ');
      throw inputError(field, name, `is not a model or subcircuit of ${path} (it defines ${known || 'none'})`);
    }
  }
}

export const warnTo = (io: Io) => (message: string) => io.stderr(`phasegap: warning: ${message}\n`);

export function runSpice(io: Io, designPath: string, options: SpiceOptions): number {
  const loaded = loadDesign(designPath, options.set);
  const { design, card, cardDir } = loaded;
  const inputs = inputFiles(loaded, options);
  checkOutput(options.out, inputs);
  const cornerSpec = options.corner ?? 'worst';
  const resolved = resolveDesign(design, card, loadModel(card, cardDir, options, warnTo(io)));
  if (cornerSpec === 'all' || cornerSpec.includes(',')) {
    throw inputError('--corner', cornerSpec, 'must name one corner (a deck simulates one corner) or worst; use phasegap confirm for several');
  }
  const limiting = cornerSpec === 'worst' ? limitingCheck(evaluateAll(resolved))?.corner : cornerSpec;
  const corner = chooseCorners(resolved, limiting ?? resolved.corners[0]!.corner.name, '--corner')[0]!;
  const absolute = modelFile(card, cardDir, options.models);
  const toFile = options.out !== undefined && options.out !== '-';
  const modelPath = toFile ? relative(dirname(resolve(options.out!)), absolute) || absolute : absolute;
  const deck = generatorDeck(resolved, corner, { modelPath });
  emit(io, deck.text, options.out, inputs);
  if (toFile) io.stderr(`wrote ${options.out} (${corner.name}, ${deck.quantities.length} measurements); run: ${shellCommand(['ngspice', '-b', options.out!])}\n`);
  return 0;
}
