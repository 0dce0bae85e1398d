import { describe, it, expect } from 'vitest';
import { EventQueue } from '../../src/sim/queue.js';

function drain(q: EventQueue): Array<[number, number, number]> {
  const out: Array<[number, number, number]> = [];
  while (q.length > 0) {
    out.push([q.peekTime(), q.peekSeq(), q.peekNet()]);
    q.pop();
  }
  return out;
}

/** A small deterministic generator (Park-Miller minimal standard) so the test is reproducible. */
function lcg(seed: number): () => number {
  let state = seed;
  return () => {
    state = (state * 16807) % 2147483647;
    return state / 2147483647;
  };
}

describe('EventQueue', () => {
  it('pops in time order', () => {
    const q = new EventQueue(4);
    [
      [3e-9, 1, 30],
      [1e-9, 2, 10],
      [2e-9, 3, 20],
      [0.5e-9, 4, 5],
    ].forEach(([t, s, n]) => {
      q.push(t!, s!, n!);
    });
    expect(drain(q).map((e) => e[2])).toEqual([5, 10, 20, 30]);
  });

  it('breaks ties in time by sequence number, whatever the push order', () => {
    const q = new EventQueue(2);
    for (const seq of [5, 2, 9, 1, 7]) q.push(1e-9, seq, seq * 10);
    expect(drain(q).map((e) => e[1])).toEqual([1, 2, 5, 7, 9]);
  });

  it('grows past its initial capacity and keeps every event', () => {
    const q = new EventQueue(1);
    for (let i = 0; i < 1000; i++) q.push(1000 - i, i, i);
    expect(q.length).toBe(1000);
    const out = drain(q);
    expect(out).toHaveLength(1000);
    expect(out[0]).toEqual([1, 999, 999]);
    expect(out[999]).toEqual([1000, 0, 0]);
  });

  it('agrees with a sort by (time, seq) on a random mix of interleaved pushes and pops', () => {
    const random = lcg(12345);
    const q = new EventQueue(8);
    const reference: Array<[number, number, number]> = [];
    const popped: Array<[number, number, number]> = [];
    const expected: Array<[number, number, number]> = [];
    const order = (a: [number, number, number], b: [number, number, number]) => a[0] - b[0] || a[1] - b[1];
    let seq = 0;
    for (let step = 0; step < 5000; step++) {
      if (random() < 0.6 || q.length === 0) {
        // Coarse times so that ties are frequent.
        const event: [number, number, number] = [Math.floor(random() * 50), ++seq, Math.floor(random() * 100)];
        q.push(...event);
        reference.push(event);
      } else {
        reference.sort(order);
        expected.push(reference.shift()!);
        popped.push([q.peekTime(), q.peekSeq(), q.peekNet()]);
        q.pop();
      }
    }
    expect(popped.length).toBeGreaterThan(1000);
    expect(popped).toEqual(expected);
  });

  it('is empty after clear', () => {
    const q = new EventQueue();
    q.push(1, 1, 1);
    q.push(2, 2, 2);
    q.clear();
    expect(q.length).toBe(0);
    q.push(5, 3, 7);
    expect(drain(q)).toEqual([[5, 3, 7]]);
  });
});
