// Fits a process card's alpha-power law (alpha, drive, vthTempco, mobilityExponent) to its own
// transistor models: ngspice sweeps a diode-connected device (V_GS = V_DS) of each type at five
// temperatures, and least squares fits log I_Dsat = log(K W) + alpha log(V - vth0 + tc (T - t0))
// - m log(T / T0) with the card's vth0 held, the threshold drift tc found on a 0.02 mV/K grid.
// It also measures each type's drain saturation voltage at V_GS = vddNominal and t0 (output curve
// in ngspice): in the n-th power law's triode form I = I_Dsat (2 - V/V_Dsat)(V/V_Dsat) the slope
// at V_DS = 0 is 2 I_Dsat / V_Dsat, so V_Dsat is where 2 I(V)/g_ds0 meets V; the card's
// vdsatRatio is V_Dsat over the overdrive (vddNominal - vth0).
// Prints each type's fit, its rms and worst error, and the drive the card should state for a given
// prefactor (1 on generic180, whose fit the delay model takes as it stands; 0.97 on generic-lp,
// which matched its delay chain to ngspice at the nominal corner).
// Run after `npm run build`: node scripts/card-fit.mjs CARD.yaml LOW HIGH [PREFACTOR]
//   e.g. node scripts/card-fit.mjs fixtures/processes/generic-lp.yaml 0.85 1.2 0.97
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { loadProcess } from '../dist/src/cli/load.js';
import { leastSquares } from './least-squares.mjs';

const [cardPath, lowArg, highArg, prefactorArg] = process.argv.slice(2);
if (!cardPath || !lowArg || !highArg) {
  console.error('usage: node scripts/card-fit.mjs CARD.yaml LOW HIGH [PREFACTOR]');
  process.exit(2);
}
const low = Number(lowArg);
const high = Number(highArg);
const prefactor = Number(prefactorArg ?? 1);
const card = loadProcess(cardPath);
if (!card.spice) throw new Error(`${cardPath} names no spice models`);
const models = resolve(dirname(cardPath), card.spice.models);
const temperatures = [-40, 0, 27, 75, 125];
const STEP = 0.025;
const work = mkdtempSync(join(tmpdir(), 'card-fit-'));

/** I_Dsat of a 1 um wide, minimum-length device with V_GS = V_DS from low to high, per temperature. */
function sweep(type) {
  const model = type === 'n' ? card.spice.n : card.spice.p;
  const sign = type === 'n' ? 1 : -1;
  const rows = [];
  for (const t of temperatures) {
    const out = join(work, `${type}${t}.txt`);
    const deck = [
      `I_Dsat ${type} at ${t} C`,
      `.include ${models}`,
      `.options temp=${t} tnom=${card.t0}`,
      `vg g 0 ${sign * low}`,
      `m1 g g 0 0 ${model} w=1u l=${card.lmin * 1e6}u`,
      `.dc vg ${sign * low} ${sign * (high + STEP / 2)} ${sign * STEP}`,
      '.control',
      'run',
      `wrdata ${out} i(vg)`,
      '.endc',
      '.end',
      '',
    ].join('\n');
    const file = join(work, `${type}${t}.cir`);
    writeFileSync(file, deck);
    // In batch mode ngspice exits 1 when a deck has no .print lines, though the .control block ran.
    const run = spawnSync('ngspice', ['-b', file], { encoding: 'utf8' });
    if (!existsSync(out)) throw new Error(`ngspice wrote no sweep for ${file}: ${run.stderr}`);
    for (const line of readFileSync(out, 'utf8').trim().split('\n')) {
      const [v, i] = line.trim().split(/\s+/).map(Number);
      rows.push({ t, v: Math.abs(v), i: Math.abs(i) });
    }
  }
  return rows;
}

