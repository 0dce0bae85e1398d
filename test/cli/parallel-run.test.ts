import { describe, expect, it } from 'vitest';
import { runParallel } from '../../src/cli/parallel-run.js';

const setup = { kind: 'sweep', design: { path: 'unused.yaml', text: '' }, overrides: [], axes: [], model: {} } as const;

describe('runParallel', () => {
  it('runs every task on the calling thread with one thread, in task order, and ends done', async () => {
    const seen: Array<[number, number]> = [];
    const end = await runParallel({
      setup,
      tasks: [3, 1, 2],
      threads: 1,
      local: (t: number) => t * 10,
      onResult: (r, i) => seen.push([r, i]),
    });
    expect(end).toBe('done');
    expect(seen).toEqual([
      [30, 0],
      [10, 1],
      [20, 2],
    ]);
  });

  it('stops between tasks on SIGINT, keeping the results delivered before it', async () => {
    const seen: number[] = [];
    const end = await runParallel({
      setup,
      tasks: [0, 1, 2, 3],
      threads: 1,
      local: (t: number) => t,
      onResult: (r) => {
        seen.push(r);
        if (r === 1) process.emit('SIGINT');
      },
    });
    expect(end).toBe('interrupted');
    expect(seen).toEqual([0, 1]);
    expect(process.listenerCount('SIGINT')).toBe(0);
  });

  it('passes a failing task on as its error and removes its SIGINT listener', async () => {
    const failing = runParallel({
      setup,
      tasks: [0],
      threads: 1,
      local: () => {
        throw new Error('task failed');
      },
      onResult: () => undefined,
    });
    await expect(failing).rejects.toThrow('task failed');
    expect(process.listenerCount('SIGINT')).toBe(0);
  });
});
