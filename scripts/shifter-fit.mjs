// Regenerates the fits of src/switches/shifter-sizing.ts (the cross-coupled up-shifter of
// src/spice/level-shifter.ts): random sizings of the shifter alone, simulated in ngspice at the
// card's nominal corner, and least-squares fits of the measured delays, output and latch-node
// transitions to the stage estimates shifter-edges.ts uses (latch fight, latch p rise, skewed buffer,
// output stage, input ramp), the sizing's fits. Its output is pasted into the GROUNDED and
// FLOATING fits of src/switches/shifter-sizing.ts.
// Run after `npm run build`: node scripts/shifter-fit.mjs [runs] [seed]
// With CORNERS=1 each run is at a random corner of the card (process, supply 1.62/1.8/1.98 V,
// temperature -40/27/125 C) and the script fits the per-corner edge model of shifter-edges.ts
// instead (each set's first coefficient scales with a core inverter's C V / I against the nominal
// corner's, the fight is fightTime's integral, the output stage scales with the output's swing over
// the output devices' drive, the input ramp also enters times its first stage's switching point
// less one half; every third run has no capacitors and a wide pull-down, the short-delay sizing),
// and the output edge's shape with them (each level's time from 50 % in transitions, on the
// log of the latch node's transition over the output's: shifter-shape.ts): its output is pasted
// into the fits' `edges` (PASTE=1 writes them there: paste-edges.mjs).
// With ROWS=1 it prints each run's estimates and measurements; with CHECK=1 it also prints how far
// the fits now in the source are from each run.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadProcess } from '../dist/src/cli/load.js';
import { cornerModels } from '../dist/src/spice/models.js';
import { shifterLines } from '../dist/src/spice/level-shifter.js';
import { nominalCorner, nominalDevices, shifterFits } from '../dist/src/switches/shifter-sizing.js';
import { devicesAtCorner, saturationCurrent } from '../dist/src/process/device.js';
import { fightTime, switchingPoint } from '../dist/src/switches/shifter-edges.js';
import { leastSquares } from './least-squares.mjs';
import { pasteEdges } from './paste-edges.mjs';
import { edgeMeasures, edges, SHAPE_LEVELS, shape, shapeMeasures, simulate } from './shifter-bench.mjs';

const ROOT = fileURLToPath(new URL('..', import.meta.url));
const runs = Number(process.argv[2] ?? 120);
let seed = Number(process.argv[3] ?? 11);
const random = () => {
  seed = (seed * 16807) % 2147483647;
  return seed / 2147483647;
};
const between = (a, b) => a + (b - a) * random();

