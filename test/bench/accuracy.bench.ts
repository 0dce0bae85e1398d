/**
 * Dead-time error of each delay model against ngspice (Debian package ngspice) on the shipped
 * designs: one transistor-level deck per design and corner (the product's deck writer, as
 * `phasegap confirm` runs it), simulated once, and every model's 50 % dead times set beside the
 * simulator's. Prints, per model and card, the median and worst relative error and the worst
 * absolute error; src/delay/error-band.ts holds the figures. Run after `npm run build`:
 *   node dist/test/bench/accuracy.bench.js [MODEL=TABLES.json ...] [--corners a,b,c]
 */
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
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
import { cornerName, type Corner } from '../../src/process/corner.js';

const designs = fileURLToPath(new URL('../../../fixtures/designs/', import.meta.url));
const args = process.argv.slice(2);
const cornerArg = args.indexOf('--corners');
const wanted = cornerArg >= 0 ? args[cornerArg + 1]!.split(',') : null;
const extra = args.filter((a, i) => a.includes('=') && (cornerArg < 0 || i !== cornerArg + 1)).map((a) => a.split('=') as [string, string]);

/**
 * By default five corners per design: tt at the middle supply and temperature, ss at the lowest
 * supply hottest and coldest (the slowest corner, and the one where temperature inversion shows),
 * ff at the highest supply coldest and hottest.
 */
function defaultPick(all: readonly Corner[]): Corner[] {
  const vdds = [...new Set(all.map((c) => c.vdd))].sort((a, b) => a - b);
  const temps = [...new Set(all.map((c) => c.temperature))].sort((a, b) => a - b);
  const mid = (v: number[]) => v[v.length >> 1]!;
  const picks: Array<[string, number, number]> = [
    ['tt', mid(vdds), mid(temps)],
    ['ss', vdds[0]!, temps.at(-1)!],
    ['ss', vdds[0]!, temps[0]!],
    ['ff', vdds.at(-1)!, temps[0]!],
    ['ff', vdds.at(-1)!, temps.at(-1)!],
  ];
  return picks
    .map(([p, v, t]) => all.find((c) => c.process === p && c.vdd === v && c.temperature === t))
    .filter((c): c is Corner => c !== undefined);
}

interface Errors {
  relative: number[];
  absolute: number[];
}
const byKey = new Map<string, Errors>();
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
  const models: Array<[string, DelayModel]> = [['analytic', analyticModel]];
  for (const [name, path] of extra) {
    const tables = loadTables(path);
    if (tables.process === card.name) models.push([name, tableModel(tables)]);
  }
  const base = resolveDesign(design, card, analyticModel);
  const all = base.corners.map((c) => c.corner);
  const corners = wanted ? all.filter((c) => wanted.includes(cornerName(c.process, c.vdd, c.temperature))) : defaultPick(all);
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
      for (const q of compareCorner(deck, parsed, 0.1).quantities) {
        if (q.kind !== 'dead' || q.relativeError === null || q.simulator === null) continue;
        note(`${name} ${card.name}`, q.relativeError, q.model - q.simulator);
        console.log(
          `${file} ${name} ${corner.name} ${q.quantity}: model ${(q.model * 1e12).toFixed(1)} ps, ngspice ${(q.simulator * 1e12).toFixed(1)} ps, ${(100 * q.relativeError).toFixed(1)} %`,
        );
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
    `${key}: ${e.relative.length} dead times, |error| median ${(100 * median(abs)).toFixed(1)} %, worst ${(100 * Math.max(...abs)).toFixed(1)} %, ` +
      `signed ${(100 * Math.min(...e.relative)).toFixed(1)}..${(100 * Math.max(...e.relative)).toFixed(1)} %, absolute ${(Math.min(...e.absolute) * 1e12).toFixed(0)}..${(Math.max(...e.absolute) * 1e12).toFixed(0)} ps`,
  );
}
