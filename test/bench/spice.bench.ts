/**
 * Benchmark: ngspice wall time for the 45 corners of the demo design (transistor-level decks, two
 * simulations at a time by default) against phasegap's own evaluation of the same corners, as a
 * ratio measured in one run. Needs ngspice on the PATH. Run with
 * `npm run build && node dist/test/bench/spice.bench.js [parallel]`.
 */
import { fileURLToPath } from 'node:url';
import { loadDesign } from '../../src/cli/load.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { evaluateAll } from '../../src/analysis/evaluate.js';
import { checkReport } from '../../src/report/check-report.js';
import { generatorDeck } from '../../src/spice/deck.js';
import { runDecks, checkSimulator } from '../../src/spice/runner.js';

const demo = fileURLToPath(new URL('../../../fixtures/designs/doubler.yaml', import.meta.url));
const models = fileURLToPath(new URL('../../../fixtures/models/generic180.lib', import.meta.url));
const parallel = Number(process.argv[2] ?? 2);
const { design, card } = loadDesign(demo);
const resolved = resolveDesign(design, card);
const corners = resolved.corners.map((c) => c.corner);
const simulator = checkSimulator();

let start = performance.now();
const decks = corners.map((corner) => generatorDeck(resolved, corner, { modelPath: models }));
const deckSeconds = (performance.now() - start) / 1000;
start = performance.now();
runDecks(
  decks.map((d) => ({ name: d.corner.name, text: d.text })),
  { parallel },
);
const spiceSeconds = (performance.now() - start) / 1000;

checkReport(resolved, evaluateAll(resolved));
const repeats = 20;
start = performance.now();
for (let i = 0; i < repeats; i++) checkReport(resolved, evaluateAll(resolved));
const checkSeconds = (performance.now() - start) / 1000 / repeats;

console.log(`design            ${design.name} (${resolved.netlist.gateCount} gates, ${corners.length} corners)`);
console.log(
  `${simulator.padEnd(17)} ${spiceSeconds.toFixed(2)} s wall for ${corners.length} corners, ${parallel} at a time (decks written in ${(deckSeconds * 1000).toFixed(0)} ms)`,
);
console.log(`phasegap check    ${(checkSeconds * 1000).toFixed(2)} ms for the same corners (one thread, mean of ${repeats})`);
console.log(`ratio             ngspice / check = ${Math.round(spiceSeconds / checkSeconds)}x`);
