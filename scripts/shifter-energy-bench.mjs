// Energy per period of the deck's level shifters alone in ngspice against the model's
// (src/switches/shifter-energy.ts): the cases of test/switches/shifter-energy.test.ts, each shifter
// sized as the model sizes it, its output into a linear capacitor of the switch gate's capacitance,
// its input a ramp on the core supply; one period's charge from every source times its volts.
// Run after `npm run build`: node scripts/shifter-energy-bench.mjs
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadProcess } from '../dist/src/cli/load.js';
import { devicesAtCorner } from '../dist/src/process/device.js';
import { cornerModels } from '../dist/src/spice/models.js';
import { downShifterLines } from '../dist/src/spice/down-shifter.js';
import { shifterLines } from '../dist/src/spice/level-shifter.js';
import { sizeDownShifter } from '../dist/src/switches/down-shifter-sizing.js';
import { switchGateCapacitance } from '../dist/src/switches/plan.js';
import { downShifterEnergy, shifterEnergy } from '../dist/src/switches/shifter-energy.js';
import { sizeShifter } from '../dist/src/switches/shifter-sizing.js';
import { simulate } from './shifter-bench.mjs';

const ROOT = fileURLToPath(new URL('..', import.meta.url));
const card = loadProcess(join(ROOT, 'fixtures', 'processes', 'generic180.yaml'));
const MODELS = join(ROOT, 'fixtures', 'models', 'generic180.lib');
const T = 50e-9;
const load = switchGateCapacitance(card, 'p', 40e-6, 0.18e-6);
const up = { delay: 250e-12, transition: 250e-12, low: { scale: 1, offset: 0 }, high: { scale: 2, offset: 0 }, invert: true };
const down = { delay: 300e-12, transition: 250e-12, low: { scale: -1, offset: 0 }, high: { scale: 0, offset: 0 }, invert: true };
const CORNERS = [
  ['tt', 1.8, 27],
  ['ss', 1.62, 125],
  ['ff', 1.98, -40],
  ['sf', 1.62, 27],
  ['fs', 1.62, -40],
];
const CASES = [
  { name: 'up VDD..2VDD', shifter: up, input: 422.4e-12, size: sizeShifter(up, card, load, 422.4e-12), energy: shifterEnergy },
  { name: 'down -VDD..0', shifter: down, input: 200e-12, size: sizeDownShifter(down, card, load, 200e-12), energy: downShifterEnergy },
];

const dir = mkdtempSync(join(tmpdir(), 'shifter-energy-'));
let k = 0;
for (const c of CASES) {
  for (const [process, vdd, temperature] of CORNERS) {
    const corner = { name: '', process, vdd, temperature, duty: 0.5 };
    const models = cornerModels(card, corner, MODELS);
    const geometry = { ...models.geometry, l: card.lmin };
    const isDown = c.shifter === down;
    // Sources: the core supply, and the shifter's other level (2 VDD up, -VDD down); ground is the other.
    const other = isDown ? -vdd : 2 * vdd;
    const lines = isDown
      ? downShifterLines('ls', 'bench', 'in', 'out', c.shifter, { vdd: 'vdd', low: 'vx', high: '0', outputWell: '0' }, c.size, geometry)
      : shifterLines('ls', 'bench', 'in', 'out', c.shifter, { vdd: 'vdd', low: 'vdd', high: 'vx' }, c.size, geometry);
    const deck = [
      'shifter energy bench',
      ...models.header,
      `vsupply vdd 0 DC ${vdd}`,
      `vother vx 0 DC ${other}`,
      `vin in 0 PULSE(0 ${vdd} 1n ${c.input} ${c.input} ${T / 2 - c.input} ${T})`,
      ...lines,
      `cload out 0 ${load}`,
      `.tran ${T / 10000} ${2.2 * T} 0 ${T / 10000}`,
      `.meas tran qdd INTEG i(vsupply) FROM=${T} TO=${2 * T}`,
      `.meas tran qx INTEG i(vother) FROM=${T} TO=${2 * T}`,
      '.end',
      '',
    ].join('\n');
    const value = simulate(join(dir, `e${k++}.cir`), deck);
    // A source delivers -V times the charge into its + terminal.
    const ngspice = -vdd * value('qdd') - other * value('qx');
    const model = c.energy(c.shifter, c.size, load, devicesAtCorner(card, corner), c.input);
    console.log(
      `${c.name} ${process}/${vdd}V/${temperature}C: ngspice ${(ngspice * 1e15).toFixed(1)} fJ, model ${(model.total * 1e15).toFixed(1)} fJ (${(100 * (model.total / ngspice - 1)).toFixed(1)} %; crowbar ${(model.crowbar * 1e15).toFixed(0)} fJ)`,
    );
  }
}

// The latch alone (negative-pump's s_gnd shifter at tt/1.62V/27C): pull gates stepped in 10 ps by
// ideal sources, the output inverter replaced by its gates' capacitance on the set node; the charge
// each fought latch device passes during its flip, against latch-flip.ts.
{
  const negative = { ...down, delay: 300e-12 };
  const corner = { name: '', process: 'tt', vdd: 1.62, temperature: 27, duty: 0.5 };
  const vdd = corner.vdd;
  const size = sizeDownShifter(negative, card, load, 400e-12);
  const models = cornerModels(card, corner, MODELS);
  const lines = downShifterLines('ls', 'bench', 'in', 'out', negative, { vdd: 'vdd', low: 'vx', high: '0', outputWell: '0' }, size, {
    ...models.geometry,
    l: card.lmin,
  }).filter((line) => !/^(els|mls_i|mls_b|mls_o)/.test(line));
  const gates = card.n.cgate * size.outputN + card.p.cgate * size.outputP;
  const deck = [
    'latch flip bench',
    ...models.header,
    `vsupply vdd 0 DC ${vdd}`,
    `vother vx 0 DC ${-vdd}`,
    `vinb ls_inb 0 PULSE(${vdd} 0 1n 10p 10p 24.6n 50n)`,
    `vset ls_set 0 PULSE(0 ${vdd} 1n 10p 10p 24.6n 50n)`,
    ...lines,
    `cgates ls_x 0 ${gates}`,
    '.save all @mls_n1[id] @mls_n2[id]',
    `.tran 1p ${2.2 * T} 0 5p`,
    // y is pulled up at 51 ns (n2 fought), x at 75.6 ns (n1 fought).
    '.meas tran qy INTEG @mls_n2[id] FROM=50.9e-9 TO=55e-9',
    '.meas tran qx INTEG @mls_n1[id] FROM=74.5e-9 TO=80e-9',
    // ngspice-39 in batch mode runs no analysis whose measures all read device vectors.
    '.meas tran xmax MAX v(ls_x)',
    '.end',
    '',
  ].join('\n');
  const value = simulate(join(dir, 'flip.cir'), deck);
  console.log(
    `latch flips of ${size.pullUp * 1e6} um p pull-ups against ${(size.latchN * 1e6).toFixed(3)} um n latch devices, tt/1.62V/27C: fought charge set node ${(value('qx') * 1e15).toFixed(1)} fC, other node ${(value('qy') * 1e15).toFixed(1)} fC`,
  );
}
if (process.env.KEEP) console.log(`decks kept in ${dir}`);
else rmSync(dir, { recursive: true, force: true });
