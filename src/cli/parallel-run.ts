/**
 * Independent tasks run on worker threads (or one after another on the calling thread when one
 * thread is asked for), stopped cleanly by Ctrl-C: the one runner behind mc and sweep.
 */
import { runPool } from './pool.js';
import type { WorkerSetup } from './worker.js';

export interface ParallelRun<T, R> {
  /** What each worker thread loads once (`src/cli/worker.ts`). */
  readonly setup: WorkerSetup;
  readonly tasks: readonly T[];
  /** Threads to use; 1 (or a single task) runs every task on the calling thread. */
  readonly threads: number;
  /** Runs one task on the calling thread: the same work a worker does for it. */
  readonly local: (task: T) => R;
  /** Receives each result with its task index. */
  readonly onResult: (result: R, index: number) => void;
  /** Hand results over in task order (later ones wait for earlier ones); else as they arrive. */
  readonly ordered?: boolean;
}

/** How a run ended: every task done, or stopped by Ctrl-C (the results delivered so far stand). */
export type RunEnd = 'done' | 'interrupted';

/** Yields to the event loop, so a signal that arrived during a long computation is handled. */
const nextTurn = () => new Promise<void>((resolve) => setImmediate(resolve));

export async function runParallel<T, R>(run: ParallelRun<T, R>): Promise<RunEnd> {
  let interrupted = false;
  let stopPool = (): void => undefined;
  const onSigint = () => {
    interrupted = true;
    stopPool();
  };
  process.once('SIGINT', onSigint);
  try {
    if (run.threads === 1 || run.tasks.length === 1) {
      for (let i = 0; i < run.tasks.length && !interrupted; i++) {
        run.onResult(run.local(run.tasks[i]!), i);
        await nextTurn();
      }
    } else {
      await runPool<T, R>({
        setup: run.setup,
        tasks: run.tasks,
        threads: run.threads,
        local: run.local,
        onResult: run.ordered ? inOrder(run.onResult) : (index, result) => run.onResult(result, index),
        onStart: (handle) => {
          stopPool = () => handle.stop();
        },
      });
    }
  } finally {
    process.removeListener('SIGINT', onSigint);
  }
  return interrupted ? 'interrupted' : 'done';
}

/** Holds results that arrive early until every task before them has been handed over. */
function inOrder<R>(onResult: (result: R, index: number) => void): (index: number, result: R) => void {
  const waiting = new Map<number, R>();
  let next = 0;
  return (index, result) => {
    waiting.set(index, result);
    while (waiting.has(next)) {
      const ready = waiting.get(next)!;
      waiting.delete(next);
      onResult(ready, next++);
    }
  };
}
