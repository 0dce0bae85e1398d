/**
 * `phasegap sweep DESIGN --vary AXIS=VALUES ...`: a grid over corner axes and design paths, one
 * worst-case row per point, streamed in grid order as points finish. With -o the rows go to a temp
 * file renamed into place at the end; Ctrl-C keeps the complete rows written so far.
 */
import { availableParallelism } from 'node:os';
import { closeSync, openSync, renameSync, unlinkSync, writeSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { gridSize, parseAxis, CORNER_AXES, type SweepAxis, type SweepRow } from '../../analysis/sweep.js';
import { csvHeader, csvRow, jsonRow } from '../../report/sweep-format.js';
import { inputError } from '../../errors.js';
import type { Io } from '../io.js';
import { loadDesign, type ModelOptions } from '../load.js';
import { runPool } from '../pool.js';
import { progressBar } from '../progress.js';
import { sweepPoint, sweepRows, type SweepSetup } from '../sweep-points.js';
import { wholeNumber } from './mc.js';

export interface SweepOptions extends ModelOptions {
  readonly set: readonly string[];
  readonly vary: readonly string[];
  readonly json: boolean;
  readonly out?: string;
  readonly workers?: string;
}

/** Points per task handed to a thread. */
const POINTS_PER_TASK = 4;

/** Writes to stdout, or appends to a temp file that becomes `out` when the sweep ends. */
function sink(io: Io, out: string | undefined) {
  if (out === undefined || out === '-') return { write: (t: string) => io.stdout(t), finish: () => undefined, abandon: () => undefined };
  const temp = join(dirname(out), `.${basename(out)}.${process.pid}.tmp`);
  let fd: number;
  try {
    fd = openSync(temp, 'w');
  } catch (error) {
    throw inputError('--out', out, `cannot be written (${(error as NodeJS.ErrnoException).code ?? 'error'}); check that the folder exists and is writable`);
  }
  return {
    write: (t: string) => { writeSync(fd, t); },
    finish: () => { closeSync(fd); renameSync(temp, out); },
    abandon: () => { closeSync(fd); unlinkSync(temp); },
  };
}

/** Every axis value on its own, so a bad value is reported before any row is written. */
function checkAxes(setup: SweepSetup): void {
  setup.axes.forEach((axis, a) => {
    const names = setup.axes.map((x) => x.path);
    if (names.indexOf(axis.path) !== a) throw inputError('--vary', axis.path, 'is given twice; vary each axis once');
    axis.values.forEach((_, k) => {
      const single: SweepAxis[] = setup.axes.map((x, i) => (i === a ? { path: x.path, values: [x.values[k]!] } : { path: x.path, values: [x.values[0]!] }));
      sweepPoint({ ...setup, axes: single }, 0);
    });
  });
}

export async function runSweep(io: Io, designPath: string, options: SweepOptions): Promise<number> {
  if (options.vary.length === 0) throw inputError('--vary', undefined, 'is required at least once: AXIS=LIST or AXIS=START:STOP:N, e.g. --vary vdd=1.6:2.0:5');
  const { design } = loadDesign(designPath, options.set);
  const axes = options.vary.map(parseAxis);
  for (const axis of axes) {
    if ((CORNER_AXES as readonly string[]).includes(axis.path) && design.corners.list) {
      throw inputError(`--vary ${axis.path}`, axis.path, 'cannot vary a corner axis when the design lists its corners explicitly (corners.list)');
    }
  }
  const setup: SweepSetup = { designPath, overrides: options.set, axes, model: { model: options.model, tables: options.tables } };
  checkAxes(setup);
  const total = gridSize(axes);
  const threads = wholeNumber('--workers', options.workers, 1, availableParallelism());
  const out = sink(io, options.out);
  const bar = progressBar(io, total, 'sweep', !options.json);
  let first: SweepRow | null = null;
  let written = 0;
  let failures = 0;
  const emitRow = (row: SweepRow) => {
    if (first === null) {
      first = row;
      if (!options.json) out.write(csvHeader(axes, row));
    }
    out.write(options.json ? jsonRow(row, axes, written === 0) : csvRow(row, first));
    if (row.verdict === 'fail') failures++;
    written++;
    bar.update(written);
  };
  let interrupted = false;
  let stopPool = (): void => undefined;
  const onSigint = () => { interrupted = true; stopPool(); };
  process.once('SIGINT', onSigint);
  try {
    if (threads === 1 || total <= POINTS_PER_TASK) {
      for (let i = 0; i < total && !interrupted; i++) emitRow(sweepPoint(setup, i));
    } else {
      const tasks: Array<{ start: number; count: number }> = [];
      for (let start = 0; start < total; start += POINTS_PER_TASK) tasks.push({ start, count: Math.min(POINTS_PER_TASK, total - start) });
      const waiting = new Map<number, SweepRow[]>();
      let nextTask = 0;
      await runPool<{ start: number; count: number }, SweepRow[]>({ kind: 'sweep', ...setup }, tasks, threads, (index, rows) => {
        waiting.set(index, rows);
        while (waiting.has(nextTask)) {
          for (const row of waiting.get(nextTask)!) emitRow(row);
          waiting.delete(nextTask++);
        }
      }, (handle) => { stopPool = () => handle.stop(); }, (task) => sweepRows(setup, task.start, task.count));
    }
  } catch (error) {
    bar.stop();
    out.abandon();
    throw error;
  } finally {
    process.removeListener('SIGINT', onSigint);
  }
  bar.stop();
  if (options.json) out.write(written === 0 ? '[]\n' : '\n]\n');
  out.finish();
  if (interrupted) {
    io.stderr(`phasegap: interrupted after ${written} of ${total} points; the rows written are complete\n`);
    return 130;
  }
  return failures === 0 ? 0 : 1;
}
