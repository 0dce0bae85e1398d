/**
 * Splits each switch instant's error against ngspice into the gate edge's 50 % time and the
 * crossing of the turn-on level from it (and, for a level-shifted gate, the net's 50 % edge and
 * the shifter's delay). Run after `npm run build`:
 *   node dist/test/bench/instant-split.bench.js design[,design] corner[,corner]
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
import { measureLine, type Quantity } from '../../src/spice/measures.js';
import { modelFile } from '../../src/cli/model-file.js';
import { CycleIndex } from '../../src/measure/phases.js';
import { modelEdgeShape } from '../../src/measure/levels.js';
import { gateWave, deviceShifter } from '../../src/switches/conduction.js';
import { rampCrossing } from '../../src/switches/physics.js';
import { devicesAtCorner } from '../../src/process/device.js';
import { shifterSizes } from '../../src/analysis/shifter-sizes.js';
import { spiceNodeNames } from '../../src/spice/names.js';

const designs = fileURLToPath(new URL('../../../fixtures/designs/', import.meta.url));
const [names, cornerNames] = process.argv.slice(2).map((a) => a.split(','));
for (const name of names!) {
  const { design, card, cardDir } = loadDesign(join(designs, `${name}.yaml`));
  const resolved = resolveDesign(design, card, analyticModel);
  const corners = resolved.corners.map((c) => c.corner).filter((c) => cornerNames!.includes(c.name) || cornerNames![0] === 'all');
  const modelPath = modelFile(card, cardDir);
  const sizes = resolved.switches.some((p) => p.levelShifter) ? shifterSizes(resolved) : undefined;
  const nodes = spiceNodeNames(resolved.netlist.netNames);
  const decks = corners.map((corner) => {
    const deck = generatorDeck(resolved, corner, { modelPath });
    const ev = evaluateCorner(resolved, corner);
    const cycles = new CycleIndex(ev.simulation, resolved.netlist);
    const devices = devicesAtCorner(card, corner);
    // The gate nets' edges as the model shapes them (the evaluator's own instants read them so).
    const shape = modelEdgeShape(cycles, resolved.netlist, resolved.model.bind(resolved.netlist, resolved.loads, devices));
    const vdd = corner.vdd;
    const T = deck.window.period;
    const extra: Array<{ q: Quantity; m50: Quantity; mIn?: Quantity; model50: number; modelIn?: number; label: string }> = [];
    let k = 0;
    resolved.switches.forEach((plan, i) => {
      plan.devices.forEach((device, j) => {
        const wave = gateWave(plan, device, cycles, vdd, deviceShifter(plan, j, cycles, devices, { sizes: sizes?.[i], shape }), shape);
        if (typeof wave === 'string') return;
        const prefix = `${plan.name}${plan.devices.length > 1 ? `.${device.kind}` : ''} `;
        const qs = deck.quantities.filter((q) => q.event?.switch === plan.name && q.label.startsWith(prefix));
        for (const q of qs) {
          if (extra.some((e) => e.q === q)) continue;
          const rising = q.targ.rising;
          const ramp = rising ? wave.rise : wave.fall;
          const lag = rampCrossing(ramp, q.targ.level) - ramp.t50;
          const mid = (ramp.low + ramp.high) / 2;
          k++;
          // The 50 % point may come before the clock edge the instant is measured from.
          const td = Math.max(0, q.targ.td - 0.2 * T);
          const m50: Quantity = { ...q, name: `x50_${k}`, targ: { ...q.targ, level: mid, td } };
          let mIn: Quantity | undefined;
          let modelIn: number | undefined;
          const ls = plan.levelShifter;
          if (ls) {
            const cycle = cycles.cycle(device.net);
            if (typeof cycle !== 'string') {
              const inRising = ls.invert ? !rising : rising;
              mIn = {
                ...q,
                name: `xin_${k}`,
                targ: { node: nodes.get(device.net)!, level: vdd / 2, rising: inRising, td: Math.max(0, q.targ.td - 0.4 * T) },
              };
              const inTime = rising === !ls.invert ? cycle.rise : cycle.fall;
              modelIn = q.model - lag - (ramp.t50 - inTime);
            }
          }
          extra.push({
            q,
            m50,
            mIn,
            model50: q.model - lag,
            modelIn,
            label: `${q.label} lvl ${(((q.targ.level - ramp.low) / (ramp.high - ramp.low)) * 100).toFixed(0)}% tT ${(ramp.transition * 1e12).toFixed(0)}`,
          });
        }
      });
    });
    const lines = extra.flatMap((e) => [measureLine(e.m50), ...(e.mIn ? [measureLine(e.mIn)] : [])]);
    const text = deck.text.replace(/\.end\n$/, `${lines.join('\n')}\n.end\n`);
    return { deck, text, extra };
  });
  const outputs = runDecks(
    decks.map((d) => ({ name: d.deck.corner.name, text: d.text })),
    { parallel: 2 },
  );
  decks.forEach(({ deck, extra }, i) => {
    const names = [...deck.quantities.map((q) => q.name), ...extra.flatMap((e) => [e.m50.name, ...(e.mIn ? [e.mIn.name] : [])])];
    const parsed = parseSimulatorOutput(outputs[i]!.output, names);
    const ps = (x: number | null | undefined) => (x === null || x === undefined ? '  n/a' : (x * 1e12).toFixed(1).padStart(7));
    for (const e of extra) {
      const sI = parsed.values.get(e.q.name) ?? null;
      const s50 = parsed.values.get(e.m50.name) ?? null;
      const sIn = e.mIn ? (parsed.values.get(e.mIn.name) ?? null) : null;
      const errI = sI === null ? null : e.q.model - sI;
      const err50 = s50 === null ? null : e.model50 - s50;
      const lagM = e.q.model - e.model50;
      const lagS = sI !== null && s50 !== null ? sI - s50 : null;
      let shifter = '';
      if (e.mIn && e.modelIn !== undefined) {
        const errIn = sIn === null ? null : e.modelIn - sIn;
        const delM = e.model50 - e.modelIn;
        const delS = s50 !== null && sIn !== null ? s50 - sIn : null;
        shifter = ` | in50 err ${ps(errIn)} | shifter delay model ${ps(delM)} ngspice ${ps(delS)} err ${ps(delS === null ? null : delM - delS)}`;
      }
      console.log(
        `${name} ${deck.corner.name} ${e.label}: instant model ${ps(e.q.model)} ngspice ${ps(sI)} err ${ps(errI)} | 50% err ${ps(err50)} | lag model ${ps(lagM)} ngspice ${ps(lagS)} err ${ps(lagS === null ? null : lagM - lagS)}${shifter}`,
      );
    }
  });
}
