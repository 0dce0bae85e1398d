/**
 * Dead-time error of each delay model against ngspice (Debian package ngspice) on the shipped
 * designs: one transistor-level deck per design and corner (the product's deck writer, as
 * `phasegap confirm` runs it) at every corner unless --corners names some, simulated once, and
 * every model's 50 % dead times and clean gaps set beside the simulator's. Prints, per model and
 * card, the dead time's median and worst relative error and worst absolute error, and the clean
 * gap's error range over the model's dead time; src/delay/error-band.ts holds the figures.
 * Run after `npm run build`:
 *   node dist/test/bench/accuracy.bench.js [MODEL=TABLES.json ...] [--corners a,b,c]
 */
import { readdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadDesign, loadTables } from '../../src/cli/load.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { analyticModel } from '../../src/delay/analytic.js';
import { tableModel } from '../../src/delay/table.js';
import type { DelayModel } from '../../src/delay/model.js';
import { generatorDeck } from '../../src/spice/deck.js';
import { compareCorner } from '../../src/spice/confirm.js';
import { parseSimulatorOutput } from '../../src/spice/results.js';
import { runDecks } from '../../src/spice/runner.js';
import { modelFile } from '../../src/cli/model-file.js';
import { cornerName } from '../../src/process/corner.js';

const designs = fileURLToPath(new URL('../../../fixtures/designs/', import.meta.url));
const args = process.argv.slice(2);
const cornerArg = args.indexOf('--corners');
const wanted = cornerArg >= 0 ? args[cornerArg + 1]!.split(',') : null;
const extra = args.filter((a, i) => a.includes('=') && (cornerArg < 0 || i !== cornerArg + 1)).map((a) => a.split('=') as [string, string]);

interface Errors {
  relative: number[];
  absolute: number[];
}
const byKey = new Map<string, Errors>();
const gapByKey = new Map<string, Errors>();
const noteGap = (key: string, fraction: number, abs: number) => {
  const e = gapByKey.get(key) ?? { relative: [], absolute: [] };
  e.relative.push(fraction);
  e.absolute.push(abs);
  gapByKey.set(key, e);
};
const note = (key: string, rel: number, abs: number) => {
  const e = byKey.get(key) ?? { relative: [], absolute: [] };
  e.relative.push(rel);
  e.absolute.push(abs);
  byKey.set(key, e);
};

for (const file of readdirSync(designs)
  .filter((f) => f.endsWith('.yaml'))
  .sort()) {
  const loaded = loadDesign(join(designs, file));
  const { design, card, cardDir } = loaded;
  // The analytic model, the card's own tables where it names them, and any named on the command line.
  const models: Array<[string, DelayModel]> = [['analytic', analyticModel]];
  if (card.tables !== undefined) models.push(['table', tableModel(loadTables(resolve(loaded.cardDir, card.tables)))]);
  for (const [name, path] of extra) {
    const tables = loadTables(path);
    if (tables.process === card.name) models.push([name, tableModel(tables)]);
  }
  const base = resolveDesign(design, card, analyticModel);
  const all = base.corners.map((c) => c.corner);
  // Every corner of every design by default: the skewed corners (sf, fs) are where the edges drag most.
  const corners = wanted === null ? all : all.filter((c) => wanted.includes(cornerName(c.process, c.vdd, c.temperature)));
  if (corners.length === 0) continue;
  const modelPath = modelFile(card, cardDir);
  const decks = corners.map((corner) => generatorDeck(base, corner, { modelPath }));
  const outputs = runDecks(
    decks.map((d) => ({ name: d.corner.name, text: d.text })),
    { parallel: 2 },
  );
  for (const [name, model] of models) {
    const resolved = resolveDesign(design, card, model);
    corners.forEach((corner, i) => {
      const deck = generatorDeck(resolved, corner, { modelPath });
      const parsed = parseSimulatorOutput(
        outputs[i]!.output,
        decks[i]!.quantities.map((q) => q.name),
      );
      const compared = compareCorner(deck, parsed, 0.1).quantities;
      for (const q of compared) {
        if (q.relativeError === null || q.simulator === null) continue;
        if (q.kind === 'dead') {
          note(`${name} ${card.name}`, q.relativeError, q.model - q.simulator);
          console.log(
            `${file} ${name} ${corner.name} ${q.quantity}: model ${(q.model * 1e12).toFixed(1)} ps, ngspice ${(q.simulator * 1e12).toFixed(1)} ps, ${(100 * q.relativeError).toFixed(1)} %`,
          );
        }
        // The clean gap's error over the model's dead time of the same handover: what GAP_BANDS hold.
        const dead = q.kind === 'gap' ? compared.find((d) => d.quantity === q.quantity.replace(/^gap /, 'dead ')) : undefined;
        if (dead) {
          const error = q.model - q.simulator;
          noteGap(`${name} ${card.name}`, error / dead.model, error);
          console.log(
            `${file} ${name} ${corner.name} ${q.quantity}: model ${(q.model * 1e12).toFixed(1)} ps, ngspice ${(q.simulator * 1e12).toFixed(1)} ps, ${(100 * (error / dead.model)).toFixed(1)} % of the dead time`,
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
for (const [key, e] of byKey) {
  const abs = e.relative.map(Math.abs);
  console.log(
    `${key}: ${e.relative.length} dead times, |error| median ${(100 * median(abs)).toFixed(2)} %, worst ${(100 * Math.max(...abs)).toFixed(2)} %, ` +
      `signed ${(100 * Math.min(...e.relative)).toFixed(2)}..${(100 * Math.max(...e.relative)).toFixed(2)} %, absolute ${(Math.min(...e.absolute) * 1e12).toFixed(0)}..${(Math.max(...e.absolute) * 1e12).toFixed(0)} ps`,
  );
}
for (const [key, e] of gapByKey) {
  console.log(
    `${key}: ${e.relative.length} clean gaps, (model - ngspice) / model dead time ${(100 * Math.min(...e.relative)).toFixed(2)}..${(100 * Math.max(...e.relative)).toFixed(2)} %, ` +
      `absolute ${(Math.min(...e.absolute) * 1e12).toFixed(1)}..${(Math.max(...e.absolute) * 1e12).toFixed(1)} ps`,
  );
}
