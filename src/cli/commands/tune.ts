/** `phasegap tune DESIGN`: proposes delay chains that pass every corner, confirmed in ngspice where it is installed. */
import { defaultSpace, tuneChains, type Simulate, type TuneSpace } from '../../analysis/tune.js';
import { renderTuneText, tuneReport } from '../../report/tune-report.js';
import { parseQuantity, type Unit } from '../../units/quantity.js';
import { InputError, inputError } from '../../errors.js';
import type { ProcessCard } from '../../schema/process.js';
import { checkSimulator } from '../../spice/runner.js';
import type { Io } from '../io.js';
import { loadResolved } from '../load.js';
import { emit, toJson, checkedInputs } from '../output.js';
import { wholeNumberIn } from '../options.js';
import { MAX_TOP } from '../run-limits.js';
import { confirmCorners } from '../confirm-run.js';
import { modelFile } from '../model-file.js';
import { noteTo, warnTo } from '../warn.js';
import { hasHandovers, modelErrorText } from '../../report/model-error.js';
import { defineCommand, flagOption, parsedOption, textOption, type CommandOptions } from '../command.js';
import { SET_OPTION, jsonOption, outOption } from '../common-options.js';

function numberList(flag: string, text: string, check: (n: number) => boolean, allowed: string): number[] {
  const items = text.split(',').map((s) => s.trim());
  const values = items.map(Number);
  const bad = items.findIndex((s, i) => s === '' || !check(values[i]!));
  if (bad >= 0) throw inputError('option.invalid', [flag], items[bad], allowed);
  return [...new Set(values)].sort((a, b) => a - b);
}

/** A quantity option in `unit`, at least 0 (or above 0 with `positive`); `allowed` words the bound. */
function quantityOption(flag: string, text: string, unit: Unit, positive: boolean, allowed: string): number {
  const q = parseQuantity(text, unit);
  if (!q.ok) throw inputError('option.invalid', [flag], text, q.allowed);
  if (!(positive ? q.value > 0 : q.value >= 0)) throw inputError('option.invalid', [flag], text, allowed);
  return q.value;
}

const capacitance = (flag: string, text: string) => quantityOption(flag, text, 'F', true, 'must be a positive capacitance, e.g. 200fF');

const OPTIONS = {
  set: SET_OPTION,
  stages: textOption('--stages <LIST>', 'chain lengths to try, even, e.g. 2,4,6 (default: every even length from the early tap to 16)'),
  sizes: textOption('--sizes <LIST>', "stage sizes to try, e.g. 1,2 (default: the design's own, 1 and 2)"),
  maxLoad: textOption('--max-load <C>', 'largest delay capacitor per chain node (default 500fF)'),
  step: textOption('--step <C>', 'resolution of the delay capacitor (default 0.5fF)'),
  margin: parsedOption(
    '--margin <T>',
    "headroom every check must keep beyond its requirement, e.g. 50ps (default: the model's band + z sigma of mismatch; 0: just pass)",
    (text, flag) => quantityOption(flag, text, 's', false, 'must be a time of at least 0, e.g. 50ps'),
  ),
  top: parsedOption('--top <N>', 'proposals to list (default 5)', wholeNumberIn({ min: 1, max: MAX_TOP }), { fallback: 5 }),
  confirm: flagOption('--no-confirm', 'do not simulate the first proposals in ngspice'),
  confirmTop: parsedOption(
    '--confirm-top <N>',
    'proposals to confirm in ngspice at their worst corners (default 3)',
    wholeNumberIn({ min: 1, max: 20 }),
    { fallback: 3 },
  ),
  models: textOption('--models <FILE>', "SPICE model file for the confirmation instead of the card's spice.models"),
  ngspice: textOption('--ngspice <PATH>', 'the ngspice executable (default: ngspice on the PATH)'),
  json: jsonOption('print the machine report (SI units)'),
  out: outOption('the report'),
} as const;

export type TuneOptions = CommandOptions<typeof OPTIONS>;

export const tuneCommand = defineCommand({
  name: 'tune',
  description: 'proposes delay-chain length, stage size and delay capacitor that pass every corner with the least wasted dead time',
  arguments: [{ name: '<DESIGN>', help: 'design file (YAML or JSON) with a nand or nor template' }],
  options: OPTIONS,
  run: (io, [design], options) => runTune(io, design, options),
});

/**
 * The simulator tune confirms its first proposals with, or why there is none: --no-confirm, no
 * ngspice on the PATH, or a card without SPICE models. A deck ngspice cannot run leaves that
 * proposal unconfirmed.
 */
export function tuneSimulator(
  io: Io,
  card: ProcessCard,
  cardDir: string,
  options: { readonly confirm?: boolean; readonly models?: string; readonly ngspice?: string },
): { simulate: Simulate | null; note: string } {
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
      const run = confirmCorners(io, resolved, cardDir, {
        corners: 'worst',
        models: options.models,
        ngspice: options.ngspice,
        quiet: true,
      });
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
  const inputs = checkedInputs(loaded, options);
  const base = defaultSpace(design);
  const gen = design.generator;
  const earlyTap = gen.template === 'netlist' ? 0 : gen.earlyTap;
  const space: TuneSpace = {
    ...base,
    stages:
      options.stages === undefined
        ? base.stages
        : numberList(
            '--stages',
            options.stages,
            (n) => Number.isInteger(n) && n >= earlyTap && n <= 64 && n % 2 === 0,
            `must be even whole numbers from the early tap (${earlyTap}) to 64, separated by commas, e.g. 2,4,6`,
          ),
    stageSizes:
      options.sizes === undefined
        ? base.stageSizes
        : numberList(
            '--sizes',
            options.sizes,
            (n) => n > 0 && n <= 1000,
            'must be stage sizes above 0 and at most 1000, separated by commas, e.g. 1,2',
          ),
    maxLoad: options.maxLoad === undefined ? base.maxLoad : capacitance('--max-load', options.maxLoad),
    loadStep: options.step === undefined ? base.loadStep : capacitance('--step', options.step),
    headroom: options.margin ?? base.headroom,
  };
  if (space.loadStep > space.maxLoad)
    throw inputError(
      'option.invalid',
      ['--step'],
      options.step,
      `is larger than the largest stage load (${options.maxLoad ?? 'the default'}); pick a finer step`,
    );
  const { top, confirmTop } = options;
  const { simulate, note } = tuneSimulator(io, card, loaded.cardDir, options);
  if (simulate && io.stderrIsTTY && !options.json) noteTo(io, `confirming the first ${confirmTop} proposals in ngspice...`);
  const result = tuneChains(design, card, resolved.model, space, { simulate, confirmTop, top });
  const report = tuneReport(design.name, design.clock.frequency, resolved.corners.length, result, top, note);
  emit(
    io,
    options.json
      ? toJson(report)
      : renderTuneText(report, designPath, modelErrorText(resolved.model.name, card.name, hasHandovers(resolved))),
    options.out,
    inputs,
  );
  return report.verdict === 'pass' ? 0 : 1;
}
