/**
 * `phasegap sweep DESIGN --vary AXIS=VALUES ...`: a grid over corner axes and design paths, one
 * worst-case row per point, streamed in grid order as points finish. With -o the rows go to a temp
 * file renamed into place at the end; Ctrl-C keeps the complete rows written so far.
 */
import { availableParallelism } from 'node:os';
import { closeSync, renameSync, unlinkSync } from 'node:fs';
import { checkGridSize, mergeColumns, parseAxis, CORNER_AXES, type SweepColumns, type SweepRow } from '../../analysis/sweep.js';
import { csvColumnsJson, csvHeader, csvRow, jsonRow, unlistedNames } from '../../report/sweep-format.js';
import { InputError, inputError } from '../../errors.js';
import { openTemp, writeAll, type Io } from '../io.js';
import { loadDesign, type ModelOptions } from '../load.js';
import { checkOutput, inputFiles, toStdout } from '../output.js';
import { optionalWholeNumber } from '../options.js';
import { runPool } from '../pool.js';
import { progressBar } from '../progress.js';
import { MAX_SWEEP_POINTS, MAX_WORKERS } from '../run-limits.js';
import { pointColumns, sweepPoint, sweepRows, type SweepSetup } from '../sweep-points.js';

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
function sink(io: Io, out: string | undefined, inputs: readonly string[]) {
  if (toStdout(out)) return { write: (t: string) => io.stdout(t), finish: () => undefined, abandon: () => undefined };
  checkOutput(out, inputs);
  let file: { fd: number; temp: string };
  try {
    file = openTemp(out);
  } catch (error) {
    throw inputError('option.invalid', '--out', out, `cannot be written (${(error as NodeJS.ErrnoException).code ?? 'error'}); check that the folder exists and is writable`);
  }
  const { fd, temp } = file;
  const abandon = () => {
    try { closeSync(fd); } catch { /* already closed */ }
    try { unlinkSync(temp); } catch { /* already gone */ }
  };
  const failed = (error: unknown) => {
    abandon();
    if (error instanceof InputError) return error;
    return inputError('option.invalid', '--out', out, `cannot be written (${(error as NodeJS.ErrnoException).code ?? 'error'}); check that the disk has room`);
  };
  return {
    write: (t: string) => {
      try { writeAll(fd, t); } catch (error) { throw failed(error); }
    },
    finish: () => {
      try {
        closeSync(fd);
        checkOutput(out, inputs);
        renameSync(temp, out);
      } catch (error) {
        throw failed(error);
      }
    },
    abandon,
  };
}

/**
 * Evaluates every axis value on its own (the other axes at their first value), so a bad value is
 * reported before any row is written, and returns the union of the columns those points can fill.
 */
function checkAxes(setup: SweepSetup): SweepColumns {
  const found: SweepColumns[] = [];
  setup.axes.forEach((axis, a) => {
    const names = setup.axes.map((x) => x.path);
    if (names.indexOf(axis.path) !== a) throw inputError('option.invalid', '--vary', axis.path, 'is given twice; vary each axis once');
    const stride = setup.axes.slice(a + 1).reduce((n, x) => n * x.values.length, 1);
    axis.values.forEach((_, k) => {
      sweepPoint(setup, k * stride);
      found.push(pointColumns(setup, k * stride));
    });
  });
  return mergeColumns(found);
}

/** Yields to the event loop, so a signal that arrived during a long computation is handled. */
const nextTurn = () => new Promise<void>((resolve) => setImmediate(resolve));

export async function runSweep(io: Io, designPath: string, options: SweepOptions): Promise<number> {
  if (options.vary.length === 0) throw inputError('option.invalid', '--vary', undefined, 'is required at least once: AXIS=LIST or AXIS=START:STOP:N, e.g. --vary vdd=1.6:2.0:5');
  const loaded = loadDesign(designPath, options.set, io.readStdin);
  const { design } = loaded;
  const inputs = inputFiles(loaded, options);
  checkOutput(options.out, inputs);
  const axes = options.vary.map((spec) => parseAxis(spec, MAX_SWEEP_POINTS));
  const total = checkGridSize(axes, MAX_SWEEP_POINTS);
  const threads = optionalWholeNumber('--workers', options.workers, { min: 1, max: MAX_WORKERS, noun: 'threads' }, Math.min(availableParallelism(), MAX_WORKERS));
  for (const axis of axes) {
    if ((CORNER_AXES as readonly string[]).includes(axis.path) && design.corners.list) {
      throw inputError('option.invalid', `--vary ${axis.path}`, axis.path, 'cannot vary a corner axis when the design lists its corners explicitly (corners.list)');
    }
  }
  const setup: SweepSetup = { design: { path: loaded.designPath, text: loaded.designText }, overrides: options.set, axes, model: { model: options.model, tables: options.tables } };
  const columns = checkAxes(setup);
  const out = sink(io, options.out, inputs);
  const bar = progressBar(io, total, 'sweep', !options.json);
  let written = 0;
  let failures = 0;
  if (!options.json) out.write(csvHeader(axes, columns));
  const emitRow = (row: SweepRow) => {
    const unlisted = options.json ? [] : unlistedNames(row, columns);
    if (unlisted.length > 0) {
      // Only two or more design axes acting together can give a check that no single axis value gives.
      throw inputError('option.invalid', '--vary', axes.map((a, i) => `${a.path}=${row.point[i]}`).join(', '),
        `gives checks no single axis value gives (${unlisted.join('; ')}), so the CSV has no column for them; sweep these axes one at a time, or use --json`);
    }
    out.write(options.json ? jsonRow(row, axes, written === 0) : csvRow(row, columns));
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
      for (let i = 0; i < total && !interrupted; i++) {
        emitRow(sweepPoint(setup, i));
        await nextTurn();
      }
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
  // Column labels and units beside a CSV file: the header itself holds only notebook keys.
  if (!options.json && options.out !== undefined && options.out !== '-') io.writeFile(`${options.out}.columns.json`, csvColumnsJson(axes, columns));
  if (interrupted) {
    io.stderr(`phasegap: interrupted after ${written} of ${total} points; the rows written are complete\n`);
    return 130;
  }
  return failures === 0 ? 0 : 1;
}
