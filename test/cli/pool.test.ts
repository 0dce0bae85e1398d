import { describe, it, expect } from 'vitest';
import { runPool } from '../../src/cli/pool.js';
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

/** Holds the calling thread, so that results the threads post meanwhile queue up behind it. */
function busyWait(ms: number): void {
  const until = Date.now() + ms;
  while (Date.now() < until) { /* spin */ }
}

describe('worker pool stop', () => {
  it('delivers no result after stop, even one a thread posted before it was terminated', async () => {
    const tasks = Array.from({ length: 40 }, (_, i) => ({ start: i % 5, count: 1 }));
    const seen: number[] = [];
    let stop = (): void => undefined;
    let stoppedAt = -1;
    // One worker thread kept two tasks ahead, plus this thread: while this thread is held, the
    // worker's answers pile up on its port.
    await runPool<{ start: number; count: number }, SweepRow[]>({ kind: 'sweep', ...setup }, tasks, 2, (index) => {
      seen.push(index);
      if (stoppedAt >= 0) return;
      busyWait(1500);
      stoppedAt = seen.length;
      stop();
    }, (handle) => { stop = () => handle.stop(); }, () => { busyWait(1500); return []; });
    // A terminated thread's port is drained when the thread exits, which is after runPool settles.
    await new Promise((r) => setTimeout(r, 1000));
    expect(stoppedAt).toBe(1);
    expect(seen).toHaveLength(1);
  }, 30_000);

  it('delivers every result exactly once when it runs to the end', async () => {
    const tasks = Array.from({ length: 10 }, (_, i) => ({ start: i % 5, count: 1 }));
    const seen: number[] = [];
    await runPool<{ start: number; count: number }, SweepRow[]>({ kind: 'sweep', ...setup }, tasks, 2, (index, rows) => {
      expect(rows).toHaveLength(1);
      seen.push(index);
    });
    expect([...seen].sort((a, b) => a - b)).toEqual([...Array(10).keys()]);
  }, 30_000);
});