/** V_Dsat / (vddNominal - vth0) from the output curve at V_GS = vddNominal, t0. */
function saturationRatio(type, device) {
  const model = type === 'n' ? card.spice.n : card.spice.p;
  const sign = type === 'n' ? 1 : -1;
  const vdd = card.vddNominal;
  const out = join(work, `${type}-out.txt`);
  const deck = [
    `output curve ${type}`,
    `.include ${models}`,
    `.options temp=${card.t0} tnom=${card.t0}`,
    `vg g 0 ${sign * vdd}`,
    `vd d 0 0`,
    `m1 d g 0 0 ${model} w=1u l=${card.lmin * 1e6}u`,
    `.dc vd 0 ${sign * vdd} ${(sign * vdd) / 1000}`,
    '.control',
    'run',
    `wrdata ${out} i(vd)`,
    '.endc',
    '.end',
    '',
  ].join('\n');
  const file = join(work, `${type}-out.cir`);
  writeFileSync(file, deck);
  const run = spawnSync('ngspice', ['-b', file], { encoding: 'utf8' });
  if (!existsSync(out)) throw new Error(`ngspice wrote no output curve for ${file}: ${run.stderr}`);
  const curve = readFileSync(out, 'utf8')
    .trim()
    .split('\n')
    .map((line) => line.trim().split(/\s+/).map(Number))
    .map(([v, i]) => ({ v: Math.abs(v), i: Math.abs(i) }));
  const g0 = curve[1].i / curve[1].v;
  const k = curve.findIndex((p) => p.v > 0 && (2 * p.i) / g0 <= p.v);
  if (k < 1) throw new Error(`${type}: no saturation voltage below ${vdd} V`);
  const a = curve[k - 1];
  const b = curve[k];
  const fa = (2 * a.i) / g0 - a.v;
  const fb = (2 * b.i) / g0 - b.v;
  const vdsat = a.v + ((b.v - a.v) * fa) / (fa - fb);
  return { vdsat, ratio: vdsat / (vdd - device.vth0) };
}

function fitLaw(rows, device) {
  const t0 = card.t0 + 273.15;
  let best = null;
  for (let tc = 0; tc <= 3e-3 + 1e-12; tc += 0.02e-3) {
    const xs = rows.map((r) => [1, Math.log(r.v - device.vth0 + tc * (r.t - card.t0)), -Math.log((r.t + 273.15) / t0)]);
    const ys = rows.map((r) => Math.log(r.i));
    const { coef } = leastSquares(xs, ys);
    const errors = xs.map((x, k) => Math.exp(x.reduce((s, v, j) => s + v * coef[j], 0) - ys[k]) - 1);
    const rms = Math.sqrt(errors.reduce((s, e) => s + e * e, 0) / errors.length);
    if (!best || rms < best.rms) best = { tc, coef, rms, worst: Math.max(...errors.map(Math.abs)) };
  }
  return best;
}

try {
  for (const type of ['n', 'p']) {
    const best = fitLaw(sweep(type), card[type]);
    const [logK, alpha, m] = best.coef;
    const k = Math.exp(logK) / 1e-6; // A per metre of width per V^alpha
    const sat = saturationRatio(type, card[type]);
    console.log(
      `${type}: alpha ${alpha.toFixed(3)}, vthTempco ${(best.tc * 1e3).toFixed(2)} mV/K, mobilityExponent ${m.toFixed(3)}, ` +
        `fit prefactor ${k.toFixed(0)} A/m/V^alpha (drive at ${prefactor}: ${(k * prefactor).toFixed(0)}); ` +
        `rms ${(100 * best.rms).toFixed(2)} %, worst ${(100 * best.worst).toFixed(2)} % over ${low}..${high} V; ` +
        `V_Dsat ${sat.vdsat.toFixed(3)} V at ${card.vddNominal} V, vdsatRatio ${sat.ratio.toFixed(3)} (alpha - 1: ${(alpha - 1).toFixed(3)})`,
    );
  }
} finally {
  rmSync(work, { recursive: true, force: true });
}
