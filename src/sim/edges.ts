/** A growable list of net transitions (50 % time, direction, transition time) in typed arrays. */
export class EdgeBuffer {
  net: Int32Array;
  time: Float64Array;
  rising: Uint8Array;
  transition: Float64Array;
  count = 0;

  constructor(capacity = 64) {
    this.net = new Int32Array(capacity);
    this.time = new Float64Array(capacity);
    this.rising = new Uint8Array(capacity);
    this.transition = new Float64Array(capacity);
  }

  clear(): void {
    this.count = 0;
  }

  push(net: number, time: number, rising: number, transition: number): void {
    if (this.count === this.net.length) this.grow();
    const i = this.count++;
    this.net[i] = net;
    this.time[i] = time;
    this.rising[i] = rising;
    this.transition[i] = transition;
  }

  /** An exact-size copy, safe to hand out of the simulator. */
  snapshot(): Edges {
    return {
      count: this.count,
      net: this.net.slice(0, this.count),
      time: this.time.slice(0, this.count),
      rising: this.rising.slice(0, this.count),
      transition: this.transition.slice(0, this.count),
    };
  }

  private grow(): void {
    const cap = this.net.length * 2;
    this.net = grown(this.net, cap);
    this.time = grown(this.time, cap);
    this.rising = grown(this.rising, cap);
    this.transition = grown(this.transition, cap);
  }
}

/** Transitions of one simulated period, in the order they happened. */
export interface Edges {
  readonly count: number;
  /** Net index of each transition. */
  readonly net: Int32Array;
  /** 50 % crossing time, s (absolute simulation time). */
  readonly time: Float64Array;
  /** 1 for a rising transition, 0 for falling. */
  readonly rising: Uint8Array;
  /** Full-swing transition time, s. */
  readonly transition: Float64Array;
}

/** A copy of `old` in a new array of the same type and `length` elements. */
function grown<T extends Int32Array | Float64Array | Uint8Array>(old: T, length: number): T {
  const next = new (old.constructor as new (length: number) => T)(length);
  next.set(old);
  return next;
}
