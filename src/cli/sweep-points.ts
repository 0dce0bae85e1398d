/** Building and evaluating sweep points from the raw design text (shared by the command and its threads). */
import { applyOverrides } from './overrides.js';
import { designData, loadProcess, loadModel, type DesignSource, type ModelOptions } from './load.js';
import { cornersSchema, designSchema } from '../schema/design.js';
import { expandCorners } from '../process/corners.js';
import { CORNER_AXES } from '../analysis/sweep.js';
import type { ResolvedDesign } from '../analysis/resolve.js';
import { parseWith } from '../schema/validate.js';
import { resolveDesign } from '../analysis/resolve.js';
import { evaluateAll } from '../analysis/evaluate.js';
import {
  gridPoint,
  pointOverrides,
  summarizePoint,
  sweepColumns,
  type SweepAxis,
  type SweepColumns,
  type SweepRow,
} from '../analysis/sweep.js';
import { InputError } from '../errors.js';
import { dirname, resolve } from 'node:path';
import type { ProcessCard } from '../schema/process.js';
import { warningLine } from './warn.js';

export interface SweepSetup {
  /** The design's path and the text read from it (workers parse the text: standard input cannot be read twice). */
  readonly design: DesignSource;
  readonly overrides: readonly string[];
  readonly axes: readonly SweepAxis[];
  /** The global --model / --tables choice. */
  readonly model: ModelOptions;
}

interface Prepared {
  readonly raw: unknown;
  readonly cards: Map<string, ProcessCard>;
  /** The design resolved for the last combination of design-path values (corner axes vary fastest). */
  last: { key: string; resolved: ResolvedDesign } | null;
}

const prepared = new WeakMap<SweepSetup, Prepared>();

function prepare(setup: SweepSetup): Prepared {
  let p = prepared.get(setup);
  if (!p) {
    p = { raw: applyOverrides(designData(setup.design), setup.overrides), cards: new Map(), last: null };
    prepared.set(setup, p);
  }
  return p;
}

/** A grid point reports checks only: the circuit figures no requirement is checked on are left out. */
const POINT_REUSE = { borrowScratch: false, warmStart: false, circuit: 'checked-figures' } as const;

const isCornerAxis = (path: string) => (CORNER_AXES as readonly string[]).includes(path);

function resolveFor(setup: SweepSetup, p: Prepared, sets: readonly string[]): ResolvedDesign {
  const key = sets.join('\n');
  if (p.last?.key === key) return p.last.resolved;
  const design = parseWith(designSchema, applyOverrides(p.raw, sets));
  let card: ProcessCard;
  let cardDir = dirname(resolve(setup.design.path));
  if (typeof design.process === 'string') {
    const path = resolve(dirname(setup.design.path), design.process);
    card = p.cards.get(path) ?? loadProcess(path, ['process']);
    p.cards.set(path, card);
    cardDir = dirname(path);
  } else card = design.process;
  const resolved = resolveDesign(
    design,
    card,
    loadModel(card, cardDir, setup.model, (m) => process.stderr.write(warningLine(m))),
  );
  p.last = { key, resolved };
  return resolved;
}

/**
 * Evaluates one grid point; an invalid point is an InputError naming the axis. Design paths
 * re-resolve the design (cached while only corner axes change); corner axes only re-expand the
 * corner set.
 */
export function sweepPoint(setup: SweepSetup, index: number): SweepRow {
  const p = prepare(setup);
  const values = gridPoint(setup.axes, index);
  const sets = pointOverrides(setup.axes, values);
  try {
    const designSets = sets.filter((_, i) => !isCornerAxis(setup.axes[i]!.path));
    const base = resolveFor(setup, p, designSets);
    const cornerAxes = setup.axes.map((a, i) => ({ a, v: values[i]! })).filter(({ a }) => isCornerAxis(a.path));
    if (cornerAxes.length === 0) return summarizePoint(index, values, evaluateAll(base, POINT_REUSE));
    const spec = { ...rawCorners(p.raw), ...Object.fromEntries(cornerAxes.map(({ a, v }) => [a.path, [v]])) };
    const corners = expandCorners(parseWith(cornersSchema, spec, ['corners']), base.card, base.design.clock.duty);
    return summarizePoint(index, values, evaluateAll({ ...base, corners }, POINT_REUSE));
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    const where = setup.axes.map((a, i) => `${a.path}=${values[i]}`).join(', ');
    throw new InputError(error.issues.map((issue) => ({ ...issue, expected: `${issue.expected} (at sweep point ${where})` })));
  }
}

/** The columns a row of grid point `index` can fill (they depend on the design-path axes only). */
export function pointColumns(setup: SweepSetup, index: number): SweepColumns {
  const p = prepare(setup);
  const sets = pointOverrides(setup.axes, gridPoint(setup.axes, index));
  return sweepColumns(
    resolveFor(
      setup,
      p,
      sets.filter((_, i) => !isCornerAxis(setup.axes[i]!.path)),
    ),
  );
}

function rawCorners(raw: unknown): Record<string, unknown> {
  const corners = (raw as { corners?: unknown }).corners;
  return corners !== null && typeof corners === 'object' ? { ...(corners as Record<string, unknown>) } : {};
}

export function sweepRows(setup: SweepSetup, start: number, count: number): SweepRow[] {
  const rows: SweepRow[] = [];
  for (let i = start; i < start + count; i++) rows.push(sweepPoint(setup, i));
  return rows;
}
