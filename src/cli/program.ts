/** The command line: parses arguments with commander, runs one command, maps errors to exit codes. */
import { Command, CommanderError, Option } from 'commander';
import { InputError, renderIssue } from '../errors.js';
import type { Io } from './io.js';
import { runCheck } from './commands/check.js';
import { runInit } from './commands/init.js';
import { runSchema } from './commands/schema.js';
import { runFmax } from './commands/fmax.js';
import { runMc } from './commands/mc.js';

export const EXIT_PASS = 0;
export const EXIT_FAIL = 1;
export const EXIT_INPUT = 2;

const collect = (value: string, previous: string[]): string[] => [...previous, value];

function setOption(): Option {
  return new Option('--set <PATH=VALUE>', 'override a design value before validation (repeatable), e.g. clock.frequency=40MHz')
    .argParser(collect).default([]);
}

function outOption(what: string): Option {
  return new Option('-o, --out <FILE>', `write ${what} to FILE atomically ('-' for stdout)`);
}

export function buildProgram(io: Io, setCode: (code: number | Promise<number>) => void): Command {
  const program = new Command('phasegap')
    .description('Dead time, break-before-make and settling checks for two-phase non-overlapping clock generators')
    .version('0.1.0')
    .exitOverride()
    .configureOutput({ writeOut: (s) => io.stdout(s), writeErr: (s) => io.stderr(s) })
    .showHelpAfterError('(run phasegap --help for usage)');

  program.command('check')
    .description('every corner: dead times, gaps, widths, requirement margins and a verdict')
    .argument('<DESIGN>', 'design file (YAML or JSON)')
    .addOption(setOption())
    .option('--json', 'print the machine report (SI units) instead of the table', false)
    .addOption(outOption('the report'))
    .action((design: string, opts: { set: string[]; json: boolean; out?: string }) => setCode(runCheck(io, design, opts)));

  program.command('fmax')
    .description('highest clock frequency at which every check holds at every corner, and what limits it')
    .argument('<DESIGN>', 'design file (YAML or JSON)')
    .addOption(setOption())
    .option('--resolution <REL>', 'relative resolution of the search (default 0.001 = 0.1 %)')
    .option('--json', 'print the machine report (SI units)', false)
    .addOption(outOption('the report'))
    .action((design: string, opts: { set: string[]; json: boolean; out?: string; resolution?: string }) => setCode(runFmax(io, design, opts)));

  program.command('mc')
    .description('Monte Carlo local mismatch (Pelgrom) on every corner: yield with a 95 % interval, sigma margins')
    .argument('<DESIGN>', 'design file (YAML or JSON)')
    .addOption(setOption())
    .option('--samples <N>', 'dies to draw (default: montecarlo.samples, else 1000)')
    .option('--seed <S>', 'random seed, a whole number (default: montecarlo.seed, else 1)')
    .option('--workers <K>', 'threads (default: the number of cores); results do not depend on it')
    .option('--replay <INDEX>', 'evaluate one die at every corner and print its check table')
    .option('--histogram <FILE.svg>', 'also draw the dead-time histograms of the worst corner')
    .option('--json', 'print the machine report (SI units)', false)
    .addOption(outOption('the report'))
    .action((design: string, opts: Parameters<typeof runMc>[2]) => setCode(runMc(io, design, opts)));

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

  return program;
}

/**
 * Runs the CLI on `argv` (without node and script) and returns the exit code, or a promise of it
 * for the commands that run in parallel threads (mc, sweep).
 */
export function run(argv: readonly string[], io: Io): number | Promise<number> {
  const outcome: { code: number | Promise<number> } = { code: EXIT_PASS };
  const program = buildProgram(io, (c) => (outcome.code = c));
  const fail = (error: unknown): number => {
    if (error instanceof CommanderError) return error.exitCode === 0 ? EXIT_PASS : EXIT_INPUT;
    if (error instanceof InputError) {
      for (const issue of error.issues) io.stderr(`phasegap: error: ${renderIssue(issue)}\n`);
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
