/**
 * Mutations of a YAML file as plain data (a plan), so fast-check can generate, print and shrink
 * them; `applyPlan` turns a plan and a base file into the mutated text. Slot and string choices are
 * whole numbers taken modulo what the tree holds at that moment.
 */
import fc from 'fast-check';
import { parse, stringify } from 'yaml';
import { hostileString, hostileValue, KEYS } from './hostile.js';
import {
  clone,
  deleteSlot,
  emit,
  fromValue,
  getSlot,
  raw,
  renameEverywhere,
  scalar,
  setSlot,
  slots,
  strings,
  type Node,
} from './yaml-tree.js';

export type TreeOp =
  | { op: 'replace'; at: number; value: Node }
  | { op: 'replaceString'; at: number; value: string }
  | { op: 'renameEverywhere'; at: number; value: string }
  | { op: 'delete'; at: number }
  | { op: 'duplicateKey'; at: number; value: Node }
  | { op: 'renameKey'; at: number; key: string }
  | { op: 'addKey'; at: number; key: string; value: Node }
  | { op: 'swapType'; at: number; to: 'string' | 'number' | 'list' | 'map' | 'bool' }
  | { op: 'longList'; at: number; length: number }
  | { op: 'deepNest'; at: number; depth: number; shape: 'seq' | 'map' }
  | { op: 'alias'; from: number; to: number }
  | { op: 'aliasBomb'; at: number; levels: number; width: number };

export type TextOp =
  | { op: 'flip'; at: number; byte: number }
  | { op: 'truncate'; at: number }
  | { op: 'insert'; at: number; text: string }
  | { op: 'cut'; at: number; length: number };

export interface Plan {
  readonly tree: readonly TreeOp[];
  readonly text: readonly TextOp[];
  /** Block YAML from the yaml library when the tree holds nothing only flow text can say. */
  readonly block: boolean;
}

const at = fc.nat({ max: 10_000 });

export const treeOp: fc.Arbitrary<TreeOp> = fc.oneof(
  { weight: 4, arbitrary: fc.record({ op: fc.constant('replace' as const), at, value: hostileValue }) },
  { weight: 4, arbitrary: fc.record({ op: fc.constant('replaceString' as const), at, value: hostileString }) },
  { weight: 5, arbitrary: fc.record({ op: fc.constant('renameEverywhere' as const), at, value: hostileString }) },
  { weight: 2, arbitrary: fc.record({ op: fc.constant('delete' as const), at }) },
  { weight: 1, arbitrary: fc.record({ op: fc.constant('duplicateKey' as const), at, value: hostileValue }) },
  {
    weight: 2,
    arbitrary: fc.record({ op: fc.constant('renameKey' as const), at, key: fc.oneof(fc.constantFrom(...KEYS), hostileString) }),
  },
  {
    weight: 2,
    arbitrary: fc.record({
      op: fc.constant('addKey' as const),
      at,
      key: fc.constantFrom(...KEYS),
      value: fc.oneof(hostileValue, fc.constant(raw('{polluted: true, isAdmin: 1}'))),
    }),
  },
  {
    weight: 2,
    arbitrary: fc.record({
      op: fc.constant('swapType' as const),
      at,
      to: fc.constantFrom('string' as const, 'number' as const, 'list' as const, 'map' as const, 'bool' as const),
    }),
  },
  {
    weight: 1,
    arbitrary: fc.record({ op: fc.constant('longList' as const), at, length: fc.constantFrom(0, 1, 2, 17, 1000, 10_000, 100_000) }),
  },
  {
    weight: 1,
    arbitrary: fc.record({
      op: fc.constant('deepNest' as const),
      at,
      depth: fc.constantFrom(2, 64, 1000, 10_000),
      shape: fc.constantFrom('seq' as const, 'map' as const),
    }),
  },
  { weight: 1, arbitrary: fc.record({ op: fc.constant('alias' as const), from: at, to: at }) },
  {
    weight: 1,
    arbitrary: fc.record({
      op: fc.constant('aliasBomb' as const),
      at,
      levels: fc.integer({ min: 1, max: 12 }),
      width: fc.integer({ min: 2, max: 10 }),
    }),
  },
);

