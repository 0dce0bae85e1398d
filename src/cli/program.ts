/** The command line: parses arguments with commander, runs one command, maps errors to exit codes. */
import { Command, CommanderError, Option } from 'commander';
import { InputError, renderIssues } from '../errors.js';
import type { Io } from './io.js';
import type { AnyCommand, OptionSpec, OptionSpecs } from './command.js';
import { COMMANDS } from './commands.js';
import { GLOBAL_OPTIONS } from './common-options.js';
import { VERSION } from './version.js';

export const EXIT_PASS = 0;
export const EXIT_FAIL = 1;
export const EXIT_INPUT = 2;

const collect = (value: string, previous: readonly string[]): string[] => [...previous, value];

/** Commander's own messages ("error: unknown option ...", "(Did you mean check?)") in the program's line style. */
function commanderError(text: string): string {
  const body = text.startsWith('error: ') ? text : `error: ${text}`;
  return body.replace(/^(?=.)/gm, 'phasegap: ');
}

function commanderOption(spec: OptionSpec<unknown>): Option {
  const option = new Option(spec.flags, spec.help);
  if (spec.choices) option.choices(spec.choices);
  if (spec.repeatable) option.argParser(collect);
  if (spec.default !== undefined) option.default(spec.default);
  return option;
}

/** The declared options' values from commander's: parsed in declaration order, then fallbacks. */
function optionValues(
  specs: OptionSpecs,
  options: ReadonlyMap<string, Option>,
  given: Readonly<Record<string, unknown>>,
): Record<string, unknown> {
  const values: Record<string, unknown> = {};
  for (const [key, spec] of Object.entries(specs)) {
    const option = options.get(key)!;
    const raw = given[option.attributeName()];
    values[key] =
      raw === undefined ? spec.fallback : spec.parse && typeof raw === 'string' ? spec.parse(raw, option.long ?? option.flags) : raw;
  }
  return values;
}

function addCommand(program: Command, io: Io, definition: AnyCommand, setCode: (code: number | Promise<number>) => void): void {
  const command = program.command(definition.name).description(definition.description);
  for (const argument of definition.arguments) command.argument(argument.name, argument.help);
  const options = new Map(Object.entries(definition.options).map(([key, spec]) => [key, commanderOption(spec)]));
  for (const option of options.values()) command.addOption(option);
  const globals = new Map(Object.entries(GLOBAL_OPTIONS).map(([key, spec]) => [key, commanderOption(spec)]));
  command.action((...params: unknown[]) => {
    const cmd = params[params.length - 1] as Command;
    const given = cmd.optsWithGlobals();
    const values = { ...optionValues(GLOBAL_OPTIONS, globals, given), ...optionValues(definition.options, options, given) };
    setCode(definition.run(io, cmd.processedArgs as string[], values));
  });
}

export function buildProgram(io: Io, setCode: (code: number | Promise<number>) => void): Command {
  const program = new Command('phasegap')
    .description('Dead time, break-before-make and settling checks for two-phase non-overlapping clock generators')
    .version(VERSION)
    .exitOverride()
    .configureOutput({ writeOut: (s) => io.stdout(s), writeErr: (s) => io.stderr(s), outputError: (s, write) => write(commanderError(s)) })
    .showHelpAfterError('phasegap: run phasegap --help for usage');
  for (const spec of Object.values(GLOBAL_OPTIONS)) program.addOption(commanderOption(spec));
  for (const definition of COMMANDS) addCommand(program, io, definition, setCode);
  return program;
}

/**
 * Runs the CLI on `argv` (without node and script) and returns the exit code, or a promise of it
 * for the commands that run in parallel threads (mc, sweep).
 */
export function run(argv: readonly string[], io: Io): number | Promise<number> {
  const outcome: { code: number | Promise<number> } = { code: EXIT_PASS };
  const program = buildProgram({ ...io, argv: [...argv] }, (c) => {
    outcome.code = c;
  });
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
