import { describe, expect, it } from 'vitest';
import { readFileSync, writeFileSync, existsSync } from 'node:fs';
import { join } from 'node:path';
import { cli, processCard, tempDir } from '../helpers.js';
import { loadProcess } from '../../src/cli/load.js';
import {
  characterizationDecks,
  cornerTablesFrom,
  driverFor,
  gridAxes,
  GRIDS,
  processScale,
  resampleColumn,
} from '../../src/spice/characterize.js';
import { pinCapacitance } from '../../src/cells/library.js';
import { capacitancePerWidth, unitWidths } from '../../src/cells/card-widths.js';
import { expectClose } from '../helpers.js';
import { defaultCorners } from '../../src/cli/commands/characterize.js';

describe('characterization decks', () => {
  const card = loadProcess(processCard('generic180'));

  it('set the grid in the process scale: loads in unit-inverter input capacitances', () => {
    const axes = gridAxes(card, GRIDS.coarse);
    // unit inverter of the card: (0.5 + 1.0) um x 1.92 fF/um = 2.88 fF
    expect(processScale(card).capacitance).toBeCloseTo(2.88e-15, 20);
    expect(axes.loads).toEqual([7.2e-16, 1.152e-14, 4.608e-14, 1.152e-13]);
  });

  it('hold one input transition each, with every cell pin at every load', () => {
    const axes = gridAxes(card, GRIDS.coarse);
    const decks = characterizationDecks(card, { name: 'tt/1.8V/27C', process: 'tt', vdd: 1.8, temperature: 27 }, axes, 'm.lib');
    expect(decks.length).toBe(4);
    // INV 1 + NAND2 2 + NAND3 3 + NOR2 2 + NOR3 3 pins, 4 loads each
    expect(decks[0]!.arcs.length).toBe(11 * 4);
    // An ideal ramp into the driving inverter (falling, so the pin rises first).
    expect(decks[2]!.text).toContain(`PULSE(1.8 0 2e-10 ${axes.transitions[2]}`);
    expect(decks[0]!.text).toMatch(/^xd0 s0 d0 vdd inv_x\S+$/m);
    expect(decks[0]!.text).toMatch(/^vm0 d0 i0 DC 0$/m);
    // The other inputs of a NOR sit low, of a NAND high.
    expect(decks[0]!.text).toMatch(/^x\d+ i\d+ 0 o\d+ vdd nor2_x1$/m);
    expect(decks[0]!.text).toMatch(/^x\d+ i\d+ vdd o\d+ vdd nand2_x1$/m);
  });

  it('aim each row with a driver whose own load is at least twice the pin, so its edge is set by its capacitor', () => {
    const axes = gridAxes(card, GRIDS.fine);
    for (const cell of ['INV', 'NAND2', 'NOR3'] as const) {
      const pin = pinCapacitance(cell, 1, unitWidths(card), capacitancePerWidth(card));
      for (const t of axes.transitions) {
        const d = driverFor(card, axes, cell, t);
        expect(d.size).toBeGreaterThanOrEqual(1);
        expect(d.capacitance + pin).toBeGreaterThanOrEqual(2 * pin * 0.99);
        // C_total = T * s * C_inv / (1.5 * t_unit), the aim of driverFor
        expectClose(d.capacitance + pin, (t * d.size * processScale(card).capacitance) / (1.5 * processScale(card).time), 1e-3);
      }
    }
    // The slowest row needs no more than the cells' own size.
    expect(driverFor(card, axes, 'INV', axes.transitions.at(-1)!).size).toBe(1);
  });

  it('default to every process corner at 90/100/110 % supply and -40/27/125 C', () => {
    const corners = defaultCorners(card);
    expect(corners.length).toBe(45);
    expect(corners[0]!.name).toBe('tt/1.62V/-40C');
  });
});

describe('resampleColumn', () => {
  it('moves values from the measured transitions onto the axis, linear inside and extended at the ends', () => {
    const f = (x: number) => 3e-11 + 0.4 * x;
    const measured = [4e-11, 2e-10, 9e-10];
    const out = resampleColumn(measured, measured.map(f), [2e-11, 1e-10, 1e-9]);
    out.forEach((v, i) => {
      expectClose(v, f([2e-11, 1e-10, 1e-9][i]!), 1e-12);
    });
  });

  it('sorts the points first when a slow row measured faster than its neighbour', () => {
    expect(resampleColumn([2, 1, 3], [20, 10, 30], [1.5, 2.5])).toEqual([15, 25]);
  });
});

describe('cornerTablesFrom', () => {
  it('reads the pin capacitance from the charge to the 50 % point on both edges', () => {
    const axes = { transitions: [1e-10, 2e-10], loads: [1e-15, 2e-15], size: 1 };
    const corner = { name: 'tt/1.8V/27C', process: 'tt', vdd: 1.8, temperature: 27 };
    const parts = [0, 1].map((row) => {
      const arcs = [0, 1].map((column) => ({ cell: 'INV' as const, pin: 0, row, column, id: column }));
      const values = new Map<string, number>();
      for (const { id, column } of arcs) {
        const slew = axes.transitions[row]! * 0.8;
        values.set(`sr${id}`, slew);
        values.set(`sf${id}`, slew);
        for (const m of ['df', 'dr', 'tf', 'tr']) values.set(`${m}${id}`, (row + 1) * (column + 1) * 1e-11);
        // 2 fF rising and 3 fF falling over half of 1.8 V, in units of the 1 fF integrator
        values.set(`qr${id}`, 2 * 0.9);
        values.set(`qh${id}`, 10);
        values.set(`qf${id}`, 10 - 3 * 0.9);
      }
      return { deck: { text: '', corner, arcs, row, axes, names: [] }, values };
    });
    const t = cornerTablesFrom(parts);
    if (typeof t === 'string') throw new Error(t);
    expectClose(t.cells.INV!.pins[0]!.capacitance, 2.5e-15, 1e-9);
    expect(t.cells.INV!.pins[0]!.fall.delay).toEqual([
      [1e-11, 2e-11],
      [2e-11, 4e-11],
    ]);
  });
});

describe('phasegap characterize input errors', () => {
  it('names a malformed corner and an unknown process corner, exit 2, nothing written', () => {
    const out = join(tempDir(), 't.json');
    const a = cli('characterize', processCard('generic180'), '--corners', 'tt/fast', '-o', out);
    expect(a.code).toBe(2);
    expect(a.stderr).toMatch(/--corners: "tt\/fast" is not a corner name; write PROCESS\/SUPPLY\/TEMPERATURE/);
    const b = cli('characterize', processCard('generic180'), '--corners', 'xx/1.8V/27C', '-o', out);
    expect(b.stderr).toMatch(/names process corner "xx", which card "generic180" does not define/);
    expect(existsSync(out)).toBe(false);
  });

  it('asks for a spice section when the card has none', () => {
    const dir = tempDir();
    const text = readFileSync(processCard('generic180'), 'utf8').split(/^spice:/m)[0]!;
    writeFileSync(join(dir, 'card.yaml'), text);
    const r = cli('characterize', join(dir, 'card.yaml'), '--corners', 'tt/1.8V/27C');
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/process\.spice: is missing from card "generic180"; add a spice section/);
  });
});
