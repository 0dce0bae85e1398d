/** ngspice on chosen corners of a resolved design, compared with the model (confirm, and report --confirm). */
import { inputError } from '../errors.js';
import type { ResolvedDesign } from '../analysis/resolve.js';
import { chooseCorners } from '../analysis/corner-choice.js';
import { generatorDeck } from '../spice/deck.js';
import { compareCorner } from '../spice/confirm.js';
import { circuitDeck } from '../spice/circuit-deck.js';
import { compareCircuit } from '../spice/circuit-measures.js';
import type { CornerComparison } from '../report/confirm-report.js';
import { parseSimulatorOutput } from '../spice/results.js';
import { checkSimulator } from '../spice/runner.js';
import { runDecksWithProgress } from './deck-progress.js';
import { shellCommand } from '../report/shell-quote.js';
import type { Io } from './io.js';
import { modelFile } from './model-file.js';
import { defaultParallelism } from './options.js';
import { noteTo } from './warn.js';

export const DEFAULT_TOLERANCE = 0.1;

export interface ConfirmRequest {
  /** worst (the extremes), all, or corner names separated by commas. */
  readonly corners: string;
  /** The option that named the corners, for messages (default `--corners`). */
  readonly cornersFlag?: string;
  /** Largest allowed relative difference; absent: the design's requirements.confirmTolerance, else 10 %. */
  readonly tolerance?: number;
  readonly models?: string;
  readonly ngspice?: string;
  /** Simulations at once (default: the number of cores). */
  readonly jobs?: number;
  /** Neither the note nor the progress bar on stderr. */
  readonly quiet?: boolean;
  /** Also simulate the circuit section to its periodic steady state (confirm; tune confirms timing only). */
  readonly circuit?: boolean;
}

export interface ConfirmRun {
  readonly simulator: string;
  readonly tolerance: number;
  readonly comparisons: readonly CornerComparison[];
}

/** Writes the decks of the chosen corners, runs ngspice on them and compares with the model. */
export function confirmCorners(io: Io, resolved: ResolvedDesign, cardDir: string, options: ConfirmRequest): ConfirmRun {
  const jobs = options.jobs ?? defaultParallelism();
  const tolerance = options.tolerance ?? resolved.design.requirements.confirmTolerance ?? DEFAULT_TOLERANCE;
  const corners = chooseCorners(resolved, options.corners, options.cornersFlag ?? '--corners');
  const modelPath = modelFile(resolved.card, cardDir, options.models);
  const simulator = checkSimulator(options.ngspice);
  const decks = corners.map((corner) => generatorDeck(resolved, corner, { modelPath }));
  const circuits = options.circuit && resolved.design.circuit ? corners.map((corner) => circuitDeck(resolved, corner, { modelPath })) : [];
  if (io.stderrIsTTY && !options.quiet)
    noteTo(
      io,
      `simulating ${decks.length} corners${circuits.length > 0 ? ' and their circuit' : ''} with ${simulator}, ${jobs} at a time...`,
    );
  const all = [
    ...decks.map((d) => ({ name: d.corner.name, text: d.text })),
    ...circuits.map((d) => ({ name: `${d.corner.name} circuit`, text: d.text })),
  ];
  const outputs = runDecksWithProgress(io, all, { program: options.ngspice, parallel: jobs }, 'confirm', !options.quiet);
  const comparisons = decks.map((deck, i) => {
    const parsed = parseSimulatorOutput(outputs[i]!.output, [...deck.quantities.map((q) => q.name), ...deck.ron.map((r) => r.name)]);
    if (parsed.errors.length > 0 && [...parsed.values.values()].every((v) => v === null)) {
      throw inputError(
        'tool.failed',
        ['ngspice'],
        deck.corner.name,
        `failed on the deck of this corner: ${parsed.errors[0]}; write it with ${shellCommand(['phasegap', 'spice', '--corner', deck.corner.name])} and run ngspice -b on it to see why`,
      );
    }
    const timing = compareCorner(deck, parsed, tolerance);
    const circuit = circuits[i];
    if (!circuit) return timing;
    const measured = parseSimulatorOutput(outputs[decks.length + i]!.output, circuit.measures);
    if (measured.errors.length > 0 && [...measured.values.values()].every((v) => v === null)) {
      throw inputError('tool.failed', ['ngspice'], circuit.corner.name, `failed on the circuit deck of this corner: ${measured.errors[0]}`);
    }
    const compared = compareCircuit(circuit, measured);
    return { ...timing, circuit: compared, errors: [...timing.errors, ...measured.errors], pass: timing.pass && compared.pass };
  });
  return { simulator, tolerance, comparisons };
}
