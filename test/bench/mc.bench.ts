/**
 * Monte Carlo benchmark on the demo design: evaluations per second on one thread and on every
 * core, and the wall time and peak memory of a 1,000,000-evaluation run (child processes, so the
 * peak RSS is the run's own). Prints its figures; run with `npm run bench`.
 */
import { spawnSync } from 'node:child_process';
import { availableParallelism, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const cli = fileURLToPath(new URL('../../src/cli/main.js', import.meta.url));
const demo = fileURLToPath(new URL('../../../fixtures/designs/doubler.yaml', import.meta.url));
const demoTables = fileURLToPath(new URL('../../../fixtures/tables/generic180.json', import.meta.url));
const CORNERS = 45;

interface Timed {
  readonly seconds: number;
  readonly rssMb: number;
  /** The evaluation phase alone, as `mc --timings` reports it, s. */
  readonly evaluation: number;
}

/** `model`: options before the command; `run`: the design and options after it. */
function timed(
  samples: number,
  workers: number,
  model: readonly string[] = [],
  run: { design: string; extra: readonly string[] } = { design: demo, extra: [] },
): Timed {
  const script = `
    const t = process.hrtime.bigint();
    process.argv = [process.argv[0], ${JSON.stringify(cli)}, ...${JSON.stringify(model)}, 'mc', ${JSON.stringify(run.design)}, ...${JSON.stringify(run.extra)}, '--samples', '${samples}', '--workers', '${workers}', '--timings', '--json', '-o', ${JSON.stringify(join(tmpdir(), 'phasegap-bench-mc.json'))}];
    await import(${JSON.stringify(cli)});
    process.on('exit', () => {
      const s = Number(process.hrtime.bigint() - t) / 1e9;
      process.stderr.write(JSON.stringify({ s, rss: process.resourceUsage().maxRSS / 1024 }) + '\\n');
    });`;
  const r = spawnSync(process.execPath, ['--input-type=module', '-e', script], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`mc run failed (exit ${r.status}): ${r.stderr}`);
  const line = r.stderr.trim().split('\n').pop() ?? '{}';
  const { s, rss } = JSON.parse(line) as { s: number; rss: number };
  const evaluation = /evaluation ([\d.]+) s/.exec(r.stderr);
  if (!evaluation) throw new Error(`mc --timings printed no evaluation time: ${r.stderr}`);
  return { seconds: s, rssMb: rss, evaluation: Number(evaluation[1]) };
}

const cores = availableParallelism();
const dies = Math.ceil(1_000_000 / CORNERS);
const evaluations = dies * CORNERS;
const one = timed(dies, 1);
const all = timed(dies, cores);
console.log(
  `Monte Carlo, 1,000,000 evaluations (${dies} dies x ${CORNERS} corners of the demo design), ${cores} cores; whole runs, start-up included`,
);
console.log(
  `one thread        ${Math.round(evaluations / one.seconds)} evaluations/s, ${one.seconds.toFixed(2)} s wall, peak RSS ${one.rssMb.toFixed(0)} MB`,
);
console.log(
  `${cores} threads         ${Math.round(evaluations / all.seconds)} evaluations/s, ${all.seconds.toFixed(2)} s wall, peak RSS ${all.rssMb.toFixed(0)} MB (${(one.seconds / all.seconds).toFixed(2)}x)`,
);
console.log("evaluation phase only (mc --timings: without start-up, design loading and the report; each thread's warm-up included)");
console.log(`one thread        ${Math.round(evaluations / one.evaluation)} evaluations/s, ${one.evaluation.toFixed(2)} s`);
console.log(
  `${cores} threads         ${Math.round(evaluations / all.evaluation)} evaluations/s, ${all.evaluation.toFixed(2)} s (${(one.evaluation / all.evaluation).toFixed(2)}x)`,
);

// The two delay models on the same dies, one thread: the table model must keep at least half the analytic rate.
const modelDies = 2000;
const byModel = (['analytic', 'table'] as const).map((m) => timed(modelDies, 1, ['--model', m, '--tables', demoTables]));
const rate = (t: Timed) => Math.round((modelDies * CORNERS) / t.evaluation);
console.log(
  `delay models, ${modelDies * CORNERS} evaluations on one thread (evaluation phase): analytic ${rate(byModel[0]!)} evaluations/s, table ${rate(byModel[1]!)} evaluations/s (${((100 * rate(byModel[1]!)) / rate(byModel[0]!)).toFixed(0)} % of analytic)`,
);

// A design with a circuit: every die also solves the pump's steady state for its requirements.
const pump = fileURLToPath(new URL('../../../fixtures/designs/doubler-pump.yaml', import.meta.url));
const pumpDies = 200;
const withCircuit = timed(pumpDies, 1, [], { design: pump, extra: [] });
const timingOnly = timed(pumpDies, 1, [], { design: pump, extra: ['--skip-circuit'] });
const pumpRate = (t: Timed) => Math.round((pumpDies * CORNERS) / t.evaluation);
console.log(
  `doubler-pump, ${pumpDies * CORNERS} evaluations on one thread (evaluation phase): with the circuit's requirements ${pumpRate(withCircuit)} evaluations/s, timing and switch checks only (--skip-circuit) ${pumpRate(timingOnly)} evaluations/s`,
);
