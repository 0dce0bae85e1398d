/**
 * Switch-instant error of the analytic model, and of a card's own tables where it names them,
 * against ngspice (Debian package ngspice) on every shipped design with break-before-make
 * constraints: one transistor-level deck per design and corner (the product's deck writer, as `phasegap confirm` runs it), and for each handover in
 * both directions the model's time from one switch turning off to the other turning on set beside
 * the simulator's, as a fraction of the model's path (`handoverPath`: gate nets' 50 % edges apart
 * plus both instants' lags). Prints per model and card the count, median and signed range;
 * src/switches/instant-band.ts holds the figures. Run after `npm run build`:
 *   node dist/test/bench/instant-band.bench.js [--corners a,b,c]
 * Every design at every corner unless --corners names some.
 */
import { readdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadDesign, loadTables } from '../../src/cli/load.js';
import { tableModel } from '../../src/delay/table.js';
import type { DelayModel } from '../../src/delay/model.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { evaluateCorner } from '../../src/analysis/evaluate.js';
import { analyticModel } from '../../src/delay/analytic.js';
import { generatorDeck } from '../../src/spice/deck.js';
import { parseSimulatorOutput } from '../../src/spice/results.js';
import { runDecks } from '../../src/spice/runner.js';
import { conduction, type Conduction } from '../../src/spice/switch-margins.js';
import type { Quantity } from '../../src/spice/measures.js';
import { handoverPath } from '../../src/checks/switch-checks.js';
import { handover } from '../../src/measure/phases.js';
import { modelFile } from '../../src/cli/model-file.js';

const designs = fileURLToPath(new URL('../../../fixtures/designs/', import.meta.url));
const args = process.argv.slice(2);
const option = (name: string) => {
  const i = args.indexOf(name);
  return i >= 0 ? args[i + 1]!.split(',') : null;
};
const onlyCorners = option('--corners');

const byCard = new Map<string, number[]>();
for (const file of readdirSync(designs)
  .filter((f) => f.endsWith('.yaml'))
  .sort()) {
  const name = file.replace(/\.yaml$/, '');
  const { design, card, cardDir } = loadDesign(join(designs, file));
  if (design.constraints.breakBeforeMake.length === 0) continue;
  const base = resolveDesign(design, card, analyticModel);
  // The analytic model, and the card's tables where it names them (its default model then).
  const models: Array<[string, DelayModel]> = [['analytic', analyticModel]];
  if (card.tables !== undefined) models.push(['table', tableModel(loadTables(resolve(cardDir, card.tables)))]);
  const all = base.corners.map((c) => c.corner);
  const corners = onlyCorners ? all.filter((c) => onlyCorners.includes(c.name)) : all;
  if (corners.length === 0) continue;
  const modelPath = modelFile(card, cardDir);
  const decks = corners.map((corner) => generatorDeck(base, corner, { modelPath }));
  const outputs = runDecks(
    decks.map((d) => ({ name: d.corner.name, text: d.text })),
    { parallel: 2 },
  );
  for (const [modelName, model] of models) {
    const resolved = resolveDesign(design, card, model);
    decks.forEach((simulated, i) => {
      const deck = generatorDeck(resolved, simulated.corner, { modelPath });
      const parsed = parseSimulatorOutput(
        outputs[i]!.output,
        deck.quantities.map((q) => q.name),
      );
      const period = deck.window.period;
      const evaluated = evaluateCorner(resolved, deck.corner);
      const get = (s: string) => evaluated.switches.find((c) => c.name === s)!;
      for (const pair of deck.breakBeforeMake) {
        const events = pair.between.map((s) => deck.quantities.filter((q) => q.event?.switch === s));
        const side = (time: (q: Quantity) => number | null) => events.map((e) => conduction(e, time, period));
        const model = side((q) => q.event!.anchor + q.model);
        const sim = side((q) => {
          const v = parsed.values.get(q.name);
          return v === undefined || v === null ? null : q.event!.anchor + v;
        });
        const [ma, mb] = model as [Conduction, Conduction];
        const [sa, sb] = sim;
        const [ca, cb] = pair.between.map(get) as [ReturnType<typeof get>, ReturnType<typeof get>];
        const directions: Array<[string, Conduction, Conduction, Conduction | null, Conduction | null, number]> = [
          [`${pair.between[0]}->${pair.between[1]}`, ma, mb, sa ?? null, sb ?? null, handoverPath(ca, cb, period)],
          [`${pair.between[1]}->${pair.between[0]}`, mb, ma, sb ?? null, sa ?? null, handoverPath(cb, ca, period)],
        ];
        for (const [label, m1, m2, s1, s2, path] of directions) {
          const modelGap = handover(m1.off, m1.on, m2.on, period);
          if (!s1 || !s2 || path <= 0) {
            console.log(`${name} ${modelName} ${deck.corner.name} ${label}: ngspice did not measure it`);
            continue;
          }
          const simGap = handover(s1.off, s1.on, s2.on, period);
          const rel = (modelGap - simGap) / path;
          const key = `${modelName} ${card.name}`;
          byCard.set(key, [...(byCard.get(key) ?? []), rel]);
          console.log(
            `${name} ${modelName} ${deck.corner.name} ${label}: model ${(modelGap * 1e12).toFixed(1)} ps, ngspice ${(simGap * 1e12).toFixed(1)} ps, path ${(path * 1e12).toFixed(1)} ps, ${(100 * rel).toFixed(1)} %`,
          );
        }
      }
    });
  }
}
const median = (v: number[]) => {
  const s = [...v].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
};
for (const [key, rel] of byCard) {
  console.log(
    `${key}: ${rel.length} handovers, (model - ngspice) / path ${(100 * Math.min(...rel)).toFixed(2)}..${(100 * Math.max(...rel)).toFixed(2)} %, median ${(100 * median(rel)).toFixed(2)} %`,
  );
}
