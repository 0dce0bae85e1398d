/** The command line: parses arguments with commander, runs one command, maps errors to exit codes. */
import { Command, CommanderError, Option } from 'commander';
import { InputError, renderIssues } from '../errors.js';
import type { Io } from './io.js';
import { runCheck } from './commands/check.js';
import { runInit } from './commands/init.js';
import { runSchema } from './commands/schema.js';
import { runTune } from './commands/tune.js';
import { runFmax } from './commands/fmax.js';
import { runSpice } from './commands/spice.js';
import { runConfirm } from './commands/confirm.js';
import { runCharacterize } from './commands/characterize.js';
import { runVerilog } from './commands/verilog.js';
import { runMc } from './commands/mc.js';
import { runWaves } from './commands/waves.js';
import { runSweep } from './commands/sweep.js';
import { VERSION } from './version.js';
import { runDiff } from './commands/diff.js';

export const EXIT_PASS = 0;
export const EXIT_FAIL = 1;
export const EXIT_INPUT = 2;

const collect = (value: string, previous: string[]): string[] => [...previous, value];

function setOption(): Option {
  return new Option('--set <PATH=VALUE>', 'override a design value before validation (repeatable), e.g. clock.frequency=40MHz')
    .argParser(collect).default([]);
}

function junitOption(): Option {
  return new Option('--junit <FILE>', 'also write the results as JUnit XML for a CI server (one test case per check)');
}

function outOption(what: string): Option {
  return new Option('-o, --out <FILE>', `write ${what} to FILE atomically ('-' for stdout)`);
}

/** Commander's own messages ("error: unknown option ...", "(Did you mean check?)") in the program's line style. */
function commanderError(text: string): string {
  const body = text.startsWith('error: ') ? text : `error: ${text}`;
  return body.replace(/^(?=.)/gm, 'phasegap: ');
}

