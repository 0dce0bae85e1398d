import { describe, expect, it } from 'vitest';
import { cli, design, expectClose, TYPICAL_ONLY } from '../helpers.js';

interface Circuit {
  output: number;
  ripple: number;
  slowLimit: number;
  efficiency: number;
  lostCharge: number;
  startupCycles: number;
}
interface Corner {
  name: string;
  circuit: Circuit;
  checks: { kind: string; pass: boolean; margin: number | null }[];
}

const checked = new Map<string, Corner>();

/** The design's check at tt/1.8V/27C, run once per design for the file. */
function tt(name: string): Corner {
  const known = checked.get(name);
  if (known) return known;
  const run = cli('check', design(name), '--json', ...TYPICAL_ONLY);
  const corner = (JSON.parse(run.stdout) as { corners: Corner[] }).corners[0]!;
  checked.set(name, corner);
  return corner;
}

// Figures measured at tt/1.8V/27C and pinned to 1e-4 relative: a change to the solver or the timing model shows here.
const PIN = 1e-4;

describe('the circuit demos at tt/1.8V/27C', () => {
  it('check of dickson-pump gives 4.600 V: four 0.5 V drops and 3 I/(f C) = 0.6 V off 4 VDD (Dickson 1976, eq. 7), R_SSL = 3/(f C)', () => {
    const c = tt('dickson-pump').circuit;
    // The switches' channel charge and gate coupling (injection.ts) lift it by about 11.9 mV from 4.58852 V.
    expectClose(c.output, 4.600437, PIN);
    expectClose(c.ripple, 7.35e-3, 1e-3);
    expectClose(c.efficiency, 0.271779, PIN);
    expectClose(c.slowLimit, 3 / (20e6 * 5e-12), 0.005);
    expect(c.startupCycles).toBe(145);
    // the ideal figure with 10 fF of node wiring against 5 pF: 4 (VDD - V_d) - 3 I/(f C) = 4.6 V; R_on and the diodes' 400 ohm
    // take some, the switches' gate charge gives a little back
    expect(Math.abs(4 * (1.8 - 0.5) - (3 * 20e-6) / (20e6 * 5e-12) - c.output)).toBeLessThan(0.02);
  });

  it("check of negative-pump gives -1.556 V at 30 uA: -VDD C/(C + C_bp) + I R_out, the bottom plate's parasitic on the pumped plate", () => {
    const c = tt('negative-pump').circuit;
    // The switches' channel charge and gate coupling (injection.ts) take about 0.3 mV of magnitude from -1.556076 V.
    expectClose(c.output, -1.555775, PIN);
    expectClose(c.ripple, 12.209e-3, 1e-3);
    // The two shifters down to -VDD draw about 2.75 pJ a period between them (shifter-energy.ts); ngspice 16.2 % through confirm.
    expectClose(c.efficiency, 0.164729, PIN);
    // slow-switching limit 1/(f C) = 5 kohm, less the 5 % bottom-plate share and the switches' diffusions on the plate
    expectClose(c.slowLimit, 4745.5, 1e-3);
    expect(c.lostCharge).toBe(0);
  });

  it('check of negative-pump checks its maximum (least magnitude) at the heavier load and its minimum at the lighter', () => {
    const k = tt('negative-pump').checks;
    // -0.85 VDD = -1.53 V against -1.5558 V at 30 uA, read 0.3 % of VDD higher (the model's measured
    // output error, figure-error.ts); -VDD = -1.8 V against -1.6511 V at 10 uA, read 0.2 % of VDD lower.
    expectClose(k.find((x) => x.kind === 'output-max')!.margin!, -0.85 * 1.8 + 1.555775 - 0.003 * 1.8, 3e-5, 'abs');
    expectClose(k.find((x) => x.kind === 'output-min')!.margin!, -1.651117 - 0.002 * 1.8 + 1.8, 3e-5, 'abs');
  });

  it("check of sc-integrator-path settles near Vin f Cs R / (1 + f Cs R) = 1.25 V, lifted by its switches' charge (ngspice 1.2646 V)", () => {
    const c = tt('sc-integrator-path').circuit;
    // The p devices' channel charge released on the integrating node at each transfer lifts the level by about 13.7 mV
    // (ngspice 39 through confirm: 1.2646 V, ripple 9.64 mV).
    expectClose(c.output, 1.2637, PIN);
    expectClose(c.ripple, 9.501e-3, 1e-3);
    // 1/(f Cs) = 40 kohm without the charge; the charge released grows as the level falls, a conductance in parallel.
    expectClose(c.slowLimit, 31887, 1e-3);
    expect(c.lostCharge).toBe(0);
  });
});
