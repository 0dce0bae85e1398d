/**
 * A small worker_threads pool: tasks go out to N threads, results come back with their task
 * index; the caller decides the order in which it uses them. Stopping terminates every thread.
 */
import { Worker } from 'node:worker_threads';
import { fileURLToPath } from 'node:url';
import { dirname, join } from 'node:path';
import { existsSync } from 'node:fs';
import { InputError, type InputIssue } from '../errors.js';
import type { WorkerSetup } from './worker.js';

/** The compiled worker script (tests run from TypeScript sources, workers always run compiled JS). */
function workerScript(): string {
  const here = fileURLToPath(import.meta.url);
  if (here.endsWith('.js')) return join(dirname(here), 'worker.js');
  const compiled = join(dirname(here), '..', '..', 'dist', 'src', 'cli', 'worker.js');
  if (!existsSync(compiled)) throw new Error('worker threads need the compiled build: run npm run build first');
  return compiled;
}

export interface PoolHandle {
  /**
   * Terminates the threads; pending tasks are dropped, and so are results already on their way
   * back: after stop() returns, onResult is not called again.
   */
  stop(): void;
}

/** One run of the pool: the tasks, the threads and what to do with each result. */
export interface PoolRun<T, R> {
  /** What every worker thread loads once before its first task (`src/cli/worker.ts`). */
  readonly setup: WorkerSetup;
  readonly tasks: readonly T[];
  readonly threads: number;
  /** Called with each result and the index of its task, in the order results arrive. */
  readonly onResult: (index: number, result: R) => void;
  /** Called once the threads are started, with the handle that stops them. */
  readonly onStart?: (handle: PoolHandle) => void;
  /**
   * With `local`, the calling thread is one of the `threads`: it runs tasks itself between the
   * messages of `threads - 1` workers (each kept two tasks ahead so it never waits on the caller).
   */
  readonly local?: (task: T) => R;
}

export function runPool<T, R>({ setup, tasks, threads, onResult, onStart, local }: PoolRun<T, R>): Promise<void> {
  return new Promise((resolve, reject) => {
    const script = workerScript();
    const workers: Worker[] = [];
    let next = 0;
    let done = 0;
    let stopped = false;
    const stop = () => {
      stopped = true;
      for (const w of workers) void w.terminate();
    };
    const feed = (w: Worker) => {
      if (stopped || next >= tasks.length) return;
      const index = next++;
      w.postMessage({ index, task: tasks[index] });
    };
    if (tasks.length === 0) {
      resolve();
      return;
    }
    /** Hands a result to the caller; a throw there (a failed write) stops the pool and rejects. */
    const deliver = (index: number, result: R): boolean => {
      try {
        onResult(index, result);
        return true;
      } catch (error) {
        stop();
        reject(error);
        return false;
      }
    };
    const finishOne = (): boolean => {
      done++;
      if (done < tasks.length) return false;
      stop();
      resolve();
      return true;
    };
    const runLocal = () => {
      if (stopped || next >= tasks.length || !local) return;
      const index = next++;
      let result: R;
      try {
        result = local(tasks[index]!);
      } catch (error) {
        stop();
        reject(error);
        return;
      }
      if (deliver(index, result) && !finishOne()) setImmediate(runLocal);
    };
    const count = Math.max(local ? 0 : 1, Math.min(local ? threads - 1 : threads, tasks.length));
    const ahead = local ? 2 : 1;
    for (let i = 0; i < count; i++) {
      const w = new Worker(script, { workerData: setup, execArgv: [] });
      workers.push(w);
      w.on('message', (message: { index: number; result?: R; error?: string; issues?: InputIssue[] }) => {
        // A thread may have posted before it was terminated; its message still arrives.
        if (stopped) return;
        if (message.error !== undefined) {
          stop();
          reject(message.issues ? new InputError(message.issues) : new Error(message.error));
          return;
        }
        if (deliver(message.index, message.result as R) && !finishOne()) feed(w);
      });
      w.on('error', (error) => {
        if (stopped) return;
        stop();
        reject(error);
      });
      for (let k = 0; k < ahead; k++) feed(w);
    }
    onStart?.({
      stop: () => {
        stop();
        resolve();
      },
    });
    setImmediate(runLocal);
  });
}
