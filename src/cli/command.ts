/**
 * A command as data: its name, arguments and options (flags, help, parser and default declared
 * once) and a handler whose options type is inferred from them. `program.ts` builds commander
 * from the list in `commands.ts`; a handler receives parsed values, never raw option text.
 */
import type { Io } from './io.js';
import type { GLOBAL_OPTIONS } from './common-options.js';

/** Turns an option's text into its value; throws an `InputError` naming `flag` when it cannot. */
export type OptionParser<V> = (text: string, flag: string) => V;

/** One option. `V` is the value the handler receives (with `undefined` when it may be absent). */
export interface OptionSpec<V> {
  /** commander's flags, e.g. `--samples <N>`, `-o, --out <FILE>`, `--no-fmax`. */
  readonly flags: string;
  readonly help: string;
  readonly parse?: OptionParser<V>;
  /** The value when absent, which `--help` shows as "(default: ...)"; a text default goes through `parse`. */
  readonly default?: string | boolean | readonly string[];
  /** The value when absent, not shown by `--help` (the help text words it). */
  readonly fallback?: V;
  /** The only values allowed (commander refuses others with the list). */
  readonly choices?: readonly string[];
  /** Every occurrence is collected in a list. */
  readonly repeatable?: boolean;
  /** Carries the value type for inference only; never set. */
  readonly valueType?: V;
}

export type OptionSpecs = Readonly<Record<string, OptionSpec<unknown>>>;

export type OptionValues<S extends OptionSpecs> = { readonly [K in keyof S]: S[K] extends OptionSpec<infer V> ? V : never };

/** What a handler receives: its own options and the program-wide ones (`--model`, `--tables`). */
export type CommandOptions<S extends OptionSpecs> = OptionValues<S> & OptionValues<typeof GLOBAL_OPTIONS>;

export interface ArgumentSpec {
  /** commander's form: `<DESIGN>` (required). */
  readonly name: string;
  readonly help: string;
}

export type Handler<S extends OptionSpecs, A extends readonly ArgumentSpec[]> = (
  io: Io,
  args: { readonly [K in keyof A]: string },
  options: CommandOptions<S>,
) => number | Promise<number>;

export interface CommandDefinition<S extends OptionSpecs, A extends readonly ArgumentSpec[]> {
  readonly name: string;
  /** The line under `phasegap --help` and on top of the command's help. */
  readonly description: string;
  readonly arguments: A;
  readonly options: S;
  /** Runs the command and returns its exit code: 0 pass, 1 fail (bad input is an `InputError`). */
  readonly run: Handler<S, A>;
}

/** A definition with its types erased, as the command list holds it. */
export interface AnyCommand {
  readonly name: string;
  readonly description: string;
  readonly arguments: readonly ArgumentSpec[];
  readonly options: OptionSpecs;
  readonly run: (io: Io, args: readonly string[], options: Readonly<Record<string, unknown>>) => number | Promise<number>;
}

export function defineCommand<const S extends OptionSpecs, const A extends readonly ArgumentSpec[]>(
  definition: CommandDefinition<S, A>,
): AnyCommand {
  return definition as unknown as AnyCommand;
}

/** An option whose text is used as given: `undefined` when absent, or its shown `default`. */
export function textOption(flags: string, help: string): OptionSpec<string | undefined>;
export function textOption(
  flags: string,
  help: string,
  extra: { readonly default: string; readonly choices?: readonly string[] },
): OptionSpec<string>;
export function textOption(
  flags: string,
  help: string,
  extra?: { readonly default: string; readonly choices?: readonly string[] },
): OptionSpec<string | undefined> {
  return { flags, help, ...extra };
}

/** An option read by `parse`: `undefined` when absent unless it has a `fallback` or a shown `default`. */
export function parsedOption<V>(flags: string, help: string, parse: OptionParser<V>): OptionSpec<V | undefined>;
export function parsedOption<V>(
  flags: string,
  help: string,
  parse: OptionParser<V>,
  extra: { readonly fallback: V } | { readonly default: string },
): OptionSpec<V>;
export function parsedOption<V>(
  flags: string,
  help: string,
  parse: OptionParser<V>,
  extra?: { readonly fallback: V } | { readonly default: string },
): OptionSpec<V | undefined> {
  return { flags, help, parse, ...extra };
}

/** A switch: `--json` (false unless given, `default` shows it) or `--no-fmax` (true unless given). */
export function flagOption(flags: string, help: string, shownDefault?: boolean): OptionSpec<boolean> {
  return shownDefault === undefined ? { flags, help } : { flags, help, default: shownDefault };
}

/** A repeatable option: every occurrence in order, an empty list when absent. */
export function listOption(flags: string, help: string): OptionSpec<readonly string[]> {
  return { flags, help, repeatable: true, default: [] };
}
