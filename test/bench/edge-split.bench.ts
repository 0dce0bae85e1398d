/**
 * Every generator net's 50 % edges against ngspice, in the order they happen: each edge's time
 * from the clock's rising 50 % edge in the model and in the deck, the error, and the error the
 * stage adds to its trigger's (the latest input edge of its gate before it). Where a phase's
 * instant error comes from, stage by stage: the delay chain's stages, the cross-coupled gates, the
 * buffers. Run after `npm run build`:
 *   node dist/test/bench/edge-split.bench.js design corner[,corner]
 */
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadDesign } from '../../src/cli/load.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { evaluateCorner } from '../../src/analysis/evaluate.js';
import { analyticModel } from '../../src/delay/analytic.js';
import { generatorDeck } from '../../src/spice/deck.js';
import { parseSimulatorOutput } from '../../src/spice/results.js';
import { runDecks } from '../../src/spice/runner.js';
import { anchorBefore, measureLine, modelToDeck, type Quantity } from '../../src/spice/measures.js';
import { modelFile } from '../../src/cli/model-file.js';
import { CycleIndex } from '../../src/measure/phases.js';
import { wrapTime } from '../../src/measure/wrap-time.js';
import { spiceNodeNames } from '../../src/spice/names.js';
import { gateInputsOf } from '../../src/netlist/netlist.js';

interface Edge {
  readonly q: Quantity;
  readonly net: string;
  readonly rising: boolean;
  readonly transition: number;
}

const designs = fileURLToPath(new URL('../../../fixtures/designs/', import.meta.url));
const [name, cornerList] = process.argv.slice(2);
if (!name || !cornerList) {
  console.error('usage: node dist/test/bench/edge-split.bench.js design corner[,corner]');
  process.exit(2);
}
const { design, card, cardDir } = loadDesign(join(designs, `${name}.yaml`));
const resolved = resolveDesign(design, card, analyticModel);
const netlist = resolved.netlist;
const nodes = spiceNodeNames(netlist.netNames);
const clock = netlist.netNames[netlist.clock]!;
const corners = resolved.corners.map((c) => c.corner).filter((c) => cornerList.split(',').includes(c.name));
const jobs = corners.map((corner) => {
  const deck = generatorDeck(resolved, corner, { modelPath: modelFile(card, cardDir) });
  const simulation = evaluateCorner(resolved, corner).simulation;
  const cycles = new CycleIndex(simulation, netlist);
  const { window } = deck;
  const T = window.period;
  const toDeck = modelToDeck(window, simulation.windowStart);
  const edges: Edge[] = [];
  for (const net of netlist.netNames) {
    const cycle = cycles.cycle(net);
    if (typeof cycle === 'string' || net === clock) continue;
    const both: Array<[boolean, number, number]> = [
      [true, cycle.rise, cycle.riseTransition],
      [false, cycle.fall, cycle.fallTransition],
    ];
    for (const [rising, t, transition] of both) {
      const at = toDeck(t);
      const clockEdge = at - wrapTime(at - window.start, T);
      const q: Quantity = {
        name: `e_${edges.length + 1}`,
        kind: 'switch',
        label: `${net} ${rising ? 'rise' : 'fall'}`,
        model: at - clockEdge,
        trig: {
          node: nodes.get(clock)!,
          level: 0.5 * corner.vdd,
          rising: true,
          td: Math.max(0, clockEdge - 0.25 * window.duty * T),
        },
        targ: { node: nodes.get(net)!, level: 0.5 * corner.vdd, rising, td: Math.max(0, anchorBefore(at, window)) },
      };
      edges.push({ q, net, rising, transition });
    }
  }
  const text = deck.text.replace(/\.end\n$/, `${edges.map((e) => measureLine(e.q)).join('\n')}\n.end\n`);
  return { corner, text, edges, period: T };
});
const outputs = runDecks(
  jobs.map((j) => ({ name: j.corner.name, text: j.text })),
  { parallel: 2 },
);
// Each gate output's input nets, once for the netlist.
const inputsOf = new Map<string, string[]>();
for (let g = 0; g < netlist.gateCount; g++) {
  inputsOf.set(
    netlist.netNames[netlist.gateOutput[g]!]!,
    gateInputsOf(netlist, g).map((id) => netlist.netNames[id]!),
  );
}
const ps = (x: number | null) => (x === null ? '    n/a' : (x * 1e12).toFixed(1).padStart(8));
jobs.forEach((job, i) => {
  const parsed = parseSimulatorOutput(
    outputs[i]!.output,
    job.edges.map((e) => e.q.name),
  );
  // The clock's edges are the reference: no error by definition.
  const clockRows = [0, job.corner.duty].map((at, k) => ({
    q: { label: `${clock} ${k === 0 ? 'rise' : 'fall'}`, model: at * job.period },
    net: clock,
    rising: k === 0,
    transition: 0,
    sim: null,
    error: 0,
  }));
  const rows = [
    ...clockRows,
    ...job.edges.map((e) => {
      const sim = parsed.values.get(e.q.name) ?? null;
      return { ...e, sim, error: sim === null ? null : e.q.model - sim };
    }),
  ].sort((a, b) => a.q.model - b.q.model);
  // A stage's own error: its edge's less its trigger's (the latest input edge before it).
  for (const [k, r] of rows.entries()) {
    if (r.net === clock) continue;
    const inputs = inputsOf.get(r.net) ?? [];
    const trigger = rows
      .slice(0, k)
      .reverse()
      .find((x) => inputs.includes(x.net));
    const own = r.error !== null && trigger?.error != null ? r.error - trigger.error : null;
    console.log(
      `${job.corner.name} ${r.q.label.padEnd(18)} model ${ps(r.q.model)} ngspice ${ps(r.sim)} err ${ps(r.error)} stage ${ps(own)} from ${(trigger?.q.label ?? 'clock').padEnd(18)} transition ${ps(r.transition)}`,
    );
  }
});