const card = loadProcess(join(ROOT, 'fixtures', 'processes', 'generic180.yaml'));
const nominal = nominalCorner(card, 0.5);
const nominalVdd = nominal.vdd;
const { n: nominalN, p: nominalP } = nominalDevices(card);
const corners = process.env.CORNERS === '1';
const pick = (list) => list[Math.min(list.length - 1, Math.floor(random() * list.length))];
const current = (d, vgs) => saturationCurrent(d.driveConstant, d.alpha, vgs - d.vth);
const coreTime = (n, p, vdd) => vdd * (1 / current(n, vdd) + 1 / current(p, vdd));
// Output levels (low, high) in units of VDD: grounded 0..2 VDD, floating VDD..2 VDD.
const LEVELS = [
  [0, 2],
  [1, 2],
];
const T = 20e-9;
const rows = [];
const dir = mkdtempSync(join(tmpdir(), 'ushift-'));
for (let k = 0; k < runs; k++) {
  const [lo, hi] = LEVELS[k % LEVELS.length];
  const corner = corners
    ? (() => {
        const process = pick(Object.keys(card.corners));
        const vdd = pick([0.9, 1, 1.1].map((f) => Math.round(f * card.vddNominal * 100) / 100));
        const temperature = pick([-40, 27, 125]);
        return { name: `${process}/${vdd}V/${temperature}C`, process, vdd, temperature, duty: 0.5 };
      })()
    : nominal;
  const vdd = corner.vdd;
  const { n, p } = corners ? devicesAtCorner(card, corner) : { n: nominalN, p: nominalP };
  const models = cornerModels(card, corner, join(ROOT, 'fixtures', 'models', 'generic180.lib'));
  const low = lo * vdd;
  const high = hi * vdd;
  const swing = high - low;
  const unit = card.unit.wn;
  // Every third run with no capacitors and a wide pull-down: what the sizing makes for a short delay.
  const fast = corners && k % 3 === 2;
  const pullDown = Math.round(fast ? between(6, 8) : between(2, 8)) * unit;
  const latchP = between(0.15, 0.3) * pullDown;
  const outputN = between(2, 16) * unit;
  // The output p device as the sizing makes it, alike on both edges (n at the swing, p at the high level), give or take.
  const [nominalSwing, nominalHigh] = [(hi - lo) * nominalVdd, hi * nominalVdd];
  const outputP = outputN * (current(nominalN, nominalSwing) / current(nominalP, nominalHigh)) * between(0.7, 1.4);
  const size = {
    inverterN: 2 * unit,
    bufferN: 2 * unit,
    bufferP: 8 * unit,
    bufferCap: random() < 0.2 || fast ? 0 : between(0, 40e-15),
    pullDown,
    latchP,
    latchCap: random() < 0.2 || fast ? 0 : between(0, 60e-15),
    outputN,
    outputP,
    outputStage: 0,
    estimate: { rise: 0, fall: 0, transition: 0 },
  };
  const load = between(10e-15, 160e-15);
  const input = between(60e-12, 500e-12);
  // Stage estimates at the nominal corner, as shifter-edges.ts forms them.
  const pull = current(n, vdd);
  const latchI = current(p, high);
  const latch = n.cdrain * pullDown + (p.cdrain + p.cgate) * latchP + n.cgate * outputN + p.cgate * outputP + size.latchCap;
  const mid = n.cdrain * size.bufferN + p.cdrain * size.bufferP + (n.cgate + 2 * p.cgate) * size.inverterN + size.bufferCap;
  const fightCurrent = pull * pullDown - latchI * latchP;
  if (!(fightCurrent > 0)) continue;
  // The output stage as the sizing states it, at the nominal corner.
  const outputStage = ((load + nominalN.cdrain * (outputN + outputP)) * nominalSwing) / (outputN * current(nominalN, nominalSwing));
  const terms = corners
    ? {
        core: coreTime(n, p, vdd) / coreTime(nominalN, nominalP, nominalVdd),
        fight: fightTime(latch, high, vdd, n, p, pullDown, latchP),
        latchRise: (latch * high) / (2 * latchI * latchP),
        buffer: (mid * vdd) / (2 * pull * size.bufferN),
        outputRise: (outputStage * (swing / nominalSwing) * current(nominalP, nominalHigh)) / current(p, high),
        outputFall: (outputStage * (swing / nominalSwing) * current(nominalN, nominalSwing)) / current(n, swing),
        bufferPoint: switchingPoint(n, p, vdd, size.bufferN, size.bufferP),
        inverterPoint: switchingPoint(n, p, vdd, size.inverterN, 2 * size.inverterN),
      }
    : {
        core: 1,
        fight: (latch * high) / (2 * fightCurrent),
        latchRise: (latch * high) / (2 * latchI * latchP),
        buffer: (mid * vdd) / (2 * pull * size.bufferN),
        output: outputStage,
      };
  if (!Number.isFinite(terms.fight)) continue;
  const bias = (v) => (v === 0 ? '0' : v === vdd ? 'vdd' : `r${String(v).replace('.', 'p')}`);
  const rails = { vdd: 'vdd', low: bias(low), high: bias(high) };
  const sources = [...new Set([low, high])].filter((v) => v !== 0 && v !== vdd);
  const invert = k % 4 >= 2;
  const deck = [
    'up shifter fit',
    ...models.header,
    `vsupply vdd 0 DC ${vdd}`,
    ...sources.map((v) => `v${bias(v)} ${bias(v)} 0 DC ${v}`),
    `vin in 0 PULSE(0 ${vdd} 1n ${input} ${input} ${T / 2 - input} ${T})`,
    ...shifterLines('ls', 'fit', 'in', 'out', { invert, delay: 300e-12 }, rails, size, { ...models.geometry, l: card.lmin }),
    `cload out ${bias(high)} ${load}`,
    `.tran ${T / 4000} ${2.2 * T} 0 ${T / 4000}`,
    ...edgeMeasures({ vdd, low, high, invert, from: T }),
    ...shapeMeasures({ low, high, latch: 'ls_x', from: T }),
    '.end',
    '',
  ].join('\n');
  const value = simulate(join(dir, `u${k}.cir`), deck);
  const measured = edges(value);
  const row = {
    corner: corner.name,
    levels: [lo, hi],
    input,
    terms,
    ...measured,
    ...shape(value, measured),
  };
  if ([row.rise, row.fall, row.tRise, row.tFall].some((v) => !Number.isFinite(v) || v <= 0)) {
    console.error(`run ${k} (${lo}..${hi} VDD) gave no edges`);
    continue;
  }
  rows.push(row);
}
rmSync(dir, { recursive: true, force: true });

/**
 * The output edge's shape: per level of SHAPE_LEVELS, its time from the 50 % point in transitions,
 * fitted on [1, ln r, ln^2 r] with r the latch node's transition over the output's; and r's range.
 */
function shapeFit(rs, lags, ratio) {
  const logs = rs.map((r) => Math.log(ratio(r)));
  return {
    ratio: [Math.min(...rs.map(ratio)), Math.max(...rs.map(ratio))],
    levels: SHAPE_LEVELS.map((_, j) =>
      leastSquares(
        logs.map((x) => [1, x, x * x]),
        rs.map((r) => lags(r)[j]),
        true,
      ),
    ),
  };
}

