import { describe, expect, it } from 'vitest';
import { readFileSync, writeFileSync, existsSync } from 'node:fs';
import { join } from 'node:path';
import { cli, processCard, tempDir } from '../helpers.js';
import { loadProcess } from '../../src/cli/load.js';
import { characterizationDecks, gridAxes, GRIDS, processScale } from '../../src/spice/characterize.js';
import { defaultCorners } from '../../src/cli/commands/characterize.js';

describe('characterization decks', () => {
  const card = loadProcess(processCard('generic180'));

  it('set the grid in the process scale: loads in unit-inverter input capacitances', () => {
    const axes = gridAxes(card, GRIDS.coarse);
    // unit inverter of the card: (0.5 + 1.0) um x 1.6 fF/um = 2.4 fF
    expect(processScale(card).capacitance).toBeCloseTo(2.4e-15, 20);
    expect(axes.loads).toEqual([1.2e-15, 9.6e-15, 3.84e-14, 9.6e-14]);
  });

  it('hold one input transition each, with every cell pin at every load', () => {
    const axes = gridAxes(card, GRIDS.coarse);
    const decks = characterizationDecks(card, { name: 'tt/1.8V/27C', process: 'tt', vdd: 1.8, temperature: 27 }, axes, 'm.lib');
    expect(decks.length).toBe(4);
    // INV 1 + NAND2 2 + NAND3 3 + NOR2 2 + NOR3 3 pins, 4 loads each
    expect(decks[0]!.arcs.length).toBe(11 * 4);
    expect(decks[2]!.text).toContain(`PULSE(0 1.8 2e-10 ${axes.transitions[2]}`);
    // The other inputs of a NOR sit low, of a NAND high.
    expect(decks[0]!.text).toMatch(/^x\d+ i\d+ 0 o\d+ vdd nor2_x1$/m);
    expect(decks[0]!.text).toMatch(/^x\d+ i\d+ vdd o\d+ vdd nand2_x1$/m);
  });

  it('default to every process corner at 90/100/110 % supply and -40/27/125 C', () => {
    const corners = defaultCorners(card);
    expect(corners.length).toBe(45);
    expect(corners[0]!.name).toBe('tt/1.62V/-40C');
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
