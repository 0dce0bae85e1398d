/**
 * The switch on-resistance model against ngspice (Debian package ngspice) on the shipped cards'
 * own transistor models: one device of W = 10 um at minimum length, biased in deep triode
 * (V_DS = 1 mV) by a hand-written deck, R_on = V_DS / I_D from an operating point (at 10 mV the
 * level-3 linear current's (1 + f_b) V_DS / 2 term adds 0.5-2.6 %, which the model's V_DS -> 0 R_on leaves out). Both cards
 * give the triode threshold SPICE's level-3 temperature law (vthTempco: spice) and move 2 phi_F with
 * temperature: the model is within -0.15..-0.01 % of ngspice on every case below. With their earlier
 * straight laws (1.36 / 1.57 and 1.6 / 1.85 mV/K) and 2 phi_F held at its 27 C value it was within
 * -0.9..+0.5 % at V_SB = 0 and -4.2..-0.9 % at V_SB = 0.5 V (against ngspice at 10 mV).
 */
import { describe, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { loadProcess } from '../../src/cli/load.js';
import { deviceAtCorner } from '../../src/process/device.js';
import { bodyThreshold, triodeResistance } from '../../src/switches/physics.js';
import { expectClose, fixture, processCard } from '../helpers.js';
import { requireTool } from '../tools.js';

requireTool('ngspice', 'ngspice');

const VDS = 0.001;
const W = 10e-6;

interface Case {
  readonly card: 'generic180' | 'generic-lp';
  readonly type: 'n' | 'p';
  readonly process: string;
  readonly vdd: number;
  readonly temperature: number;
  /** Source-to-body reverse bias, V. */
  readonly vsb: number;
  /** R_on ngspice-39 (Debian) gave at V_DS = 1 mV when these cases were last measured, ohm. */
  readonly ngspice: number;
  /** R_on the model gives, ohm (pinned so a change to it shows). */
  readonly model: number;
}

const CASES: readonly Case[] = [
  { card: 'generic180', type: 'n', process: 'tt', vdd: 1.8, temperature: 27, vsb: 0, ngspice: 119.47, model: 119.39 },
  { card: 'generic180', type: 'n', process: 'ss', vdd: 1.62, temperature: 125, vsb: 0, ngspice: 224.75, model: 224.6 },
  { card: 'generic180', type: 'n', process: 'ff', vdd: 1.98, temperature: -40, vsb: 0, ngspice: 66.939, model: 66.899 },
  { card: 'generic180', type: 'n', process: 'tt', vdd: 1.8, temperature: 27, vsb: 0.5, ngspice: 125.94, model: 125.86 },
  { card: 'generic180', type: 'p', process: 'tt', vdd: 1.8, temperature: 27, vsb: 0, ngspice: 262.26, model: 262.24 },
  { card: 'generic180', type: 'p', process: 'ss', vdd: 1.62, temperature: 125, vsb: 0, ngspice: 490.34, model: 490.3 },
  { card: 'generic-lp', type: 'n', process: 'tt', vdd: 1.0, temperature: 27, vsb: 0, ngspice: 22.234, model: 22.208 },
  { card: 'generic-lp', type: 'n', process: 'ss', vdd: 0.9, temperature: 125, vsb: 0, ngspice: 37.013, model: 36.971 },
  { card: 'generic-lp', type: 'p', process: 'ss', vdd: 0.9, temperature: 125, vsb: 0, ngspice: 76.533, model: 76.448 },
  { card: 'generic-lp', type: 'p', process: 'ff', vdd: 1.1, temperature: -40, vsb: 0, ngspice: 28.093, model: 28.061 },
  // Body effect with the card's phi2f at the model file's PHI (0.55 V; with 0.9 V the model gave
  // 42.97 and 87.78 ohm, -7.2 % and -6.3 %), moved with temperature as SPICE moves PHI (with 0.55 V
  // at every temperature, 44.38 and 90.35 ohm, -4.2 % and -3.5 %); ngspice-39 (Debian).
  { card: 'generic-lp', type: 'n', process: 'ss', vdd: 0.9, temperature: 125, vsb: 0.5, ngspice: 45.714, model: 45.652 },
  { card: 'generic-lp', type: 'p', process: 'ss', vdd: 0.9, temperature: 125, vsb: 0.5, ngspice: 92.509, model: 92.395 },
];

/** The hand-written deck: source at 0 V (n) or V_DD (p), body V_SB beyond it, gate fully on. */
function deck(c: Case, lmin: number, params: Readonly<Record<string, number>>): string {
  const p = Object.entries(params)
    .map(([k, v]) => `${k}=${v}`)
    .join(' ');
  const head = [
    `* R_on of one ${c.type} device`,
    `.include ${fixture('models', `${c.card}.lib`)}`,
    ...(p ? [`.param ${p}`] : []),
    `.temp ${c.temperature}`,
  ];
  const body =
    c.type === 'n'
      ? [
          `vg g 0 ${c.vdd}`,
          'vs s 0 0',
          `vb b 0 ${-c.vsb}`,
          `vd d 0 ${VDS}`,
          `m1 d g s b nch w=${W} l=${lmin}`,
          '.op',
          '.control',
          'op',
          'print v(d)/(-i(vd))',
          '.endc',
        ]
      : [
          'vg g 0 0',
          `vs s 0 ${c.vdd}`,
          `vb b 0 ${c.vdd + c.vsb}`,
          `vd d 0 ${c.vdd - VDS}`,
          `m1 d g s b pch w=${W} l=${lmin}`,
          '.op',
          '.control',
          'op',
          `print (v(s)-v(d))/i(vd)`,
          '.endc',
        ];
  return [...head, ...body, '.end', ''].join('\n');
}

function simulate(c: Case): number {
  const card = loadProcess(processCard(c.card));
  const folder = mkdtempSync(join(tmpdir(), 'ron-'));
  try {
    const file = join(folder, 'ron.cir');
    writeFileSync(file, deck(c, card.lmin, card.spice?.corners?.[c.process]?.params ?? {}));
    const out = execFileSync('ngspice', ['-b', file], { encoding: 'utf8', cwd: folder });
    const m = /\) = ([-+\d.e]+)/.exec(out);
    if (!m) throw new Error(`ngspice printed no R_on:\n${out}`);
    return Number(m[1]);
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}

function model(c: Case): number {
  const card = loadProcess(processCard(c.card));
  const d = deviceAtCorner(card, c.type, { name: 'x', process: c.process, vdd: c.vdd, temperature: c.temperature, duty: 0.5 });
  const vt = bodyThreshold(d.switchVth, d.gamma, d.phi2f, c.vsb);
  return triodeResistance(d.kprime, W, card.lmin, c.vdd - vt, d.theta);
}

describe('triodeResistance against ngspice on the shipped cards', () => {
  for (const c of CASES) {
    it(`${c.card} ${c.type} at ${c.process}/${c.vdd}V/${c.temperature}C, V_SB ${c.vsb} V: ${c.model} ohm, within 10 % of ngspice (${c.ngspice} ohm)`, () => {
      const sim = simulate(c);
      expectClose(sim, c.ngspice, 0.005);
      expectClose(model(c), c.model, 0.002);
      expectClose(model(c), sim, 0.1);
    });
  }
});
