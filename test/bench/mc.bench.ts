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
const CORNERS = 45;

function timed(samples: number, workers: number): { seconds: number; rssMb: number } {
  const script = `
    const t = process.hrtime.bigint();
    process.argv = [process.argv[0], ${JSON.stringify(cli)}, 'mc', ${JSON.stringify(demo)}, '--samples', '${samples}', '--workers', '${workers}', '--json', '-o', ${JSON.stringify(join(tmpdir(), 'phasegap-bench-mc.json'))}];
    await import(${JSON.stringify(cli)});
    process.on('exit', () => {
      const s = Number(process.hrtime.bigint() - t) / 1e9;
      process.stderr.write(JSON.stringify({ s, rss: process.resourceUsage().maxRSS / 1024 }) + '\\n');
    });`;
  const r = spawnSync(process.execPath, ['--input-type=module', '-e', script], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`mc run failed (exit ${r.status}): ${r.stderr}`);
  const line = r.stderr.trim().split('\n').pop() ?? '{}';
  const { s, rss } = JSON.parse(line) as { s: number; rss: number };
  return { seconds: s, rssMb: rss };
}

const cores = availableParallelism();
const dies = Math.ceil(1_000_000 / CORNERS);
const evaluations = dies * CORNERS;
const one = timed(dies, 1);
const all = timed(dies, cores);
console.log(`Monte Carlo, 1,000,000 evaluations (${dies} dies x ${CORNERS} corners of the demo design), ${cores} cores; whole runs, start-up included`);
console.log(`one thread        ${Math.round(evaluations / one.seconds)} evaluations/s, ${one.seconds.toFixed(2)} s wall, peak RSS ${one.rssMb.toFixed(0)} MB`);
console.log(`${cores} threads         ${Math.round(evaluations / all.seconds)} evaluations/s, ${all.seconds.toFixed(2)} s wall, peak RSS ${all.rssMb.toFixed(0)} MB (${(one.seconds / all.seconds).toFixed(2)}x)`);
