/**
 * A YAML document as an editable tree that can say what plain data cannot: duplicate keys, keys
 * named __proto__, anchors and aliases, and raw scalars such as 1e400 that JavaScript would round
 * before they reach the file. Emitted as flow YAML (JSON-like, one line) so every edit is exact.
 */

export type Node =
  | { readonly kind: 'map'; readonly entries: Array<[string, Node]> }
  | { readonly kind: 'seq'; readonly items: Node[] }
  | { readonly kind: 'scalar'; readonly value: string | number | boolean | null }
  | { readonly kind: 'raw'; readonly text: string }
  | { readonly kind: 'anchor'; readonly name: string; readonly node: Node }
  | { readonly kind: 'alias'; readonly name: string };

export const scalar = (value: string | number | boolean | null): Node => ({ kind: 'scalar', value });
export const raw = (text: string): Node => ({ kind: 'raw', text });

/** The tree of plain parsed data (objects keep their key order). */
export function fromValue(value: unknown): Node {
  if (Array.isArray(value)) return { kind: 'seq', items: value.map(fromValue) };
  if (value !== null && typeof value === 'object') {
    return { kind: 'map', entries: Object.entries(value as Record<string, unknown>).map(([k, v]) => [k, fromValue(v)]) };
  }
  if (typeof value === 'string' || typeof value === 'number' || typeof value === 'boolean' || value === null) return scalar(value);
  return scalar(String(value));
}

export function clone(node: Node): Node {
  switch (node.kind) {
    case 'map':
      return { kind: 'map', entries: node.entries.map(([k, v]) => [k, clone(v)]) };
    case 'seq':
      return { kind: 'seq', items: node.items.map(clone) };
    case 'anchor':
      return { kind: 'anchor', name: node.name, node: clone(node.node) };
    default:
      return node;
  }
}

function emitNumber(n: number): string {
  if (Number.isNaN(n)) return '.nan';
  if (n === Infinity) return '.inf';
  if (n === -Infinity) return '-.inf';
  if (Object.is(n, -0)) return '-0.0';
  return String(n);
}

/** Flow YAML; strings are JSON-quoted, which YAML's double-quoted style reads back exactly. */
export function emit(node: Node): string {
  switch (node.kind) {
    case 'map':
      return `{${node.entries.map(([k, v]) => `${JSON.stringify(k)}: ${emit(v)}`).join(', ')}}`;
    case 'seq':
      return `[${node.items.map(emit).join(', ')}]`;
    case 'raw':
      return node.text;
    case 'anchor':
      return `&${node.name} ${emit(node.node)}`;
    case 'alias':
      return `*${node.name}`;
    case 'scalar': {
      const v = node.value;
      if (typeof v === 'number') return emitNumber(v);
      if (typeof v === 'string') return JSON.stringify(v);
      return String(v);
    }
  }
}

/** A place in the tree: the container holding it and its index there. */
export interface Slot {
  readonly parent: Node & { kind: 'map' | 'seq' };
  readonly index: number;
  /** Document order position, for anchors that must precede their aliases. */
  readonly order: number;
}

/** Every slot in document order (the root itself has no slot). Anchored nodes are entered. */
export function slots(root: Node): Slot[] {
  const out: Slot[] = [];
  const walk = (node: Node): void => {
    const inner = node.kind === 'anchor' ? node.node : node;
    if (inner.kind === 'map') {
      inner.entries.forEach(([, v], index) => {
        out.push({ parent: inner, index, order: out.length });
        walk(v);
      });
    } else if (inner.kind === 'seq') {
      inner.items.forEach((v, index) => {
        out.push({ parent: inner, index, order: out.length });
        walk(v);
      });
    }
  };
  walk(root);
  return out;
}

export function getSlot(slot: Slot): Node {
  return slot.parent.kind === 'map' ? slot.parent.entries[slot.index]![1] : slot.parent.items[slot.index]!;
}

export function setSlot(slot: Slot, node: Node): void {
  if (slot.parent.kind === 'map') slot.parent.entries[slot.index]![1] = node;
  else slot.parent.items[slot.index] = node;
}

export function deleteSlot(slot: Slot): void {
  if (slot.parent.kind === 'map') slot.parent.entries.splice(slot.index, 1);
  else slot.parent.items.splice(slot.index, 1);
}

/** Replaces every string equal to `from`, as a value or as a key, anywhere in the tree. */
export function renameEverywhere(node: Node, from: string, to: string): void {
  if (node.kind === 'map') {
    node.entries.forEach((entry) => {
      if (entry[0] === from) entry[0] = to;
      const v = entry[1];
      if (v.kind === 'scalar' && v.value === from) entry[1] = scalar(to);
      else renameEverywhere(v, from, to);
    });
  } else if (node.kind === 'seq') {
    node.items.forEach((v, i) => {
      if (v.kind === 'scalar' && v.value === from) node.items[i] = scalar(to);
      else renameEverywhere(v, from, to);
    });
  } else if (node.kind === 'anchor') {
    renameEverywhere(node.node, from, to);
  }
}

/** Every distinct string value and key in the tree, in document order. */
export function strings(node: Node, out: string[] = []): string[] {
  const add = (s: string) => {
    if (!out.includes(s)) out.push(s);
  };
  if (node.kind === 'map')
    for (const [k, v] of node.entries) {
      add(k);
      strings(v, out);
    }
  else if (node.kind === 'seq') for (const v of node.items) strings(v, out);
  else if (node.kind === 'anchor') strings(node.node, out);
  else if (node.kind === 'scalar' && typeof node.value === 'string') add(node.value);
  return out;
}
