/** `phasegap confirm DESIGN`: runs ngspice on the chosen corners and compares with the model. */
import { availableParallelism } from 'node:os';
import { inputError } from '../../errors.js';
import { resolveDesign, type ResolvedDesign } from '../../analysis/resolve.js';
import { generatorDeck } from '../../spice/deck.js';
import { chooseCorners } from '../../spice/corner-choice.js';
import { compareCorner, worstDifference, type CornerComparison } from '../../spice/confirm.js';
import { renderConfirmText } from '../../spice/confirm-text.js';
import { parseSimulatorOutput } from '../../spice/results.js';
import { checkSimulator, runDecks } from '../../spice/runner.js';
import { CAUTIONS } from '../../report/cautions.js';
import type { Io } from '../io.js';
import { loadDesign, loadModel, type ModelOptions } from '../load.js';
import { checkOutput, emit, inputFiles, toJson } from '../output.js';
import { optionalWholeNumber } from '../options.js';
import { MAX_WORKERS } from '../run-limits.js';
import { modelFile, warnTo } from './spice.js';
import { shellCommand } from '../../report/shell-quote.js';

export interface ConfirmOptions extends ModelOptions {
  readonly set: readonly string[];
  readonly corners: string;
  readonly tolerance?: string;
  readonly json: boolean;
  readonly out?: string;
  readonly models?: string;
  readonly ngspice?: string;
  readonly jobs?: string;
}

export const DEFAULT_TOLERANCE = 0.1;

/** `--tolerance`, else the design's requirements.confirmTolerance, else 10 %. */
export function parseTolerance(text: string | undefined, fromDesign?: number): number {
  if (text === undefined) return fromDesign ?? DEFAULT_TOLERANCE;
  const percent = /^(\d*\.?\d+)\s*%$/.exec(text.trim());
  const value = percent ? Number(percent[1]) / 100 : Number(text);
  if (!(value > 0 && value < 10)) throw inputError('--tolerance', text, 'must be a relative difference above 0, e.g. 0.1 or 10%');
  return value;
}

export function parseJobs(text: string | undefined): number {
  return optionalWholeNumber('--jobs', text, { min: 1, max: MAX_WORKERS, noun: 'simulations at once' }, Math.min(availableParallelism(), MAX_WORKERS));
}

export interface ConfirmRun {
  readonly simulator: string;
  readonly tolerance: number;
  readonly comparisons: readonly CornerComparison[];
}

/** Writes the decks of the chosen corners, runs ngspice on them and compares with the model. */
export function confirmCorners(io: Io, resolved: ResolvedDesign, cardDir: string,
  options: { readonly corners: string; readonly tolerance?: string; readonly models?: string; readonly ngspice?: string; readonly jobs?: string; readonly quiet?: boolean },
  cornersFlag = '--corners'): ConfirmRun {
  const jobs = parseJobs(options.jobs);
  const tolerance = parseTolerance(options.tolerance, resolved.design.requirements.confirmTolerance);
  const corners = chooseCorners(resolved, options.corners, cornersFlag);
  const modelPath = modelFile(resolved.card, cardDir, options.models);
  const simulator = checkSimulator(options.ngspice);
  const decks = corners.map((corner) => generatorDeck(resolved, corner, { modelPath }));
  if (io.stderrIsTTY && !options.quiet) io.stderr(`simulating ${decks.length} corners with ${simulator}, ${jobs} at a time...\n`);
  const outputs = runDecks(decks.map((d) => ({ name: d.corner.name, text: d.text })), { program: options.ngspice, parallel: jobs });
  const comparisons = decks.map((deck, i) => {
    const parsed = parseSimulatorOutput(outputs[i]!.output, [...deck.quantities.map((q) => q.name), ...deck.ron.map((r) => r.name)]);
    if (parsed.errors.length > 0 && [...parsed.values.values()].every((v) => v === null)) {
      throw inputError('ngspice', deck.corner.name, `failed on the deck of this corner: ${parsed.errors[0]}; write it with ${shellCommand(['phasegap', 'spice', '--corner', deck.corner.name])} and run ngspice -b on it to see why`);
    }
    return compareCorner(deck, parsed, tolerance);
  });
  return { simulator, tolerance, comparisons };
}

export function runConfirm(io: Io, designPath: string, options: ConfirmOptions): number {
  const loaded = loadDesign(designPath, options.set);
  const { design, card, cardDir } = loaded;
  const inputs = inputFiles(loaded, options);
  checkOutput(options.out, inputs);
  const model = loadModel(card, cardDir, options, warnTo(io));
  const resolved = resolveDesign(design, card, model);
  const { simulator, tolerance, comparisons } = confirmCorners(io, resolved, cardDir, { ...options, quiet: options.json });
  const pass = comparisons.every((c) => c.pass);
  if (options.json) {
    emit(io, toJson({
      tool: 'phasegap', design: design.name, process: card.name, model: model.name, simulator, tolerance,
      verdict: pass ? 'agree' : 'disagree', worst: worstDifference(comparisons), corners: comparisons, cautions: CAUTIONS,
    }), options.out, inputs);
  } else {
    emit(io, renderConfirmText({ design: design.name, model: model.name, simulator, tolerance, corners: comparisons }), options.out, inputs);
  }
  return pass ? 0 : 1;
}
