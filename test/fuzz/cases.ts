/**
 * One fuzz case: a shipped design (and its process card), each mutated by a plan, and one
 * command line to run on them. Cases are plain data so a failing one prints and replays exactly.
 */
import fc from 'fast-check';
import { plan, type Plan } from './mutations.js';
import { hostileString } from './hostile.js';

export const DESIGNS = ['doubler', 'lp-netlist', 'sc-integrator', 'too-tight'] as const;

export type CommandName = 'check' | 'draw' | 'waves' | 'verilog' | 'spice' | 'report' | 'fmax' | 'mc' | 'sweep' | 'confirm';

export interface Case {
  readonly design: (typeof DESIGNS)[number];
  /** Keep only one corner per axis before mutating (most cases: a fast run). */
  readonly oneCorner: boolean;
  readonly designPlan: Plan;
  /** The card the design names, mutated; undefined keeps the shipped card. */
  readonly cardPlan: Plan | undefined;
  readonly command: CommandName;
  /** Options after the design path; `{out}` stands for the output file. */
  readonly args: readonly string[];
  readonly sets: readonly string[];
  /** Run as a child process (`node dist/src/cli/main.js`) instead of in a worker thread. */
  readonly child: boolean;
}

const out = '{out}';

const commandArgs: fc.Arbitrary<{ command: CommandName; args: readonly string[] }> = fc.oneof(
  {
    weight: 4,
    arbitrary: fc
      .constantFrom<string[]>([], ['--json'], ['--json', '-o', out], ['-o', out])
      .map((args) => ({ command: 'check' as const, args })),
  },
  {
    weight: 4,
    arbitrary: fc
      .tuple(fc.constantFrom('worst', 'all'), fc.constantFrom('phases', 'all'), fc.constantFrom('timing', 'margins'))
      .map(([corner, nets, chart]) => ({
        command: 'draw' as const,
        args: ['--corner', corner, '--nets', nets, '--chart', chart, '-o', out],
      })),
  },
  {
    weight: 3,
    arbitrary: fc.constantFrom('phases', 'all').map((nets) => ({ command: 'waves' as const, args: ['--nets', nets, '-o', out] })),
  },
  {
    weight: 3,
    arbitrary: fc
      .boolean()
      .map((tb) => ({ command: 'verilog' as const, args: ['--corner', 'worst', ...(tb ? ['--testbench'] : []), '-o', out] })),
  },
  { weight: 3, arbitrary: fc.constant({ command: 'spice' as const, args: ['--corner', 'worst', '-o', out] }) },
  {
    weight: 3,
    arbitrary: fc.tuple(fc.constantFrom('html', 'md'), fc.boolean()).map(([format, full]) => ({
      command: 'report' as const,
      args: ['--format', format, ...(full ? [] : ['--no-fmax', '--no-tune']), '-o', out],
    })),
  },
  { weight: 1, arbitrary: fc.constant({ command: 'fmax' as const, args: ['--json'] }) },
  { weight: 1, arbitrary: fc.constant({ command: 'mc' as const, args: ['--samples', '8', '--workers', '1', '--json'] }) },
  {
    weight: 1,
    arbitrary: fc
      .constantFrom('clock.frequency=10MHz,20MHz', 'temperature=-40,125', 'generator.stages=4:8:2')
      .map((vary) => ({ command: 'sweep' as const, args: ['--vary', vary, '--workers', '1', '-o', out] })),
  },
);

/** `--set` overrides aimed at the override parser and at prototype keys (under Linux's 128 KiB limit of one argument). */
const setArg: fc.Arbitrary<string> = fc
  .oneof(
    fc.constantFrom(
      '__proto__.polluted=1',
      'constructor.prototype.polluted=1',
      'clock.__proto__.x=1',
      'loads.__proto__=1',
      'switches[99999999].w=1um',
      'switches[-1].w=1um',
      'switches[1e400].w=1um',
      'generator.phases[4294967296]=p3',
      'clock.frequency=1e400MHz',
      'clock.frequency=NaN',
      'clock.frequency=-0',
      'clock.frequency=0Hz',
      'loads.p1=1e-400F',
      'generator.stages=100000',
      'generator.stages=1e9',
      'generator.buffer=[1,2]',
      'name=',
      '=',
      'a.b.c.d.e.f=1',
      '.=1',
      '[0]=1',
    ),
    hostileString.map((s) => `name=${s}`),
    fc
      .tuple(fc.constantFrom('name', 'description', 'generator.phases[0]', 'switches[0].name', 'clock.frequency'), hostileString)
      .map(([p, s]) => `${p}=${s}`),
  )
  .map((s) => s.slice(0, 30_000));

export function caseArbitrary(options: { confirm: boolean }): fc.Arbitrary<Case> {
  const command = options.confirm
    ? fc.oneof(
        { weight: 30, arbitrary: commandArgs },
        { weight: 1, arbitrary: fc.constant({ command: 'confirm' as const, args: ['--corners', 'worst', '--jobs', '1', '--json'] }) },
      )
    : commandArgs;
  return fc
    .record({
      design: fc.constantFrom(...DESIGNS),
      oneCorner: fc.oneof({ weight: 9, arbitrary: fc.constant(true) }, { weight: 1, arbitrary: fc.constant(false) }),
      designPlan: plan,
      cardPlan: fc.oneof({ weight: 4, arbitrary: fc.constant(undefined) }, { weight: 1, arbitrary: plan }),
      command,
      sets: fc.oneof({ weight: 6, arbitrary: fc.constant([]) }, { weight: 1, arbitrary: fc.array(setArg, { minLength: 1, maxLength: 2 }) }),
      child: fc.oneof({ weight: 11, arbitrary: fc.constant(false) }, { weight: 1, arbitrary: fc.constant(true) }),
    })
    .map(({ command: c, ...rest }) => ({ ...rest, command: c.command, args: c.args, child: rest.child || c.command === 'confirm' }));
}

/** The argument list with the design and output paths filled in. */
export function argv(c: Case, designPath: string, outPath: string): string[] {
  return [c.command, designPath, ...c.args.map((a) => (a === out ? outPath : a)), ...c.sets.flatMap((s) => ['--set', s])];
}

export function writesFile(c: Case): boolean {
  return c.args.includes(out);
}

export const OUT_EXTENSION: Record<CommandName, string> = {
  check: 'txt',
  draw: 'svg',
  waves: 'vcd',
  verilog: 'v',
  spice: 'cir',
  report: 'html',
  fmax: 'json',
  mc: 'json',
  sweep: 'csv',
  confirm: 'json',
};

export function outExtension(c: Case): string {
  if (c.command === 'report') return c.args.includes('md') ? 'md' : 'html';
  if (c.command === 'check' && c.args.includes('--json')) return 'json';
  return OUT_EXTENSION[c.command];
}