export const textOp: fc.Arbitrary<TextOp> = fc.oneof(
  fc.record({ op: fc.constant('flip' as const), at, byte: fc.integer({ min: 0, max: 255 }) }),
  fc.record({ op: fc.constant('truncate' as const), at }),
  fc.record({
    op: fc.constant('insert' as const),
    at,
    text: fc.oneof(
      hostileString,
      fc.constantFrom(': ', '- ', '&a ', '*a', '!!', '%YAML 1.1\n', '---\n', '...\n', '{', '[', '"', "'", '\t', '? ', '<<: *a\n'),
    ),
  }),
  fc.record({ op: fc.constant('cut' as const), at, length: fc.integer({ min: 1, max: 200 }) }),
);

const renames = fc.array(fc.record({ op: fc.constant('renameEverywhere' as const), at, value: hostileString }), {
  minLength: 1,
  maxLength: 3,
});

/** Half the plans only rename (names stay consistent, so the file still validates and the name reaches every output). */
export const plan: fc.Arbitrary<Plan> = fc.oneof(
  fc.record({ tree: renames as fc.Arbitrary<TreeOp[]>, text: fc.constant([]), block: fc.boolean() }),
  fc.record({
    tree: fc.array(treeOp, { minLength: 0, maxLength: 4 }),
    text: fc.oneof({ weight: 6, arbitrary: fc.constant([]) }, { weight: 1, arbitrary: fc.array(textOp, { minLength: 1, maxLength: 3 }) }),
    block: fc.boolean(),
  }),
);

function swapType(node: Node, to: 'string' | 'number' | 'list' | 'map' | 'bool'): Node {
  const text = node.kind === 'scalar' ? String(node.value) : emit(node);
  switch (to) {
    case 'string':
      return scalar(text);
    case 'number':
      return node.kind === 'scalar' && typeof node.value === 'string' ? raw(String(parseFloat(node.value))) : raw('42');
    case 'list':
      return { kind: 'seq', items: [node] };
    case 'map':
      return { kind: 'map', entries: [['value', node]] };
    case 'bool':
      return scalar(true);
  }
}

function nest(depth: number, shape: 'seq' | 'map'): Node {
  // Built as raw text: a tree this deep would overflow the emitter's own recursion.
  return shape === 'seq' ? raw(`${'['.repeat(depth)}1${']'.repeat(depth)}`) : raw(`${'{a: '.repeat(depth)}1${'}'.repeat(depth)}`);
}

function bomb(levels: number, width: number, tag: number): Node {
  const parts = [`&b${tag}_0 [pgx, pgx]`];
  for (let l = 1; l <= levels; l++)
    parts.push(
      `&b${tag}_${l} [${Array(width)
        .fill(`*b${tag}_${l - 1}`)
        .join(', ')}]`,
    );
  return raw(`[${parts.join(', ')}]`);
}

