import { EventEmitter } from 'node:events';
import { describe, it, expect, vi } from 'vitest';
import { runPool, type PoolHandle } from '../../src/cli/pool.js';
import type { SweepSetup } from '../../src/cli/sweep-points.js';
import type { SweepRow } from '../../src/analysis/sweep.js';
import { readFileSync } from 'node:fs';
import { design } from '../helpers.js';

const setup: SweepSetup = {
  design: { path: design('doubler'), text: readFileSync(design('doubler'), 'utf8') },
  overrides: [],
  axes: [{ path: 'temperature', values: [-40, 0, 27, 85, 125] }],
  model: {},
};

/** Stands in for a worker thread: the test decides when each of its answers arrives. */
class FakeWorker extends EventEmitter {
  static made: FakeWorker[] = [];
  readonly posted: Array<{ index: number }> = [];
  terminated = false;
  constructor() {
    super();
    FakeWorker.made.push(this);
  }
  postMessage(message: { index: number }): void {
    this.posted.push(message);
  }
  terminate(): Promise<number> {
    this.terminated = true;
    return Promise.resolve(1);
  }
  /** An answer the thread posted; it arrives even after terminate(), as a real port's queue does. */
  answer(index: number): void {
    this.emit('message', { index, result: [] });
  }
}

/** runPool with node:worker_threads replaced by FakeWorker. */
async function poolWithFakeWorkers(): Promise<typeof runPool> {
  FakeWorker.made = [];
  vi.resetModules();
  vi.doMock('node:worker_threads', () => ({ Worker: FakeWorker }));
  try {
    return (await import('../../src/cli/pool.js')).runPool;
  } finally {
    vi.doUnmock('node:worker_threads');
  }
}

describe('worker pool stop', () => {
  it('delivers no result after stop, even one a thread posted before it was terminated', async () => {
    const fakePool = await poolWithFakeWorkers();
    const tasks = Array.from({ length: 6 }, (_, i) => ({ start: i % 5, count: 1 }));
    const seen: number[] = [];
    let handle: PoolHandle | undefined;
    const finished = fakePool<{ start: number; count: number }, SweepRow[]>({
      setup: { kind: 'sweep', ...setup },
      tasks,
      threads: 2,
      onResult: (index) => {
        seen.push(index);
        handle!.stop();
      },
      onStart: (h) => {
        handle = h;
      },
    });
    const [a, b] = FakeWorker.made;
    expect(FakeWorker.made).toHaveLength(2);
    expect([a!.posted, b!.posted]).toEqual([[{ index: 0, task: tasks[0] }], [{ index: 1, task: tasks[1] }]]);
    // Both threads have answered; the caller stops the pool on the first answer it reads.
    a!.answer(0);
    b!.answer(1);
    a!.answer(0);
    await finished;
    expect(seen).toEqual([0]);
    expect(a!.terminated && b!.terminated).toBe(true);
    // No task went out after stop.
    expect(a!.posted.length + b!.posted.length).toBe(2);
  });

  it('delivers every result exactly once when it runs to the end', async () => {
    const tasks = Array.from({ length: 10 }, (_, i) => ({ start: i % 5, count: 1 }));
    const seen: number[] = [];
    await runPool<{ start: number; count: number }, SweepRow[]>({
      setup: { kind: 'sweep', ...setup },
      tasks,
      threads: 2,
      onResult: (index, rows) => {
        expect(rows).toHaveLength(1);
        seen.push(index);
      },
    });
    expect([...seen].sort((a, b) => a - b)).toEqual([...Array(10).keys()]);
  }, 30_000);
});
