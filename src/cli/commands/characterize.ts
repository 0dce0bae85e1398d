/**
 * `phasegap characterize PROCESS -o TABLES.json`: delay and transition tables of every cell, pin
 * and edge over a grid of input transition x output load, at each corner, simulated in ngspice.
 */
import { basename, dirname, resolve } from 'node:path';
import { inputError } from '../../errors.js';
import { cornerName } from '../../process/corner.js';
import { expandCorners } from '../../process/corners.js';
import { processCornerOf } from '../../process/device.js';
import { CELLS, type PrimitiveCell } from '../../cells/library.js';
import { TABLE_CELLS, type CornerTables, type DelayTables } from '../../schema/tables.js';
import { parseQuantity, parseTemperature } from '../../units/quantity.js';
import { characterizationDecks, cornerTablesFrom, gridAxes, GRIDS, type CharacterizationDeck } from '../../spice/characterize.js';
import { parseSimulatorOutput } from '../../spice/results.js';
import { cornerRonFrom, ronCharacterizationDeck } from '../../spice/characterize-ron.js';
import { checkSimulator, runDecks } from '../../spice/runner.js';
import type { ProcessCard } from '../../schema/process.js';
import type { Io } from '../io.js';
import { loadDesign, loadProcess } from '../load.js';
import { checkOutput, designFiles, emit } from '../output.js';
import { tablesJson } from '../../spice/tables-json.js';
import { modelFile } from '../model-file.js';
import { progressBar } from '../progress.js';
import { noteTo } from '../warn.js';
import { defineCommand, parsedOption, textOption, type CommandOptions } from '../command.js';
import { JOBS_OPTION, MODELS_OPTION, NGSPICE_OPTION, outOption } from '../common-options.js';

type CornerPoint = { name: string; process: string; vdd: number; temperature: number };

/** Default corners: every process corner at 90/100/110 % of nominal supply and -40/27/125 C. */
export function defaultCorners(card: ProcessCard): CornerPoint[] {
  const out: CornerPoint[] = [];
  for (const process of Object.keys(card.corners)) {
    for (const k of [0.9, 1, 1.1]) {
      const vdd = Number((card.vddNominal * k).toFixed(4));
      for (const temperature of [-40, 27, 125]) out.push({ name: cornerName(process, vdd, temperature), process, vdd, temperature });
    }
  }
  return out;
}

export function parseCornerList(text: string, card: ProcessCard): CornerPoint[] {
  return text
    .split(',')
    .map((s) => s.trim())
    .filter((s) => s !== '')
    .map((name) => {
      const [process, v, t, extra] = name.split('/');
      const vdd = v === undefined ? undefined : parseQuantity(v, 'V');
      const temperature = t === undefined ? undefined : parseTemperature(t);
      if (process === undefined || !vdd?.ok || !temperature?.ok || extra !== undefined) {
        throw inputError(
          'reference.unknown',
          ['--corners'],
          name,
          'is not a corner name; write PROCESS/SUPPLY/TEMPERATURE, e.g. ss/1.62V/125C, separated by commas',
        );
      }
      if (processCornerOf(card, process) === undefined)
        throw inputError(
          'reference.unknown',
          ['--corners'],
          name,
          `names process corner "${process}", which card "${card.name}" does not define (${Object.keys(card.corners).join(', ')})`,
        );
      return { name: cornerName(process, vdd.value, temperature.value), process, vdd: vdd.value, temperature: temperature.value };
    });
}

function parseCells(text: string): PrimitiveCell[] {
  return text
    .split(',')
    .map((s) => s.trim().toUpperCase())
    .map((cell) => {
      if (!Object.hasOwn(CELLS, cell))
        throw inputError('reference.unknown', ['--cells'], cell, `is not a library cell; allowed: ${TABLE_CELLS.join(', ')}`);
      return cell as PrimitiveCell;
    });
}

function parseSize(text: string, flag: string): number {
  const size = Number(text);
  if (!(size > 0 && size <= 1000)) throw inputError('option.invalid', [flag], text, 'must be a cell size above 0 and at most 1000');
  return size;
}

const OPTIONS = {
  corners: textOption(
    '--corners <LIST>',
    'corner names like ss/1.62V/125C, separated by commas (default: every process corner at 90/100/110 % supply and -40/27/125 C)',
  ),
  design: textOption('--design <FILE>', 'characterize the corners of this design instead'),
  grid: textOption(
    '--grid <GRID>',
    'table grid: coarse (4 x 4), fine (7 x 7) or wide (8 x 8: fine with longer transitions and larger loads)',
    { default: 'fine', choices: Object.keys(GRIDS) },
  ),
  cells: parsedOption('--cells <LIST>', 'cells to characterize (default: INV,NAND2,NAND3,NOR2,NOR3)', parseCells, {
    fallback: [...TABLE_CELLS],
  }),
  size: parsedOption('--size <S>', 'cell size to characterize at (default 1; other sizes scale from it)', parseSize, { fallback: 1 }),
  models: MODELS_OPTION,
  ngspice: NGSPICE_OPTION,
  jobs: JOBS_OPTION,
  out: outOption('the tables (JSON)'),
} as const;

