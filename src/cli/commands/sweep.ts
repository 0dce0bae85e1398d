/**
 * `phasegap sweep DESIGN --vary AXIS=VALUES ...`: a grid over corner axes and design paths, one
 * worst-case row per point, streamed in grid order as points finish. With -o the rows go to a temp
 * file renamed into place at the end; Ctrl-C keeps the complete rows written so far.
 */
import { checkGridSize, mergeColumns, parseAxis, CORNER_AXES, type SweepColumns, type SweepRow } from '../../analysis/sweep.js';
import { csvColumnsJson, csvHeader, csvRow, jsonRow, unlistedNames } from '../../report/sweep-format.js';
import { inputError } from '../../errors.js';
import type { Io } from '../io.js';
import { loadDesign } from '../load.js';
import { streamOutput, checkedInputs } from '../output.js';
import { runParallel, type RunEnd } from '../parallel-run.js';
import { progressBar } from '../progress.js';
import { MAX_SWEEP_POINTS } from '../run-limits.js';
import { pointColumns, sweepPoint, sweepRows, type SweepSetup } from '../sweep-points.js';
import { defineCommand, listOption, type CommandOptions } from '../command.js';
import { DESIGN_ARGUMENT, SET_OPTION, jsonOption, outOption, workersOption } from '../common-options.js';

const OPTIONS = {
  set: SET_OPTION,
  vary: listOption(
    '--vary <AXIS=VALUES>',
    'an axis: process|vdd|temperature|duty or a design path (clock.frequency, generator.stages, loads.p1, switches[0].w), with a list a,b,c or a range START:STOP:N (repeatable: a grid)',
  ),
  workers: workersOption('threads (default: the number of cores); rows do not depend on it'),
  json: jsonOption('write a JSON array instead of CSV'),
  out: outOption('the rows'),
} as const;

export const sweepCommand = defineCommand({
  name: 'sweep',
  description: 'batch grid over corner axes and design values; one worst-case row per point, CSV or JSON, streamed',
  arguments: [DESIGN_ARGUMENT],
  options: OPTIONS,
  run: (io, [design], options) => runSweep(io, design, options),
});

/** Points per task handed to a thread. */
const POINTS_PER_TASK = 4;

/**
 * Evaluates every axis value on its own (the other axes at their first value), so a bad value is
 * reported before any row is written, and returns the union of the columns those points can fill.
 */
function checkAxes(setup: SweepSetup): SweepColumns {
  const found: SweepColumns[] = [];
  setup.axes.forEach((axis, a) => {
    const names = setup.axes.map((x) => x.path);
    if (names.indexOf(axis.path) !== a) throw inputError('option.invalid', ['--vary'], axis.path, 'is given twice; vary each axis once');
    const stride = setup.axes.slice(a + 1).reduce((n, x) => n * x.values.length, 1);
    axis.values.forEach((_, k) => {
      sweepPoint(setup, k * stride);
      found.push(pointColumns(setup, k * stride));
    });
  });
  return mergeColumns(found);
}

export async function runSweep(io: Io, designPath: string, options: CommandOptions<typeof OPTIONS>): Promise<number> {
  if (options.vary.length === 0)
    throw inputError(
      'option.invalid',
      ['--vary'],
      undefined,
      'is required at least once: AXIS=LIST or AXIS=START:STOP:N, e.g. --vary vdd=1.6:2.0:5',
    );
  const loaded = loadDesign(designPath, options.set, io.readStdin);
  const { design } = loaded;
  const inputs = checkedInputs(loaded, options);
  const axes = options.vary.map((spec) => parseAxis(spec, MAX_SWEEP_POINTS));
  const total = checkGridSize(axes, MAX_SWEEP_POINTS);
  const threads = options.workers;
  for (const axis of axes) {
    if ((CORNER_AXES as readonly string[]).includes(axis.path) && design.corners.list) {
      throw inputError(
        'option.invalid',
        ['--vary', axis.path],
        axis.path,
        'cannot vary a corner axis when the design lists its corners explicitly (corners.list)',
      );
    }
  }
  const setup: SweepSetup = {
    design: { path: loaded.designPath, text: loaded.designText },
    overrides: options.set,
    axes,
    model: { model: options.model, tables: options.tables },
  };
  const columns = checkAxes(setup);
  const out = streamOutput(io, options.out, inputs);
  const bar = progressBar(io, total, 'sweep', !options.json);
  let written = 0;
  let failures = 0;
  if (!options.json) out.write(csvHeader(axes, columns));
  const emitRow = (row: SweepRow) => {
    const unlisted = options.json ? [] : unlistedNames(row, columns);
    if (unlisted.length > 0) {
      // Only two or more design axes acting together can give a check that no single axis value gives.
      throw inputError(
        'option.invalid',
        ['--vary'],
        axes.map((a, i) => `${a.path}=${row.point[i]}`).join(', '),
        `gives checks no single axis value gives (${unlisted.join('; ')}), so the CSV has no column for them; sweep these axes one at a time, or use --json`,
      );
    }
    out.write(options.json ? jsonRow(row, axes, written === 0) : csvRow(row, columns));
    if (row.verdict === 'fail') failures++;
    written++;
    bar.update(written);
  };
  // One point per task on the calling thread, so Ctrl-C keeps every row finished before it.
  const parallel = threads > 1 && total > POINTS_PER_TASK;
  const tasks: Array<{ start: number; count: number }> = [];
  for (let start = 0; start < total; start += parallel ? POINTS_PER_TASK : 1)
    tasks.push({ start, count: parallel ? Math.min(POINTS_PER_TASK, total - start) : 1 });
  let end: RunEnd;
  try {
    end = await runParallel<{ start: number; count: number }, SweepRow[]>({
      setup: { kind: 'sweep', ...setup },
      tasks,
      threads: parallel ? threads : 1,
      ordered: true,
      local: (task) => sweepRows(setup, task.start, task.count),
      onResult: (rows) => {
        for (const row of rows) emitRow(row);
      },
    });
  } catch (error) {
    bar.stop();
    out.abandon();
    throw error;
  }
  bar.stop();
  if (options.json) out.write(written === 0 ? '[]\n' : '\n]\n');
  out.finish();
  // Column labels and units beside a CSV file: the header itself holds only notebook keys.
  if (!options.json && options.out !== undefined && options.out !== '-')
    io.writeFile(`${options.out}.columns.json`, csvColumnsJson(axes, columns));
  if (end === 'interrupted') {
    io.stderr(`phasegap: interrupted after ${written} of ${total} points; the rows written are complete\n`);
    return 130;
  }
  return failures === 0 ? 0 : 1;
}
