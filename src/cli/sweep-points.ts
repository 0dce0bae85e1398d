/** Building and evaluating sweep points from the raw design text (shared by the command and its threads). */
import { applyOverrides } from './overrides.js';
import { readDataFile, loadProcess } from './load.js';
import { designSchema } from '../schema/design.js';
import { parseWith } from '../schema/validate.js';
import { resolveDesign } from '../analysis/resolve.js';
import { evaluateAll } from '../analysis/evaluate.js';
import { gridPoint, pointOverrides, summarizePoint, type SweepAxis, type SweepRow } from '../analysis/sweep.js';
import { InputError } from '../errors.js';
import { dirname, resolve } from 'node:path';
import type { ProcessCard } from '../schema/process.js';

export interface SweepSetup {
  readonly designPath: string;
  readonly overrides: readonly string[];
  readonly axes: readonly SweepAxis[];
}

interface Prepared {
  readonly raw: unknown;
  readonly cards: Map<string, ProcessCard>;
}

const prepared = new WeakMap<SweepSetup, Prepared>();

function prepare(setup: SweepSetup): Prepared {
  let p = prepared.get(setup);
  if (!p) {
    p = { raw: applyOverrides(readDataFile(setup.designPath, 'DESIGN'), setup.overrides), cards: new Map() };
    prepared.set(setup, p);
  }
  return p;
}

/** Evaluates one grid point; an invalid point is an InputError naming the axis. */
export function sweepPoint(setup: SweepSetup, index: number): SweepRow {
  const p = prepare(setup);
  const values = gridPoint(setup.axes, index);
  const sets = pointOverrides(setup.axes, values);
  let resolved;
  try {
    const design = parseWith(designSchema, applyOverrides(p.raw, sets));
    let card: ProcessCard;
    if (typeof design.process === 'string') {
      const path = resolve(dirname(setup.designPath), design.process);
      card = p.cards.get(path) ?? loadProcess(path, 'process');
      p.cards.set(path, card);
    } else card = design.process;
    resolved = resolveDesign(design, card);
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    const where = setup.axes.map((a, i) => `${a.path}=${values[i]}`).join(', ');
    throw new InputError(error.issues.map((issue) => ({ ...issue, allowed: `${issue.allowed} (at sweep point ${where})` })));
  }
  return summarizePoint(index, values, evaluateAll(resolved));
}

export function sweepRows(setup: SweepSetup, start: number, count: number): SweepRow[] {
  const rows: SweepRow[] = [];
  for (let i = start; i < start + count; i++) rows.push(sweepPoint(setup, i));
  return rows;
}
