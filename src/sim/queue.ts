/**
 * A binary min-heap of events in typed arrays, ordered by time and then by sequence number, so
 * simultaneous events pop in the order they were scheduled (a fixed, reproducible tie-break).
 * Stale entries are skipped by the caller (lazy deletion); nothing is allocated per event.
 */
export class EventQueue {
  private time: Float64Array;
  private seq: Float64Array;
  private net: Int32Array;
  private size = 0;

  constructor(capacity = 64) {
    this.time = new Float64Array(capacity);
    this.seq = new Float64Array(capacity);
    this.net = new Int32Array(capacity);
  }

  get length(): number {
    return this.size;
  }

  clear(): void {
    this.size = 0;
  }

  push(time: number, seq: number, net: number): void {
    if (this.size === this.time.length) this.grow();
    let i = this.size++;
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (!this.before(time, seq, this.time[parent]!, this.seq[parent]!)) break;
      this.time[i] = this.time[parent]!;
      this.seq[i] = this.seq[parent]!;
      this.net[i] = this.net[parent]!;
      i = parent;
    }
    this.time[i] = time;
    this.seq[i] = seq;
    this.net[i] = net;
  }

  /** Time of the earliest event; only valid when length > 0. */
  peekTime(): number {
    return this.time[0]!;
  }

  peekSeq(): number {
    return this.seq[0]!;
  }

  peekNet(): number {
    return this.net[0]!;
  }

  pop(): void {
    const last = --this.size;
    if (last <= 0) return;
    const t = this.time[last]!;
    const s = this.seq[last]!;
    const n = this.net[last]!;
    let i = 0;
    for (;;) {
      const left = 2 * i + 1;
      if (left >= last) break;
      const right = left + 1;
      const child = right < last && this.before(this.time[right]!, this.seq[right]!, this.time[left]!, this.seq[left]!) ? right : left;
      if (!this.before(this.time[child]!, this.seq[child]!, t, s)) break;
      this.time[i] = this.time[child]!;
      this.seq[i] = this.seq[child]!;
      this.net[i] = this.net[child]!;
      i = child;
    }
    this.time[i] = t;
    this.seq[i] = s;
    this.net[i] = n;
  }

  private before(t1: number, s1: number, t2: number, s2: number): boolean {
    return t1 < t2 || (t1 === t2 && s1 < s2);
  }

  private grow(): void {
    const cap = this.time.length * 2;
    const time = new Float64Array(cap);
    const seq = new Float64Array(cap);
    const net = new Int32Array(cap);
    time.set(this.time);
    seq.set(this.seq);
    net.set(this.net);
    this.time = time;
    this.seq = seq;
    this.net = net;
  }
}