export const characterizeCommand = defineCommand({
  name: 'characterize',
  description: 'simulate every cell, pin and edge in ngspice over input transition x load and write delay tables',
  arguments: [{ name: '<PROCESS>', help: 'process card with a spice section (YAML or JSON)' }],
  options: OPTIONS,
  run: (io, [card], options) => runCharacterize(io, card, options),
});

export function runCharacterize(io: Io, processPath: string, options: CommandOptions<typeof OPTIONS>): number {
  const card = loadProcess(processPath);
  const cardDir = dirname(resolve(processPath));
  // commander's choices have refused any other grid.
  const grid = options.grid as keyof typeof GRIDS;
  if (options.corners !== undefined && options.design !== undefined)
    throw inputError('option.invalid', ['--corners'], options.corners, 'cannot be combined with --design; give one of them');
  const { size, cells, jobs } = options;
  let corners: CornerPoint[];
  const inputs = [processPath];
  if (options.design !== undefined) {
    const loaded = loadDesign(options.design, [], io.readStdin);
    const { design } = loaded;
    // Not the card's tables: writing them anew is what characterize is for.
    inputs.push(...designFiles(loaded));
    corners = expandCorners(design.corners, card, design.clock.duty).map(({ corner }) => ({
      name: cornerName(corner.process, corner.vdd, corner.temperature),
      process: corner.process,
      vdd: corner.vdd,
      temperature: corner.temperature,
    }));
    corners = corners.filter((c, i) => corners.findIndex((d) => d.name === c.name) === i);
  } else {
    corners = options.corners === undefined ? defaultCorners(card) : parseCornerList(options.corners, card);
  }
  // A corner where a device cannot turn on is refused before any simulation.
  expandCorners({ list: corners.map((c) => ({ process: c.process, vdd: c.vdd, temperature: c.temperature })) }, card, 0.5);
  const modelPath = modelFile(card, cardDir, options.models);
  inputs.push(modelPath);
  checkOutput(options.out, inputs);
  const simulator = checkSimulator(options.ngspice);
  const axes = gridAxes(card, GRIDS[grid], size);
  const tables: CornerTables[] = [];
  const bar = progressBar(io, corners.length, 'characterize', true, { everyStep: true });
  try {
    for (const corner of corners) {
      const decks: CharacterizationDeck[] = characterizationDecks(card, corner, axes, modelPath, cells);
      const ronDeck = ronCharacterizationDeck(card, corner, modelPath);
      const outputs = runDecks(
        [...decks.map((d) => ({ name: `${corner.name} row ${d.row}`, text: d.text })), { name: `${corner.name} R_on`, text: ronDeck.text }],
        { program: options.ngspice, parallel: jobs },
      );
      const ron = cornerRonFrom(ronDeck, parseSimulatorOutput(outputs[decks.length]!.output, ronDeck.names).values);
      if (typeof ron === 'string')
        throw inputError('tool.failed', ['ngspice'], corner.name, `on-resistance characterization failed: ${ron}`);
      const parts = decks.map((deck, i) => {
        const parsed = parseSimulatorOutput(outputs[i]!.output, deck.names);
        if (parsed.errors.length > 0 && [...parsed.values.values()].every((v) => v === null)) {
          throw inputError('tool.failed', ['ngspice'], corner.name, `characterization failed: ${parsed.errors[0]}`);
        }
        return { deck, values: parsed.values };
      });
      const result = cornerTablesFrom(parts);
      if (typeof result === 'string') throw inputError('tool.failed', ['ngspice'], corner.name, `characterization failed: ${result}`);
      tables.push({ ...result, ron });
      bar.update(tables.length);
    }
  } finally {
    bar.stop();
  }
  if (io.stderrIsTTY) noteTo(io, `characterized ${corners.length} corners with ${simulator}`);
  const file: DelayTables = {
    format: 'phasegap-tables/1',
    process: card.name,
    description: `Characterized with ${simulator} from ${basename(modelPath)}, ${options.grid} grid (${axes.transitions.length} transitions x ${axes.loads.length} loads), cells of size ${size}`,
    size,
    transitions: [...axes.transitions],
    loads: [...axes.loads],
    corners: tables,
  };
  emit(io, tablesJson(file), options.out, inputs);
  if (options.out !== undefined && options.out !== '-')
    noteTo(io, `wrote ${options.out}: ${cells.length} cells at ${tables.length} corners`);
  return 0;
}
