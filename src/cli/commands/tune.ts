/** `phasegap tune DESIGN`: proposes delay chains that pass every corner, confirmed in ngspice where it is installed. */
import { defaultSpace, tuneChains, type Simulate, type TuneSpace } from '../../analysis/tune.js';
import { renderTuneText, tuneReport } from '../../report/tune-report.js';
import { parseQuantity, type Unit } from '../../units/quantity.js';
import { InputError, inputError } from '../../errors.js';
import type { ProcessCard } from '../../schema/process.js';
import { checkSimulator } from '../../spice/runner.js';
import type { Io } from '../io.js';
import { loadResolved, type ModelOptions } from '../load.js';
import { checkOutput, emit, inputFiles, toJson } from '../output.js';
import { optionalWholeNumber } from '../options.js';
import { MAX_TOP } from '../run-limits.js';
import { confirmCorners } from '../confirm-run.js';
import { modelFile } from '../model-file.js';
import { noteTo, warnTo } from '../warn.js';
import { errorBandText } from '../../delay/error-band.js';

export interface TuneOptions extends ModelOptions {
  readonly set: readonly string[];
  readonly json: boolean;
  readonly out?: string;
  readonly stages?: string;
  readonly sizes?: string;
  readonly maxLoad?: string;
  readonly step?: string;
  readonly top?: string;
  readonly margin?: string;
  /** false with --no-confirm. */
  readonly confirm?: boolean;
  readonly confirmTop?: string;
  readonly models?: string;
  readonly ngspice?: string;
}

function numberList(flag: string, text: string, check: (n: number) => boolean, allowed: string): number[] {
  const items = text.split(',').map((s) => s.trim());
  const values = items.map(Number);
  const bad = items.findIndex((s, i) => s === '' || !check(values[i]!));
  if (bad >= 0) throw inputError('option.invalid', flag, items[bad], allowed);
  return [...new Set(values)].sort((a, b) => a - b);
}

/** A quantity option in `unit`, at least 0 (or above 0 with `positive`); `allowed` words the bound. */
function quantityOption(flag: string, text: string, unit: Unit, positive: boolean, allowed: string): number {
  const q = parseQuantity(text, unit);
  if (!q.ok) throw inputError('option.invalid', flag, text, q.allowed);
  if (!(positive ? q.value > 0 : q.value >= 0)) throw inputError('option.invalid', flag, text, allowed);
  return q.value;
}

const capacitance = (flag: string, text: string) => quantityOption(flag, text, 'F', true, 'must be a positive capacitance, e.g. 200fF');

/**
 * The simulator tune confirms its first proposals with, or why there is none: --no-confirm, no
 * ngspice on the PATH, or a card without SPICE models. A deck ngspice cannot run leaves that
 * proposal unconfirmed.
 */
export function tuneSimulator(io: Io, card: ProcessCard, cardDir: string, options: Pick<TuneOptions, 'confirm' | 'models' | 'ngspice'>): { simulate: Simulate | null; note: string } {
  if (options.confirm === false) return { simulate: null, note: 'skipped with --no-confirm' };
  try {
    modelFile(card, cardDir, options.models);
    checkSimulator(options.ngspice);
  } catch (e) {
    if (e instanceof InputError) return { simulate: null, note: e.message.replace(/\n/g, '; ') };
    throw e;
  }
  const simulate: Simulate = (resolved) => {
    try {
      const run = confirmCorners(io, resolved, cardDir, { corners: 'worst', models: options.models, ngspice: options.ngspice, quiet: true });
      return { simulator: run.simulator, corners: run.comparisons };
    } catch (e) {
      if (e instanceof InputError) return null;
      throw e;
    }
  };
  return { simulate, note: '' };
}

export function runTune(io: Io, designPath: string, options: TuneOptions): number {
  const loaded = loadResolved(designPath, options.set, options, warnTo(io), io.readStdin);
  const { design, card, resolved } = loaded;
  const inputs = inputFiles(loaded, options);
  checkOutput(options.out, inputs);
  const base = defaultSpace(design);
  const gen = design.generator;
  const earlyTap = gen.template === 'netlist' ? 0 : gen.earlyTap;
  const space: TuneSpace = {
    ...base,
    stages: options.stages === undefined ? base.stages
      : numberList('--stages', options.stages, (n) => Number.isInteger(n) && n >= earlyTap && n <= 64 && n % 2 === 0,
        `must be even whole numbers from the early tap (${earlyTap}) to 64, separated by commas, e.g. 2,4,6`),
    stageSizes: options.sizes === undefined ? base.stageSizes
      : numberList('--sizes', options.sizes, (n) => n > 0 && n <= 1000, 'must be stage sizes above 0 and at most 1000, separated by commas, e.g. 1,2'),
    maxLoad: options.maxLoad === undefined ? base.maxLoad : capacitance('--max-load', options.maxLoad),
    loadStep: options.step === undefined ? base.loadStep : capacitance('--step', options.step),
    headroom: options.margin === undefined ? base.headroom : quantityOption('--margin', options.margin, 's', false, 'must be a time of at least 0, e.g. 50ps'),
  };
  if (space.loadStep > space.maxLoad) throw inputError('option.invalid', '--step', options.step, `is larger than the largest stage load (${options.maxLoad ?? 'the default'}); pick a finer step`);
  const top = optionalWholeNumber('--top', options.top, { min: 1, max: MAX_TOP }, 5);
  const confirmTop = optionalWholeNumber('--confirm-top', options.confirmTop, { min: 1, max: 20 }, 3);
  const { simulate, note } = tuneSimulator(io, card, loaded.cardDir, options);
  if (simulate && io.stderrIsTTY && !options.json) noteTo(io, `confirming the first ${confirmTop} proposals in ngspice...`);
  const result = tuneChains(design, card, resolved.model, space, { simulate, confirmTop, top });
  const report = tuneReport(design.name, design.clock.frequency, resolved.corners.length, result, top, note);
  emit(io, options.json ? toJson(report) : renderTuneText(report, designPath, errorBandText(resolved.model.name, card.name)), options.out, inputs);
  return report.verdict === 'pass' ? 0 : 1;
}