function fitFor(group) {
  const rs = rows.filter((r) => r.levels[0] > 0 === group);
  return {
    runs: rs.length,
    fall: leastSquares(
      rs.map((r) => [1, r.terms.fight, r.terms.latchRise, r.terms.output, r.input]),
      rs.map((r) => r.fall),
    ),
    rise: leastSquares(
      rs.map((r) => [1, r.terms.buffer, r.terms.fight, r.terms.output, r.input]),
      rs.map((r) => r.rise),
    ),
    // The sizing's: the output stage alone, since it is chosen before the latch.
    transitionRise: leastSquares(
      rs.map((r) => [1, r.terms.output]),
      rs.map((r) => r.tRise),
    ),
    transitionFall: leastSquares(
      rs.map((r) => [1, r.terms.output]),
      rs.map((r) => r.tFall),
    ),
    // The edges': the output stage and the latch node edge that drives it.
    edgeTransitionRise: leastSquares(
      rs.map((r) => [1, r.terms.output, r.terms.fight]),
      rs.map((r) => r.tRise),
    ),
    edgeTransitionFall: leastSquares(
      rs.map((r) => [1, r.terms.output, r.terms.latchRise]),
      rs.map((r) => r.tFall),
    ),
    latchFall: leastSquares(
      rs.map((r) => [1, r.terms.fight, r.terms.latchRise]),
      rs.map((r) => r.latchFall),
    ),
    latchRise: leastSquares(
      rs.map((r) => [1, r.terms.latchRise]),
      rs.map((r) => r.latchRise),
    ),
  };
}
/** The per-corner edge model's fits (CORNERS=1): shifter-edges.ts's terms, the first on the core time ratio. */
function edgesFor(group) {
  const rs = rows.filter((r) => r.levels[0] > 0 === group);
  const t = (r) => r.terms;
  // Relative least squares: each run's row over its measured value.
  const relativeFit = (xs, ys) =>
    leastSquares(
      xs.map((x, i) => x.map((v) => v / ys[i])),
      ys.map(() => 1),
    );
  return {
    runs: rs.length,
    fall: relativeFit(
      rs.map((r) => [t(r).core, t(r).fight, t(r).latchRise, t(r).outputFall, r.input, r.input * (0.5 - t(r).inverterPoint)]),
      rs.map((r) => r.fall),
    ),
    rise: relativeFit(
      rs.map((r) => [t(r).core, t(r).buffer, t(r).fight, t(r).outputRise, r.input, r.input * (t(r).bufferPoint - 0.5)]),
      rs.map((r) => r.rise),
    ),
    edgeTransitionRise: relativeFit(
      rs.map((r) => [t(r).core, t(r).outputRise, t(r).fight]),
      rs.map((r) => r.tRise),
    ),
    edgeTransitionFall: relativeFit(
      rs.map((r) => [t(r).core, t(r).outputFall, t(r).latchRise]),
      rs.map((r) => r.tFall),
    ),
    latchFall: relativeFit(
      rs.map((r) => [t(r).core, t(r).fight, t(r).latchRise]),
      rs.map((r) => r.latchFall),
    ),
    latchRise: relativeFit(
      rs.map((r) => [t(r).core, t(r).latchRise]),
      rs.map((r) => r.latchRise),
    ),
    riseShape: shapeFit(
      rs,
      (r) => r.riseLags,
      (r) => r.latchFall / r.tRise,
    ),
    fallShape: shapeFit(
      rs,
      (r) => r.fallLags,
      (r) => r.latchRise / r.tFall,
    ),
  };
}
if (corners) {
  const fits = { grounded: edgesFor(false), floating: edgesFor(true) };
  console.log(JSON.stringify(fits, null, 1));
  if (process.env.PASTE === '1') {
    pasteEdges(fits, join(ROOT, 'src', 'switches', 'shifter-sizing.ts'));
    console.log('pasted into src/switches/shifter-sizing.ts; run npx biome format --write src/switches/shifter-sizing.ts');
  }
  process.exit(0);
}
if (process.env.CHECK)
  for (const r of rows) {
    const f = shifterFits(r.levels[0] * nominalVdd);
    const fall = f.fall[0] + f.fall[1] * r.terms.fight + f.fall[2] * r.terms.latchRise + f.fall[3] * r.terms.output + f.fall[4] * r.input;
    const rise = f.rise[0] + f.rise[1] * r.terms.buffer + f.rise[2] * r.terms.fight + f.rise[3] * r.terms.output + f.rise[4] * r.input;
    console.log(
      `levels ${r.levels.join('..')} VDD: fits now in the source give fall ${(100 * (fall / r.fall - 1)).toFixed(1)} %, rise ${(100 * (rise / r.rise - 1)).toFixed(1)} % of ngspice`,
    );
  }
if (process.env.ROWS) for (const r of rows) console.log(JSON.stringify(r));
console.log(JSON.stringify({ grounded: fitFor(false), floating: fitFor(true) }, null, 1));
