/**
 * ngspice runs with a progress bar on a terminal: the decks go to the simulator in batches of
 * `parallel` so the bar can move between batches; without a bar they go in one run.
 */
import { runDecks, type RunOutput } from '../spice/runner.js';
import type { Io } from './io.js';
import { progressBar } from './progress.js';

export function runDecksWithProgress(
  io: Io,
  decks: ReadonlyArray<{ readonly name: string; readonly text: string }>,
  options: { readonly program?: string; readonly parallel: number },
  label: string,
  enabled: boolean,
): RunOutput[] {
  const shown = enabled && io.stderrIsTTY;
  const batch = Math.max(1, shown ? options.parallel : decks.length);
  const bar = progressBar(io, decks.length, label, shown, { everyStep: true });
  const outputs: RunOutput[] = [];
  try {
    for (let at = 0; at < decks.length; at += batch) {
      outputs.push(...runDecks(decks.slice(at, at + batch), options));
      bar.update(outputs.length);
    }
  } finally {
    bar.stop();
  }
  return outputs;
}
