import { describe, it, expect } from 'vitest';
import { loadResolved } from '../../src/cli/load.js';
import { devicesAtCorner } from '../../src/process/device.js';
import { onResistanceAt } from '../../src/switches/conduction.js';
import { ronBench, ronFromCurrent, ronSignals } from '../../src/spice/ron-bench.js';
import { design, expectClose } from '../helpers.js';

const { resolved } = loadResolved(design('doubler'), [], {}, () => undefined);
const corner = { name: 'ss/1.62V/125C', process: 'ss', vdd: 1.62, temperature: 125, duty: 0.5 };
const devices = devicesAtCorner(resolved.card, corner);
const bench = ronBench(resolved.switches, devices, { nModel: 'nch', pModel: 'pch', diffusion: 0.5e-6 }, 1e-6);

describe('ronBench', () => {
  it('benches s_gnd at its one signal level, 0 V, with the model R_on of 20 um at ss/1.62V/125C (224.6 ohm / 2, the 10 um value pinned in test/switches/physics-ngspice.test.ts)', () => {
    const q = bench.quantities.filter((r) => r.switch === 's_gnd');
    expect(q.map((r) => r.signal)).toEqual([0]);
    expectClose(q[0]!.model, 224.6 / 2, 2e-3);
    expect(q[0]!.model).toBe(onResistanceAt(resolved.switches[0]!, devices, 0));
  });

  it('holds the gate at the top of a boosted swing (2 VDD for s_chg) and puts the drain 1 mV from the source', () => {
    const i = bench.quantities.findIndex((r) => r.switch === 's_chg') + 1;
    expect(bench.lines).toContain(`vron${i}gn ron${i}gn 0 DC 3.24`);
    expect(bench.lines.some((l) => l.startsWith(`vron${i}s ron${i}s 0 DC 1.62 `))).toBe(true);
    expect(bench.lines).toContain(`vron${i}d ron${i}d 0 DC 1.621`);
    expect(bench.lines).toContain(`.meas tran i_ron${i} FIND i(vron${i}d) AT=1e-6`);
  });

  it('benches a single-device switch at both ends of its signal range (s_out: 1.6 VDD and 2 VDD)', () => {
    expect(ronSignals(resolved.switches[3]!, 1.62).map((v) => Number(v.toFixed(3)))).toEqual([2.592, 3.24]);
  });
});

describe('ronFromCurrent', () => {
  it('divides the 1 mV bench voltage by |I| and gives null for no measurement', () => {
    expectClose(ronFromCurrent(-8.339e-6)!, 119.92, 1e-4);
    expect(ronFromCurrent(null)).toBeNull();
    expect(ronFromCurrent(0)).toBeNull();
  });
});
