/** A worker thread: loads the design once, then evaluates the chunks of Monte Carlo or sweep work it is sent. */
import { parentPort, workerData } from 'node:worker_threads';
import { loadResolved, type DesignSource, type ModelOptions } from './load.js';
import { runChunk, type ChunkResult } from '../analysis/montecarlo.js';
import type { DieChecks } from '../analysis/evaluate.js';
import { sweepRows, type SweepSetup } from './sweep-points.js';
import { InputError } from '../errors.js';
import { warningLine } from './warn.js';

export type WorkerSetup =
  | {
      readonly kind: 'mc';
      readonly design: DesignSource;
      readonly overrides: readonly string[];
      readonly seed: number;
      readonly model: ModelOptions;
      readonly checks: DieChecks;
    }
  | ({ readonly kind: 'sweep' } & SweepSetup);

const setup = workerData as WorkerSetup;
const port = parentPort!;

if (setup.kind === 'mc') {
  const { resolved } = loadResolved(setup.design, setup.overrides, setup.model, (m) => process.stderr.write(warningLine(m)));
  port.on('message', ({ index, task }: { index: number; task: { start: number; count: number } }) => {
    try {
      const result: ChunkResult = runChunk(resolved, setup.seed, task.start, task.count, setup.checks);
      const transfer = result.corners.flatMap((c) => [c.leastMargin.buffer, c.dead0.buffer, c.dead1.buffer]) as ArrayBuffer[];
      port.postMessage({ index, result }, transfer);
    } catch (error) {
      port.postMessage(failure(index, error));
    }
  });
} else {
  port.on('message', ({ index, task }: { index: number; task: { start: number; count: number } }) => {
    try {
      port.postMessage({ index, result: sweepRows(setup, task.start, task.count) });
    } catch (error) {
      port.postMessage(failure(index, error));
    }
  });
}

function failure(index: number, error: unknown) {
  if (error instanceof InputError) return { index, error: error.message, issues: error.issues };
  return { index, error: error instanceof Error ? (error.stack ?? error.message) : String(error) };
}
