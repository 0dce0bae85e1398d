/** `phasegap tune DESIGN`: proposes delay chains that pass every corner with the least wasted dead time. */
import { defaultSpace, tuneChains, type TuneSpace } from '../../analysis/tune.js';
import { renderTuneText, tuneReport } from '../../report/tune-report.js';
import { parseQuantity } from '../../units/quantity.js';
import { inputError } from '../../errors.js';
import type { Io } from '../io.js';
import { loadResolved, type ModelOptions } from '../load.js';
import { emit, toJson } from '../output.js';
import { wholeNumber } from './mc.js';

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
}

function numberList(flag: string, text: string, check: (n: number) => boolean, allowed: string): number[] {
  const items = text.split(',').map((s) => s.trim());
  const values = items.map(Number);
  const bad = items.findIndex((s, i) => s === '' || !check(values[i]!));
  if (bad >= 0) throw inputError(flag, items[bad], allowed);
  return [...new Set(values)].sort((a, b) => a - b);
}

function capacitance(flag: string, text: string): number {
  const q = parseQuantity(text, 'F');
  if (!q.ok) throw inputError(flag, text, q.allowed);
  if (!(q.value > 0)) throw inputError(flag, text, 'must be a positive capacitance, e.g. 200fF');
  return q.value;
}

function time(flag: string, text: string): number {
  const q = parseQuantity(text, 's');
  if (!q.ok) throw inputError(flag, text, q.allowed);
  if (!(q.value >= 0)) throw inputError(flag, text, 'must be a time of at least 0, e.g. 50ps');
  return q.value;
}

export function runTune(io: Io, designPath: string, options: TuneOptions): number {
  const { design, card, resolved } = loadResolved(designPath, options.set, options, (m) => io.stderr(`phasegap: warning: ${m}\n`));
  const base = defaultSpace(design);
  const gen = design.generator;
  const earlyTap = gen.template === 'netlist' ? 0 : gen.earlyTap;
  const space: TuneSpace = {
    stages: options.stages === undefined ? base.stages
      : numberList('--stages', options.stages, (n) => Number.isInteger(n) && n >= earlyTap && n <= 64 && n % 2 === 0,
        `must be even whole numbers from the early tap (${earlyTap}) to 64, separated by commas, e.g. 2,4,6`),
    stageSizes: options.sizes === undefined ? base.stageSizes
      : numberList('--sizes', options.sizes, (n) => n > 0 && n <= 1000, 'must be stage sizes above 0 and at most 1000, separated by commas, e.g. 1,2'),
    maxLoad: options.maxLoad === undefined ? base.maxLoad : capacitance('--max-load', options.maxLoad),
    loadStep: options.step === undefined ? base.loadStep : capacitance('--step', options.step),
    headroom: options.margin === undefined ? 0 : time('--margin', options.margin),
  };
  if (space.loadStep > space.maxLoad) throw inputError('--step', options.step, `is larger than the largest stage load (${options.maxLoad ?? 'the default'}); pick a finer step`);
  const top = wholeNumber('--top', options.top, 1, 5);
  const result = tuneChains(design, card, resolved.model, space);
  const report = tuneReport(design.name, design.clock.frequency, resolved.corners.length, result, top);
  emit(io, options.json ? toJson(report) : renderTuneText(report, designPath), options.out);
  return report.verdict === 'pass' ? 0 : 1;
}