function applyTreeOp(root: Node, op: TreeOp, index: number): void {
  const all = slots(root);
  if (op.op === 'renameEverywhere' || op.op === 'replaceString') {
    // Renaming targets name-like values (nets, gates, switches, the design name) so the new name stays consistent.
    const names =
      op.op === 'renameEverywhere'
        ? strings(root).filter(
            (s) =>
              /^[\w.-]{1,40}$/.test(s) &&
              slots(root).some((sl) => {
                const n = getSlot(sl);
                return n.kind === 'scalar' && n.value === s;
              }),
          )
        : ['-'];
    if (names.length === 0) return;
    if (op.op === 'renameEverywhere') {
      renameEverywhere(root, names[op.at % names.length]!, op.value);
      return;
    }
    const stringSlots = all.filter((s) => {
      const n = getSlot(s);
      return n.kind === 'scalar' && typeof n.value === 'string';
    });
    if (stringSlots.length > 0) setSlot(stringSlots[op.at % stringSlots.length]!, scalar(op.value));
    return;
  }
  if (op.op === 'alias') {
    if (all.length < 2) return;
    const [a, b] = [all[op.from % all.length]!, all[op.to % all.length]!].sort((x, y) => x.order - y.order) as [
      (typeof all)[0],
      (typeof all)[0],
    ];
    const name = `a${index}`;
    const target = getSlot(a);
    setSlot(a, { kind: 'anchor', name, node: target });
    setSlot(b, { kind: 'alias', name });
    return;
  }
  if (all.length === 0) return;
  const slot = all[op.at % all.length]!;
  const node = getSlot(slot);
  switch (op.op) {
    case 'replace':
      setSlot(slot, op.value);
      break;
    case 'delete':
      deleteSlot(slot);
      break;
    case 'swapType':
      setSlot(slot, swapType(node, op.to));
      break;
    case 'longList': {
      // At most about 5 MB of text: long enough to hurt a quadratic loop, short enough to write.
      const length = Math.min(op.length, Math.floor(5e6 / Math.max(1, emit(node).length)));
      // Copies, not one shared node: a later operation inside one item must not repeat in every
      // item (a list of 10,000 shared items each grown to 100,000 made 1e9 and exhausted the harness).
      setSlot(slot, { kind: 'seq', items: Array.from({ length }, () => clone(node)) });
      break;
    }
    case 'deepNest':
      setSlot(slot, nest(op.depth, op.shape));
      break;
    case 'aliasBomb':
      setSlot(slot, bomb(op.levels, op.width, index));
      break;
    case 'duplicateKey':
      if (slot.parent.kind === 'map') slot.parent.entries.splice(slot.index + 1, 0, [slot.parent.entries[slot.index]![0], op.value]);
      else slot.parent.items.splice(slot.index + 1, 0, op.value);
      break;
    case 'renameKey':
      if (slot.parent.kind === 'map') slot.parent.entries[slot.index]![0] = op.key;
      break;
    case 'addKey': {
      const map = node.kind === 'map' ? node : slot.parent.kind === 'map' ? slot.parent : undefined;
      map?.entries.push([op.key, op.value]);
      break;
    }
  }
}

function onlyPlain(node: Node): boolean {
  if (node.kind === 'map')
    return node.entries.every(([, v]) => onlyPlain(v)) && new Set(node.entries.map(([k]) => k)).size === node.entries.length;
  if (node.kind === 'seq') return node.items.every(onlyPlain);
  return node.kind === 'scalar';
}

function toPlain(node: Node): unknown {
  if (node.kind === 'map') {
    const out: Record<string, unknown> = {};
    for (const [k, v] of node.entries)
      Object.defineProperty(out, k, { value: toPlain(v), enumerable: true, writable: true, configurable: true });
    return out;
  }
  if (node.kind === 'seq') return node.items.map(toPlain);
  return node.kind === 'scalar' ? node.value : undefined;
}

function applyTextOp(bytes: Buffer, op: TextOp): Buffer {
  const pos = bytes.length === 0 ? 0 : op.at % bytes.length;
  switch (op.op) {
    case 'flip': {
      const copy = Buffer.from(bytes);
      if (copy.length > 0) copy[pos] = op.byte;
      return copy;
    }
    case 'truncate':
      return bytes.subarray(0, pos);
    case 'insert':
      return Buffer.concat([bytes.subarray(0, pos), Buffer.from(op.text, 'utf8'), bytes.subarray(pos)]);
    case 'cut':
      return Buffer.concat([bytes.subarray(0, pos), bytes.subarray(pos + op.length)]);
  }
}

/** Optional edit applied before the plan: the design keeps only its first corner of each axis (fast runs). */
export function oneCorner(root: Node): void {
  if (root.kind !== 'map') return;
  const corners = root.entries.find(([k]) => k === 'corners')?.[1];
  if (corners?.kind !== 'map') return;
  for (const entry of corners.entries) {
    const v = entry[1];
    if (v.kind === 'seq' && v.items.length > 1) {
      // The nominal supply sits in the middle of the shipped lists.
      entry[1] = { kind: 'seq', items: [v.items[entry[0] === 'vdd' ? Math.floor(v.items.length / 2) : 0]!] };
    }
  }
}

/** The mutated file's bytes (text edits work on bytes, so they can leave invalid UTF-8). */
export function applyPlan(baseText: string, p: Plan, prepare?: (root: Node) => void): Buffer {
  const root = clone(fromValue(parse(baseText)));
  prepare?.(root);
  p.tree.forEach((op, i) => {
    applyTreeOp(root, op, i);
  });
  const text = p.block && onlyPlain(root) ? stringify(toPlain(root)) : `${emit(root)}\n`;
  let bytes: Buffer = Buffer.from(text, 'utf8');
  for (const op of p.text) bytes = applyTextOp(bytes, op);
  return bytes;
}
