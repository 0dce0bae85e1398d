import { describe, it, expect } from 'vitest';
import { spawnSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadProcess } from '../../src/cli/load.js';
import { cornerRonFrom, ronCharacterizationDeck } from '../../src/spice/characterize-ron.js';
import { parseSimulatorOutput } from '../../src/spice/results.js';
import { expectClose, fixture, processCard, tempDir } from '../helpers.js';
import { requireTool } from '../tools.js';

requireTool('ngspice', 'ngspice');

const card = loadProcess(processCard('generic180'));

function characterize(corner: { name: string; process: string; vdd: number; temperature: number }) {
  const dir = tempDir();
  const deck = ronCharacterizationDeck(card, corner, fixture('models', 'generic180.lib'));
  writeFileSync(join(dir, 'ron.cir'), deck.text);
  const run = spawnSync('ngspice', ['-b', 'ron.cir'], { encoding: 'utf8', cwd: dir });
  return cornerRonFrom(deck, parseSimulatorOutput(`${run.stdout}${run.stderr}`, deck.names).values);
}

describe('ronCharacterizationDeck', () => {
  // The hand-written decks of test/switches/physics-ngspice.test.ts measured 119.92 ohm (n) and
  // 263.24 ohm (p) at W/L = 10 / 0.18 at tt/1.8V/27C in ngspice: 6662 and 14624 ohm per square.
  it('gives R_on * W/L of 6662 ohm (n) and 14624 ohm (p) at tt/1.8V/27C in ngspice, as the hand-written bench', () => {
    const ron = characterize({ name: 'tt/1.8V/27C', process: 'tt', vdd: 1.8, temperature: 27 });
    if (typeof ron === 'string') expect.fail(ron);
    expectClose(ron.n, 119.92 * (10 / 0.18), 0.005);
    expectClose(ron.p, 263.24 * (10 / 0.18), 0.005);
  });

  it('says which measurement is missing when ngspice gave none', () => {
    const deck = ronCharacterizationDeck(card, { name: 'tt', process: 'tt', vdd: 1.8, temperature: 27 }, 'x.lib');
    expect(
      cornerRonFrom(
        deck,
        new Map([
          ['ron_in', null],
          ['ron_ip', 1e-4],
        ]),
      ),
    ).toBe('ron_in was not measured');
  });
});
