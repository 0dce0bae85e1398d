/**
 * Benchmark: a whole `tune` of the demo design on one thread, Monte Carlo headroom included
 * (wall and CPU time, corner evaluations), then the ngspice confirmation of its first three
 * proposals timed separately (skipped, and said so, without ngspice). The search itself should stay
 * under 10 s of CPU. Run with `npm run build && node dist/test/bench/tune.bench.js`.
 */
import { fileURLToPath } from 'node:url';
import { dirname } from 'node:path';
import { loadDesign } from '../../src/cli/load.js';
import { defaultSpace, tuneChains } from '../../src/analysis/tune.js';
import { tuneSimulator } from '../../src/cli/commands/tune.js';
import { openFileStream, type Io } from '../../src/cli/io.js';

const demo = fileURLToPath(new URL('../../../fixtures/designs/doubler.yaml', import.meta.url));
const { design, card, cardDir } = loadDesign(demo);
const io: Io = { stdout: () => {}, stderr: () => {}, writeFile: () => {}, openFileStream, exists: () => false, stderrIsTTY: false };

function timed<T>(run: () => T): { value: T; wall: number; cpu: number } {
  const cpu0 = process.cpuUsage();
  const t0 = performance.now();
  const value = run();
  const wall = (performance.now() - t0) / 1000;
  const cpu = process.cpuUsage(cpu0);
  return { value, wall, cpu: (cpu.user + cpu.system) / 1e6 };
}

const search = timed(() => tuneChains(design, card, undefined, defaultSpace(design)));
const best = search.value.proposals[0];
console.log(`tune ${design.name} (${dirname(demo).split('/').pop()}/doubler.yaml), Monte Carlo headroom, no simulator`);
console.log(
  `  search          ${search.wall.toFixed(2)} s wall, ${search.cpu.toFixed(2)} s CPU, ${search.value.evaluations} corner evaluations (${(search.value.evaluations / search.cpu).toFixed(0)} per CPU second)`,
);
console.log(
  `  first proposal  ${best ? `${best.knobs.stages} stages, ${(best.knobs.stageLoad / 1e-15).toFixed(1)} fF, buffer [${best.knobs.buffer.join(', ')}], tap ${best.knobs.feedbackTap}` : 'none'}`,
);
const { simulate, note } = tuneSimulator(io, card, cardDir, {});
if (!simulate) {
  console.log(`  ngspice         skipped: ${note}`);
} else {
  let spice = 0;
  const clocked: typeof simulate = (resolved) => {
    const t0 = performance.now();
    const run = simulate(resolved);
    spice += (performance.now() - t0) / 1000;
    return run;
  };
  const withSpice = timed(() => tuneChains(design, card, undefined, defaultSpace(design), { simulate: clocked, confirmTop: 3 }));
  const runs = withSpice.value.simulations;
  console.log(
    `  ngspice         ${spice.toFixed(2)} s wall in ${runs} runs at the worst corners (${(spice / Math.max(1, runs)).toFixed(2)} s each); whole tune with it ${withSpice.wall.toFixed(2)} s wall`,
  );
}
