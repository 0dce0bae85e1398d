// Regenerates the fits of src/switches/down-shifter-sizing.ts: random sizings of the shifter to a
// level below ground (src/spice/down-shifter.ts) alone, simulated in ngspice at the card's nominal
// corner, and least-squares fits of the measured delays and transitions to the stage estimates.
// Run after `npm run build`: node scripts/down-shifter-fit.mjs [runs] [seed]
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadProcess } from '../dist/src/cli/load.js';
import { cornerModels } from '../dist/src/spice/models.js';
import { downShifterLines } from '../dist/src/spice/down-shifter.js';
import { downLatchRatio, downShifterTerms } from '../dist/src/switches/down-shifter-sizing.js';
import { nominalCorner } from '../dist/src/switches/shifter-sizing.js';
import { leastSquares } from './least-squares.mjs';
import { edgeMeasures, edges, simulate } from './shifter-bench.mjs';

const ROOT = fileURLToPath(new URL('..', import.meta.url));
const runs = Number(process.argv[2] ?? 60);
let seed = Number(process.argv[3] ?? 7);
const random = () => {
  seed = (seed * 16807) % 2147483647;
  return seed / 2147483647;
};
const between = (a, b) => a + (b - a) * random();

const card = loadProcess(join(ROOT, 'fixtures', 'processes', 'generic180.yaml'));
const corner = nominalCorner(card, 0.5);
const vdd = corner.vdd;
const models = cornerModels(card, corner, join(ROOT, 'fixtures', 'models', 'generic180.lib'));
// Output levels (low, high) in units of VDD: a negative pump's, a full -VDD..VDD, both below ground, a narrow one.
const LEVELS = [
  [-1, 0],
  [-1, 1],
  [-2, -1],
  [-0.5, 0.5],
  [-1.5, 0],
];
const T = 20e-9;
const rows = [];
const dir = mkdtempSync(join(tmpdir(), 'dshift-'));
for (let k = 0; k < runs; k++) {
  const [lo, hi] = LEVELS[k % LEVELS.length];
  const low = lo * vdd;
  const high = hi * vdd;
  const levels = { low: { scale: lo, offset: 0 }, high: { scale: hi, offset: 0 } };
  const unitN = card.unit.wn;
  const unitP = card.unit.wp;
  const pullUp = Math.round(between(2, 8)) * unitP;
  const latchRatio = between(0.5, 1.2) * downLatchRatio(card, levels);
  const outputN = between(1, 12) * unitN;
  const size = {
    inverterN: 2 * unitN,
    bufferN: 8 * unitN,
    bufferP: unitP,
    bufferCap: random() < 0.2 ? 0 : between(0, 40e-15),
    pullUp,
    latchN: latchRatio * pullUp,
    latchCap: random() < 0.2 ? 0 : between(0, 60e-15),
    outputN,
    outputP: outputN * between(1.5, 3.5),
  };
  const load = between(10e-15, 160e-15);
  const input = between(60e-12, 500e-12);
  const terms = downShifterTerms(card, levels, size, load);
  const bias = (v) => (v === 0 ? '0' : v === vdd ? 'vdd' : `r${String(v).replace('-', 'm').replace('.', 'p')}`);
  const rails = { vdd: 'vdd', low: bias(low), high: bias(high), outputWell: bias(Math.max(0, high)) };
  const sources = [...new Set([low, high, Math.max(0, high)])].filter((v) => v !== 0 && v !== vdd);
  const full = { ...size, estimate: { rise: 0, fall: 0, transition: 0 } };
  const invert = k % 2 === 1;
  const deck = [
    'down shifter fit',
    ...models.header,
    `vsupply vdd 0 DC ${vdd}`,
    ...sources.map((v) => `v${bias(v)} ${bias(v)} 0 DC ${v}`),
    `vin in 0 PULSE(0 ${vdd} 1n ${input} ${input} ${T / 2 - input} ${T})`,
    ...downShifterLines('ls', 'fit', 'in', 'out', { invert, delay: 300e-12 }, rails, full, { ...models.geometry, l: card.lmin }),
    `cload out ${bias(Math.max(0, high))} ${load}`,
    `.tran ${T / 4000} ${2.2 * T} 0 ${T / 4000}`,
    ...edgeMeasures({ vdd, low, high, invert, from: T }),
    `.meas tran v_lo MIN v(out) FROM=${T} TO=${2 * T}`,
    `.meas tran v_hi MAX v(out) FROM=${T} TO=${2 * T}`,
    '.end',
    '',
  ].join('\n');
  const value = simulate(join(dir, `d${k}.cir`), deck);
  const row = {
    levels: [lo, hi],
    input,
    terms,
    ...edges(value),
    lo: value('v_lo'),
    hi: value('v_hi'),
  };
  if ([row.rise, row.fall, row.tRise, row.tFall].some((v) => !Number.isFinite(v) || v <= 0)) {
    console.error(`run ${k} (${lo}..${hi} VDD) gave no edges`, row);
    continue;
  }
  rows.push(row);
}
rmSync(dir, { recursive: true, force: true });

const rise = leastSquares(
  rows.map((r) => [1, r.terms.pullUp, r.terms.latch, r.terms.output, r.input]),
  rows.map((r) => r.rise),
);
const fall = leastSquares(
  rows.map((r) => [1, r.terms.buffer, r.terms.pullUp, r.terms.output, r.input]),
  rows.map((r) => r.fall),
);
const tRise = leastSquares(
  rows.map((r) => [1, r.terms.output, r.terms.latch]),
  rows.map((r) => r.tRise),
);
const tFall = leastSquares(
  rows.map((r) => [1, r.terms.output, r.terms.pullUp]),
  rows.map((r) => r.tFall),
);
const swingErr = Math.max(...rows.map((r) => Math.max(Math.abs(r.lo - r.levels[0] * vdd), Math.abs(r.hi - r.levels[1] * vdd))));
if (process.env.ROWS)
  for (const r of rows)
    console.log(
      JSON.stringify({
        l: r.levels,
        in: +(r.input * 1e12).toFixed(0),
        pu: +(r.terms.pullUp * 1e12).toFixed(1),
        la: +(r.terms.latch * 1e12).toFixed(1),
        bu: +(r.terms.buffer * 1e12).toFixed(1),
        out: +(r.terms.output * 1e12).toFixed(1),
        rise: +(r.rise * 1e12).toFixed(1),
        fall: +(r.fall * 1e12).toFixed(1),
        tr: +(r.tRise * 1e12).toFixed(1),
        tf: +(r.tFall * 1e12).toFixed(1),
      }),
    );
console.log(JSON.stringify({ runs: rows.length, rise, fall, tRise, tFall, worstExcursionPastRails: swingErr }, null, 1));
