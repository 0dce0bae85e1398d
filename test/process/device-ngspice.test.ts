/**
 * The card's alpha-power saturation law against its own transistor models in ngspice (Debian
 * package ngspice): a diode-connected device (V_GS = V_DS = V_DD, W = 1 um, minimum length, source
 * and body at ground) in a hand-written deck, I_D from an operating point, at every process corner,
 * the supply extremes and the temperature extremes of the shipped designs. generic180's law is a
 * fit of fixtures/models/generic180.lib taken as it stands (its prefactor was scaled to 0.955, and
 * 0.888 before the card stated its devices' saturation voltage, to make up for what the edge solver
 * then left out: fixtures/processes/generic180.yaml): the card's I_Dsat is the model file's
 * everywhere, within the fit's error and the corner shifts'.
 * Before the fit the ratio ran from 0.80 to 1.36 over 1.0-1.98 V and -40..125 C.
 */
import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { loadProcess } from '../../src/cli/load.js';
import { deviceAtCorner } from '../../src/process/device.js';
import { fixture, processCard } from '../helpers.js';
import { requireTool } from '../tools.js';

requireTool('ngspice', 'ngspice');

const card = loadProcess(processCard('generic180'));

interface Point {
  readonly type: 'n' | 'p';
  readonly process: string;
  readonly vdd: number;
  readonly temperature: number;
}

const POINTS: Point[] = [];
for (const type of ['n', 'p'] as const)
  for (const process of ['tt', 'ss', 'ff', 'fs', 'sf'])
    for (const vdd of [1.62, 1.98]) for (const temperature of [-40, 125]) POINTS.push({ type, process, vdd, temperature });

/** I_Dsat per metre of width of every point, from one ngspice run per process corner and temperature. */
function simulate(points: readonly Point[]): number[] {
  const folder = mkdtempSync(join(tmpdir(), 'idsat-'));
  try {
    return points.map((c, k) => {
      const params = card.spice?.corners?.[c.process]?.params ?? {};
      const p = Object.entries(params)
        .map(([key, v]) => `${key}=${v}`)
        .join(' ');
      const sign = c.type === 'n' ? 1 : -1;
      const text = [
        `* I_Dsat of one ${c.type} device`,
        `.include ${fixture('models', 'generic180.lib')}`,
        ...(p ? [`.param ${p}`] : []),
        `.temp ${c.temperature}`,
        `vg g 0 ${sign * c.vdd}`,
        `m1 g g 0 0 ${c.type === 'n' ? 'nch' : 'pch'} w=1e-6 l=${card.lmin}`,
        '.op',
        '.control',
        'op',
        'print abs(i(vg))',
        '.endc',
        '.end',
        '',
      ].join('\n');
      const file = join(folder, `p${k}.cir`);
      writeFileSync(file, text);
      const out = execFileSync('ngspice', ['-b', file], { encoding: 'utf8', cwd: folder });
      const m = /abs\(i\(vg\)\) = ([-+\d.e]+)/.exec(out);
      if (!m) throw new Error(`ngspice printed no current:\n${out}`);
      return Number(m[1]) / 1e-6;
    });
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}

describe("generic180's alpha-power law against its model file", () => {
  const simulated = simulate(POINTS);
  const ratios = POINTS.map((c, k) => {
    const d = deviceAtCorner(card, c.type, { name: 'x', process: c.process, vdd: c.vdd, temperature: c.temperature, duty: 0.5 });
    return d.idsatPerWidth / simulated[k]!;
  });

  it('gives the model file’s I_Dsat at every process corner, supply and temperature extreme, within 1 %', () => {
    // Measured when written (ngspice-39): 0.9951 .. 1.0040 over these 40 points, lowest for
    // p at 1.62 V and -40 C, highest for n at 1.98 V and -40 C.
    POINTS.forEach((c, k) => {
      expect(Math.abs(ratios[k]! - 1), `${c.type} ${c.process}/${c.vdd}V/${c.temperature}C`).toBeLessThan(0.01);
    });
  });

  it('keeps the supply and temperature trends: the ratio spreads by less than 1 % over all 40 points', () => {
    // Measured: 1.0090 (the hand-set law before the fit: 0.80 .. 1.36 over 1.0-1.98 V, -40..125 C).
    const spread = Math.max(...ratios) / Math.min(...ratios);
    expect(spread).toBeLessThan(1.01);
  });
});
