import { describe, it, expect } from 'vitest';
import { loadProcess } from '../../src/cli/load.js';
import { devicesAtCorner } from '../../src/process/device.js';
import { triodeResistance } from '../../src/switches/physics.js';
import { ronCalibration } from '../../src/switches/tabulated-ron.js';
import { expectClose, processCard } from '../helpers.js';

const card = loadProcess(processCard('generic180'));
const tt = devicesAtCorner(card, { name: 'tt/1.8V/27C', process: 'tt', vdd: 1.8, temperature: 27, duty: 0.5 });
const sheet = (d: typeof tt.n) => triodeResistance(d.kprime, 1, 1, 1.8 - d.switchVth, d.theta);

describe('ronCalibration', () => {
  it("scales k' so the triode law meets the tabulated R_on * W/L at the characterized corner", () => {
    const calibrated = ronCalibration([{ process: 'tt', vdd: 1.8, temperature: 27, ron: { n: 2 * sheet(tt.n), p: sheet(tt.p) } }])(tt);
    expectClose(calibrated.n.kprime, tt.n.kprime / 2, 1e-12);
    expectClose(calibrated.p.kprime, tt.p.kprime, 1e-12);
    expectClose(sheet(calibrated.n), 2 * sheet(tt.n), 1e-12);
  });

  it('takes the largest correction of the process corner between characterized corners (the higher R_on), and none for another process corner', () => {
    const cold = devicesAtCorner(card, { name: 'tt/1.8V/-40C', process: 'tt', vdd: 1.8, temperature: -40, duty: 0.5 });
    const hot = devicesAtCorner(card, { name: 'tt/1.8V/125C', process: 'tt', vdd: 1.8, temperature: 125, duty: 0.5 });
    const calibrate = ronCalibration([
      { process: 'tt', vdd: 1.8, temperature: -40, ron: { n: 1.1 * sheet(cold.n), p: sheet(cold.p) } },
      { process: 'tt', vdd: 1.8, temperature: 125, ron: { n: 1.3 * sheet(hot.n), p: sheet(hot.p) } },
    ]);
    expectClose(calibrate(tt).n.kprime, tt.n.kprime / 1.3, 1e-9);
    const ss = devicesAtCorner(card, { name: 'ss/1.8V/27C', process: 'ss', vdd: 1.8, temperature: 27, duty: 0.5 });
    expect(calibrate(ss).n.kprime).toBe(ss.n.kprime);
  });
});

describe('table model with characterized R_on', () => {
  it("doubles the doubler's s_gnd R_on at tt/1.8V/27C when the tables say R_on * W/L is twice the card's law", async () => {
    const { loadDesign, loadTables } = await import('../../src/cli/load.js');
    const { tableModel } = await import('../../src/delay/table.js');
    const { resolveDesign } = await import('../../src/analysis/resolve.js');
    const { evaluateCorner } = await import('../../src/analysis/evaluate.js');
    const { design, fixture } = await import('../helpers.js');
    const tables = loadTables(fixture('tables', 'generic180.json'));
    const corner = { name: 'tt/1.8V/27C', process: 'tt', vdd: 1.8, temperature: 27, duty: 0.5 };
    const withRon = {
      ...tables,
      corners: tables.corners.map((c) =>
        c.process === 'tt' && c.vdd === 1.8 && c.temperature === 27 ? { ...c, ron: { n: 2 * sheet(tt.n), p: sheet(tt.p) } } : c,
      ),
    };
    expect(withRon.corners.some((c) => c.ron)).toBe(true);
    const d = loadDesign(design('doubler')).design;
    const plain = evaluateCorner(resolveDesign(d, card, tableModel(tables)), corner);
    const calibrated = evaluateCorner(resolveDesign(d, card, tableModel(withRon)), corner);
    const ron = (r: typeof plain, name: string) => r.switches.find((s) => s.name === name)!.ron;
    expectClose(ron(calibrated, 's_gnd'), 2 * ron(plain, 's_gnd'), 1e-9);
    expectClose(ron(calibrated, 's_vdd'), ron(plain, 's_vdd'), 1e-12);
  });
});
