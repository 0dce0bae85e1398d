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
    const net = new Int32Array(cap);
    net.set(this.net);
    this.net = net;
    const time = new Float64Array(cap);
    time.set(this.time);
    this.time = time;
    const rising = new Uint8Array(cap);
    rising.set(this.rising);
    this.rising = rising;
    const transition = new Float64Array(cap);
    transition.set(this.transition);
    this.transition = transition;
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