export function buildProgram(io: Io, setCode: (code: number | Promise<number>) => void): Command {
  const program = new Command('phasegap')
    .description('Dead time, break-before-make and settling checks for two-phase non-overlapping clock generators')
    .version(VERSION)
    .exitOverride()
    .configureOutput({ writeOut: (s) => io.stdout(s), writeErr: (s) => io.stderr(s), outputError: (s, write) => write(commanderError(s)) })
    .showHelpAfterError('phasegap: run phasegap --help for usage')
    .option('--model <KIND>', 'delay model for every command: analytic or table (default: table when the process card names tables)')
    .option('--tables <FILE>', 'delay tables (from phasegap characterize) to use instead of the card\'s; implies --model table');

  program.command('check')
    .description('every corner: dead times, gaps, widths, requirement margins and a verdict')
    .argument('<DESIGN>', 'design file (YAML or JSON)')
    .addOption(setOption())
    .option('--json', 'print the machine report (SI units) instead of the table', false)
    .addOption(outOption('the report'))
    .addOption(junitOption())
    .action((design: string, _opts: unknown, cmd: Command) => setCode(runCheck(io, design, cmd.optsWithGlobals())));

  program.command('fmax')
    .description('highest clock frequency at which every check holds at every corner, and what limits it')
    .argument('<DESIGN>', 'design file (YAML or JSON)')
    .addOption(setOption())
    .option('--resolution <REL>', 'relative resolution of the search (default 0.001 = 0.1 %)')
    .option('--json', 'print the machine report (SI units)', false)
    .addOption(outOption('the report'))
    .action((design: string, _opts: unknown, cmd: Command) => setCode(runFmax(io, design, cmd.optsWithGlobals())));

  program.command('tune')
    .description('proposes delay-chain length, stage size and delay capacitor that pass every corner with the least wasted dead time')
    .argument('<DESIGN>', 'design file (YAML or JSON) with a nand or nor template')
    .addOption(setOption())
    .option('--stages <LIST>', 'chain lengths to try, even, e.g. 2,4,6 (default: every even length from the early tap to 16)')
    .option('--sizes <LIST>', "stage sizes to try, e.g. 1,2 (default: the design's own, 1 and 2)")
    .option('--max-load <C>', 'largest delay capacitor per chain node (default 500fF)')
    .option('--step <C>', 'resolution of the delay capacitor (default 0.5fF)')
    .option('--margin <T>', "headroom every check must keep beyond its requirement, e.g. 50ps (default: the model's band + z sigma of mismatch; 0: just pass)")
    .option('--top <N>', 'proposals to list (default 5)')
    .option('--no-confirm', 'do not simulate the first proposals in ngspice')
    .option('--confirm-top <N>', 'proposals to confirm in ngspice at their worst corners (default 3)')
    .option('--models <FILE>', "SPICE model file for the confirmation instead of the card's spice.models")
    .option('--ngspice <PATH>', 'the ngspice executable (default: ngspice on the PATH)')
    .option('--json', 'print the machine report (SI units)', false)
    .addOption(outOption('the report'))
    .action((design: string, _opts: unknown, cmd: Command) => setCode(runTune(io, design, cmd.optsWithGlobals())));

  program.command('sweep')
    .description('batch grid over corner axes and design values; one worst-case row per point, CSV or JSON, streamed')
    .argument('<DESIGN>', 'design file (YAML or JSON)')
    .addOption(setOption())
    .addOption(new Option('--vary <AXIS=VALUES>', 'an axis: process|vdd|temperature|duty or a design path (clock.frequency, generator.stages, loads.p1, switches[0].w), with a list a,b,c or a range START:STOP:N (repeatable: a grid)')
      .argParser(collect).default([]))
    .option('--workers <K>', 'threads (default: the number of cores); rows do not depend on it')
    .option('--json', 'write a JSON array instead of CSV', false)
    .addOption(outOption('the rows'))
    .action((design: string, _opts: unknown, cmd: Command) => setCode(runSweep(io, design, cmd.optsWithGlobals())));

  program.command('mc')
    .description('Monte Carlo local mismatch (Pelgrom) on every corner: yield with a 95 % interval, sigma margins')
    .argument('<DESIGN>', 'design file (YAML or JSON)')
    .addOption(setOption())
    .option('--samples <N>', 'dies to draw (default: montecarlo.samples, else 1000)')
    .option('--seed <S>', 'random seed, a whole number (default: montecarlo.seed, else 1)')
    .option('--workers <K>', 'threads (default: the number of cores); results do not depend on it')
    .option('--replay <INDEX>', 'evaluate one die at every corner and print its check table')
    .option('--histogram <FILE.svg>', 'also draw a histogram over the dies: by default the margin of the check that limits yield at the worst corner')
    .option('--histogram-corner <NAME>', "corner the histogram shows (default: 'worst', the corner with the lowest yield)")
    .option('--histogram-check <NAME>', "check the histogram shows: a check name or a unique part of one, or 'dead-times' for both dead times")
    .option('--timings', 'print on stderr how long setup, evaluation and the report took', false)
    .option('--json', 'print the machine report (SI units)', false)
    .addOption(outOption('the report'))
    .addOption(junitOption())
    .action((design: string, _opts: unknown, cmd: Command) => setCode(runMc(io, design, cmd.optsWithGlobals())));

  program.command('draw')
    .description('SVG timing diagram of a corner (or worst, or all overlaid as edge envelopes), or the margin chart')
    .argument('<DESIGN>', 'design file (YAML or JSON)')
    .addOption(setOption())
    .option('--corner <NAME>', "a corner name like ss/1.62V/125C, 'worst' (the corner of the limiting check) or 'all'", 'worst')
    .option('--nets <WHICH>', "'phases' (clock, phases, complements, early phases) or 'all' (every internal net too)", 'phases')
    .option('--chart <KIND>', "'timing' (waveforms) or 'margins' (every check's margin at every corner)", 'timing')
    .addOption(outOption('the SVG'))
    .action((design: string, _opts: unknown, cmd: Command) => setCode(import('./commands/draw.js').then((m) => m.runDraw(io, design, cmd.optsWithGlobals()))));

  program.command('report')
    .description('self-contained review page: summary, diagrams, margin chart, corner table, process card, cautions')
    .argument('<DESIGN>', 'design file (YAML or JSON)')
    .addOption(setOption())
    .option('--format <FORMAT>', "'html' (one self-contained file) or 'md' (Markdown with the SVGs beside it)", 'html')
    .option('--no-fmax', 'skip the maximum-frequency search')
    .option('--no-tune', 'skip the delay-chain proposals (nand/nor templates)')
    .option('--confirm <WHICH>', 'add ngspice against the model at these corners: worst, all, or names separated by commas')
    .option('--tolerance <REL>', 'with --confirm: largest allowed relative difference (default: requirements.confirmTolerance, else 10 %)')
    .option('--models <FILE>', 'with --confirm: SPICE model file instead of the card\'s spice.models')
    .option('--ngspice <PATH>', 'with --confirm: the ngspice executable (default: ngspice on the PATH)')
    .option('--mc <N>', 'add a Monte Carlo section with N dies per corner (yield, sigma margins, dead-time histogram)')
    .option('--seed <S>', 'Monte Carlo seed (default: montecarlo.seed, else 1)')
    .addOption(outOption('the report'))
    .action((design: string, _opts: unknown, cmd: Command) => setCode(import('./commands/report.js').then((m) => m.runReport(io, design, cmd.optsWithGlobals()))));

  program.command('waves')
    .description('steady-state waveforms of a corner as an IEEE 1364 VCD file (50 % crossings, switch conduction)')
    .argument('<DESIGN>', 'design file (YAML or JSON)')
    .addOption(setOption())
    .option('--corner <NAME>', "a corner name like ss/1.62V/125C or 'worst'", 'worst')
    .option('--nets <WHICH>', "'phases' or 'all' (internal nets in scope internal)", 'phases')
    .option('--timescale <UNIT>', "'1fs' or '10fs'", '1fs')
    .option('--periods <N>', 'clock periods to dump', '2')
    .addOption(outOption('the VCD'))
    .action((design: string, _opts: unknown, cmd: Command) => setCode(runWaves(io, design, cmd.optsWithGlobals())));

  program.command('diff')
    .description('compare two check reports (check --json): margin changes, new and fixed failures, dead-time shifts')
    .argument('<OLD.json>', 'the baseline report')
    .argument('<NEW.json>', 'the report to compare with it')
    .option('--tolerance <T>', 'margin loss and dead-time shift to ignore, e.g. 5ps (default 1ps)')
    .option('--voltage-tolerance <V>', 'margin loss to ignore on the switch bias checks (default 1mV)')
    .option('--json', 'print the comparison as JSON (SI units)', false)
    .addOption(outOption('the comparison'))
    .action((before: string, after: string, opts: Parameters<typeof runDiff>[3]) => setCode(runDiff(io, before, after, opts)));

  program.command('schema')
    .description('print the JSON Schema of the design file')
    .addOption(outOption('the schema'))
    .action((opts: { out?: string }) => setCode(runSchema(io, opts)));

  program.command('init')
    .description('write a commented starter design that passes check')
    .addOption(new Option('--template <STYLE>', 'generator style').choices(['nand', 'nor']).default('nand'))
    .addOption(outOption('the design').default('design.yaml'))
    .option('--force', 'overwrite an existing file', false)
    .action((opts: { template: string; out: string; force: boolean }) => setCode(runInit(io, opts)));

  program.command('spice')
    .description('write a runnable ngspice testbench of the generator and its switches at one corner')
    .argument('<DESIGN>', 'design file (YAML or JSON)')
    .addOption(setOption())
    .option('--corner <NAME>', 'the corner, e.g. ss/1.62V/125C, or worst (the limiting corner)', 'worst')
    .option('--models <FILE>', 'SPICE model file to include instead of the card\'s spice.models')
    .addOption(outOption('the deck'))
    .action((design: string, _opts: unknown, cmd: Command) => setCode(runSpice(io, design, cmd.optsWithGlobals())));

  program.command('confirm')
    .description('simulate corners in ngspice and compare dead times, gaps and widths with the model')
    .argument('<DESIGN>', 'design file (YAML or JSON)')
    .addOption(setOption())
    .option('--corners <WHICH>', 'worst (the extremes), all, or corner names separated by commas', 'worst')
    .option('--tolerance <REL>', 'largest allowed relative difference, e.g. 0.1 or 10% (default 10 %)')
    .option('--models <FILE>', 'SPICE model file to include instead of the card\'s spice.models')
    .option('--ngspice <PATH>', 'the ngspice executable (default: ngspice on the PATH)')
    .option('--jobs <N>', 'simulations at once (default: the number of cores)')
    .option('--json', 'print the machine report (SI units)', false)
    .addOption(outOption('the report'))
    .addOption(junitOption())
    .action((design: string, _opts: unknown, cmd: Command) => setCode(runConfirm(io, design, cmd.optsWithGlobals())));

  program.command('characterize')
    .description('simulate every cell, pin and edge in ngspice over input transition x load and write delay tables')
    .argument('<PROCESS>', 'process card with a spice section (YAML or JSON)')
    .option('--corners <LIST>', 'corner names like ss/1.62V/125C, separated by commas (default: every process corner at 90/100/110 % supply and -40/27/125 C)')
    .option('--design <FILE>', 'characterize the corners of this design instead')
    .addOption(new Option('--grid <GRID>', 'table grid: coarse (4 x 4) or fine (7 x 7)').choices(['coarse', 'fine']).default('fine'))
    .option('--cells <LIST>', 'cells to characterize (default: INV,NAND2,NAND3,NOR2,NOR3)')
    .option('--size <S>', 'cell size to characterize at (default 1; other sizes scale from it)')
    .option('--models <FILE>', 'SPICE model file to include instead of the card\'s spice.models')
    .option('--ngspice <PATH>', 'the ngspice executable (default: ngspice on the PATH)')
    .option('--jobs <N>', 'simulations at once (default: the number of cores)')
    .addOption(outOption('the tables (JSON)'))
    .action((card: string, opts: Parameters<typeof runCharacterize>[2]) => setCode(runCharacterize(io, card, opts)));

  program.command('verilog')
    .description('write a structural Verilog model of the generator with the corner\'s rise/fall gate delays')
    .argument('<DESIGN>', 'design file (YAML or JSON)')
    .addOption(setOption())
    .option('--corner <NAME>', 'the corner, e.g. tt/1.8V/27C, or worst (the limiting corner)', 'worst')
    .option('--testbench', 'append a testbench that drives the clock and dumps a VCD file', false)
    .option('--periods <N>', 'clock periods the testbench runs (default 6)')
    .option('--vcd <FILE>', 'VCD file the testbench writes (default <module>.vcd)')
    .addOption(outOption('the Verilog'))
    .action((design: string, _opts: unknown, cmd: Command) => setCode(runVerilog(io, design, cmd.optsWithGlobals())));

  return program;
}

/**
 * Runs the CLI on `argv` (without node and script) and returns the exit code, or a promise of it
 * for the commands that run in parallel threads (mc, sweep).
 */
export function run(argv: readonly string[], io: Io): number | Promise<number> {
  const outcome: { code: number | Promise<number> } = { code: EXIT_PASS };
  const program = buildProgram({ ...io, argv: [...argv] }, (c) => { outcome.code = c; });
  const fail = (error: unknown): number => {
    if (error instanceof CommanderError) return error.exitCode === 0 ? EXIT_PASS : EXIT_INPUT;
    if (error instanceof InputError) {
      for (const line of renderIssues(error.issues)) io.stderr(`phasegap: error: ${line}\n`);
      return EXIT_INPUT;
    }
    throw error;
  };
  try {
    program.parse([...argv], { from: 'user' });
  } catch (error) {
    return fail(error);
  }
  const result = outcome.code;
  return typeof result === 'number' ? result : result.catch(fail);
}
