/**
 * A cache keyed by two objects, held weakly: a value lives as long as both its keys (a card and
 * a netlist, a corner's devices and a sizing). The core's per-corner results that every die and
 * every sweep point asks for again are kept here.
 */
export class PairCache<A extends object, B extends object, V> {
  private readonly outer = new WeakMap<A, WeakMap<B, V>>();

  /** The value for (a, b), made by `make` the first time it is asked for. */
  get(a: A, b: B, make: () => V): V {
    let inner = this.outer.get(a);
    if (!inner) {
      inner = new WeakMap();
      this.outer.set(a, inner);
    }
    let value = inner.get(b);
    if (value === undefined) {
      value = make();
      inner.set(b, value);
    }
    return value;
  }
}
