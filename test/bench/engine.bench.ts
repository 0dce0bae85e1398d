/**
 * Benchmark of the numeric core on the demo design: generator evaluations per second, where one
 * evaluation is one corner bound, simulated to periodic steady state, measured and checked.
 * Prints its figures; run with `npm run bench`.
 */
import { fileURLToPath } from 'node:url';
import { loadDesign } from '../../src/cli/load.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { CornerEvaluator } from '../../src/analysis/evaluate.js';

const demo = fileURLToPath(new URL('../../../fixtures/designs/doubler.yaml', import.meta.url));
const { design, card } = loadDesign(demo);
const resolved = resolveDesign(design, card);
const corners = resolved.corners.map((c) => c.corner);

function evaluations(seconds: number, borrow: boolean): { count: number; elapsed: number } {
  const evaluator = borrow ? CornerEvaluator.borrowingScratch(resolved) : new CornerEvaluator(resolved);
  const start = performance.now();
  let count = 0;
  let sink = 0;
  while (performance.now() - start < seconds * 1000) {
    for (const corner of corners) {
      sink += evaluator.evaluate(corner).pass ? 1 : 0;
      count++;
    }
  }
  if (sink < 0) console.log(sink);
  return { count, elapsed: (performance.now() - start) / 1000 };
}

function report(label: string, borrow: boolean): void {
  evaluations(0.5, borrow);
  const { count, elapsed } = evaluations(3, borrow);
  console.log(
    `${label.padEnd(34)} ${String(Math.round(count / elapsed)).padStart(8)} evaluations/s  (${((elapsed / count) * 1e6).toFixed(1)} us each)`,
  );
}

console.log(`design: ${design.name}, ${resolved.netlist.gateCount} gates, ${resolved.switches.length} switches, ${corners.length} corners`);
report('check path (results kept)', false);
report('tight loop (buffers reused)', true);
