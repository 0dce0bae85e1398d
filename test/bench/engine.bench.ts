/**
 * Benchmark of the numeric core on the demo design: generator evaluations per second, where one
 * evaluation is one corner bound, simulated to periodic steady state and measured.
 * Prints its figures; run with `npm run bench`.
 */
import { fileURLToPath } from 'node:url';
import { loadDesign } from '../../src/cli/load.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { evaluateCorner } from '../../src/analysis/evaluate.js';
import { Simulator } from '../../src/sim/engine.js';

const demo = fileURLToPath(new URL('../../../fixtures/designs/doubler.yaml', import.meta.url));
const { design, card } = loadDesign(demo);
const resolved = resolveDesign(design, card);
const simulator = new Simulator(resolved.netlist);
const corners = resolved.corners.map((c) => c.corner);

function evaluations(seconds: number): { count: number; elapsed: number } {
  const start = performance.now();
  let count = 0;
  let sink = 0;
  while (performance.now() - start < seconds * 1000) {
    for (const corner of corners) {
      const r = evaluateCorner(resolved, corner, simulator);
      sink += r.pass ? 1 : 0;
      count++;
    }
  }
  if (sink < 0) console.log(sink);
  return { count, elapsed: (performance.now() - start) / 1000 };
}

evaluations(0.5);
const { count, elapsed } = evaluations(3);
const events = simulatorEvents();
console.log(`design            ${design.name} (${resolved.netlist.gateCount} gates, ${corners.length} corners)`);
console.log(`evaluations/s     ${Math.round(count / elapsed)} (one thread, ${count} evaluations in ${elapsed.toFixed(2)} s)`);
console.log(`per evaluation    ${((elapsed / count) * 1e6).toFixed(1)} us, ${events} transitions in the reported period`);

function simulatorEvents(): number {
  return evaluateCorner(resolved, corners[0]!, simulator).simulation.edges.count;
}
