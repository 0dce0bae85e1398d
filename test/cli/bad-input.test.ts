/**
 * Bad input through the CLI: exit 2, one clear message on stderr naming the field path (or flag),
 * the value and what is allowed, no stack trace, and nothing written even when -o is given.
 */
import { describe, it, expect } from 'vitest';
import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { cli, design, fixture, inputIssues, tempDir } from '../helpers.js';
import type { IssueCode, IssuePath } from '../../src/errors.js';
import { loadDesign } from '../../src/cli/load.js';
import { resolveDesign } from '../../src/analysis/resolve.js';

const bad = (name: string): string => fixture('designs', 'bad', `${name}.yaml`);

interface Case {
  readonly what: string;
  /** Arguments after `check`, before `-o`. */
  readonly args: readonly string[];
  /** The issue's code and path, as the core reports them to programs. */
  readonly code: IssueCode;
  readonly path: IssuePath;
  /** Substrings the message must hold: the path, the value, the allowed set. */
  readonly says: readonly string[];
}

const CASES: readonly Case[] = [
  {
    what: 'a missing design file',
    code: 'file.not-found',
    path: ['DESIGN'],
    args: ['no-such-design.yaml'],
    says: ['DESIGN: ', '"no-such-design.yaml"', 'does not exist'],
  },
  {
    what: 'malformed YAML',
    code: 'file.syntax',
    path: [],
    args: [bad('malformed')],
    says: ['malformed.yaml: ', 'is not valid YAML or JSON', 'line 5'],
  },
  {
    what: 'an unknown key',
    code: 'field.unknown',
    path: ['generator'],
    args: [bad('unknown-key')],
    says: ['generator: ', 'unknown key "stage"', 'allowed keys', 'stages'],
  },
  {
    what: 'a misspelt unit',
    code: 'value.invalid',
    path: ['clock', 'frequency'],
    args: [bad('wrong-unit')],
    says: ['clock.frequency: ', '"20 MHzz"', 'is not a frequency', 'Hz', '"20MHz"'],
  },
  {
    what: 'a negative frequency',
    code: 'value.out-of-range',
    path: ['clock', 'frequency'],
    args: [design('doubler'), '--set', 'clock.frequency=-20MHz'],
    says: ['clock.frequency: ', '"-20MHz"', 'at least 1 Hz and at most 100 GHz'],
  },
  {
    what: 'a zero frequency',
    code: 'value.out-of-range',
    path: ['clock', 'frequency'],
    args: [design('doubler'), '--set', 'clock.frequency=0'],
    says: ['clock.frequency: ', ' 0 ', 'at least 1 Hz and at most 100 GHz'],
  },
  {
    what: 'a duty above 1',
    code: 'value.out-of-range',
    path: ['clock', 'duty'],
    args: [design('doubler'), '--set', 'clock.duty=1.2'],
    says: ['clock.duty: ', '1.2', 'greater than 0 and less than 1'],
  },
  {
    what: 'a duty of 0',
    code: 'value.out-of-range',
    path: ['clock', 'duty'],
    args: [design('doubler'), '--set', 'clock.duty=0'],
    says: ['clock.duty: ', ' 0 ', 'greater than 0 and less than 1'],
  },
  {
    what: 'a supply below threshold at one corner',
    code: 'physics.device-off',
    path: ['corners', 'vdd', 1],
    args: [bad('low-supply')],
    // The larger of the two thresholds at -40 C: p's 0.45 V + 1.78 mV/K * 67 K = 0.569 V.
    says: ['corners.vdd[1]: ', '0.5 V', 'tt/0.5V/-40C', '0.569 V', 'cannot turn on'],
  },
  {
    what: 'an odd chain length',
    code: 'netlist.invalid',
    path: ['generator', 'stages'],
    args: [bad('odd-chain')],
    says: ['generator.stages: ', '5', 'is odd', 'even number'],
  },
  {
    what: 'a netlist with an undriven net',
    code: 'netlist.invalid',
    path: ['generator', 'gates', 2, 'inputs', 1],
    args: [bad('undriven-net')],
    says: ['generator.gates[2].inputs[1]: ', '"fb2"', 'not driven by any gate', 'every input net needs a driver'],
  },
  {
    what: 'a combinational loop without a clock',
    code: 'netlist.invalid',
    path: ['generator', 'gates'],
    args: [bad('comb-loop')],
    says: ['generator.gates: ', 'u_r1, u_r2, u_r3', 'combinational loop', 'feed it from the clock'],
  },
  {
    what: 'an unknown process corner',
    code: 'reference.unknown',
    path: ['corners', 'process', 1],
    args: [design('doubler'), '--set', 'corners.process=[tt, xx]'],
    says: ['corners.process[1]: ', '"xx"', 'it defines tt, ss, ff, fs, sf'],
  },
  {
    what: 'a load on a net that does not exist',
    code: 'reference.unknown',
    path: ['loads', 'p3'],
    args: [design('doubler'), '--set', 'loads.p3=1pF'],
    says: ['loads.p3: ', '"p3"', 'is not a net of the generator', 'nets are'],
  },
  {
    what: 'an unknown generator template',
    code: 'value.not-allowed',
    path: ['generator', 'template'],
    args: [design('doubler'), '--set', 'generator.template=nand3'],
    says: ['generator.template: ', '"nand3"', "'nand'", "'nor'"],
  },
  {
    what: 'a switch terminal that is neither a declared node nor a level',
    code: 'reference.unknown',
    path: ['switches', 0, 'terminals', 1],
    args: [bad('unknown-terminal')],
    says: ['switches[0].terminals[1]: ', '"tpo"', 'declared under `nodes` (top)', '"vdd", "2vdd", "0V"'],
  },
  {
    what: 'a node named like a level',
    code: 'value.invalid',
    path: ['nodes', 'vdd'],
    args: [design('doubler'), '--set', 'nodes.vdd=1V'],
    says: ['nodes.vdd: ', '"vdd"', 'reads as a voltage level'],
  },
  {
    what: 'a node voltage that is not a level',
    code: 'value.wrong-type',
    path: ['nodes', 'top'],
    args: [design('doubler'), '--set', 'nodes.top.phase2=high'],
    says: ['nodes.top: ', '"high"', 'must be a level ("vdd", "2vdd", "0V", 1.2) or a range {min: LEVEL, max: LEVEL}'],
  },
  {
    what: 'a --set without =',
    code: 'option.invalid',
    path: ['--set'],
    args: [design('doubler'), '--set', 'clock.frequency'],
    says: ['--set: ', '"clock.frequency"', 'PATH=VALUE'],
  },
  {
    what: 'a --set with a malformed path',
    code: 'option.invalid',
    path: ['--set'],
    args: [design('doubler'), '--set', 'clock..duty=0.5'],
    says: ['--set: ', '"clock..duty=0.5"', 'malformed path'],
  },
  {
    what: 'a --set into a plain value',
    code: 'option.invalid',
    path: ['--set'],
    args: [design('doubler'), '--set', 'name.first=x'],
    says: ['--set: ', '"name.first=x"', 'cannot set inside name'],
  },
];

describe('phasegap check on bad input', () => {
  it.each(CASES)('rejects $what with exit 2 and a clear message, writing nothing', ({ args, says }) => {
    const dir = tempDir();
    const out = join(dir, 'report.json');
    const run = cli('check', ...args, '--json', '-o', out);
    expect(run.code).toBe(2);
    expect(run.stdout).toBe('');
    expect(run.stderr).toMatch(/^phasegap: error: /);
    for (const text of says) expect(run.stderr).toContain(text);
    // The message names the path once, not doubled (e.g. generator.template.template).
    expect(run.stderr).not.toMatch(/(\b[a-z]+)\.\1\b/i);
    expect(run.stderr).not.toMatch(/^\s+at /m);
    expect(run.stderr).not.toMatch(/undefined|NaN/);
    expect(existsSync(out)).toBe(false);
    expect(readdirSync(dir)).toEqual([]);
  });

  it.each(CASES)('reports $what as $code at its path', ({ args, code, path }) => {
    const [file, ...rest] = args;
    const sets = rest.filter((_, i) => rest[i - 1] === '--set');
    const issues = inputIssues(() => {
      const loaded = loadDesign(file!, sets);
      resolveDesign(loaded.design, loaded.card);
    });
    expect(issues.map((i) => [i.code, i.path])).toEqual([[code, path]]);
  });

  it('lists every problem of a file with several, one per line', () => {
    const run = cli('check', design('doubler'), '--set', 'clock.frequency=fast', '--set', 'clock.duty=2');
    expect(run.code).toBe(2);
    const lines = run.stderr.trimEnd().split('\n');
    expect(lines).toHaveLength(2);
    expect(lines.some((l) => l.startsWith('phasegap: error: clock.frequency: "fast"'))).toBe(true);
    expect(lines.some((l) => l.startsWith('phasegap: error: clock.duty: 2'))).toBe(true);
  });

  it('rejects an unknown command and a missing argument with exit 2 and usage help', () => {
    const unknown = cli('chekc', design('doubler'));
    expect(unknown.code).toBe(2);
    expect(unknown.stderr).toContain("unknown command 'chekc'");
    const missing = cli('check');
    expect(missing.code).toBe(2);
    expect(missing.stderr).toContain("missing required argument 'DESIGN'");
  });

  it('refuses an output folder that does not exist, naming --out', () => {
    const dir = tempDir();
    const out = join(dir, 'missing', 'report.json');
    const run = cli('check', design('doubler'), '--json', '-o', out);
    expect(run.code).toBe(2);
    expect(run.stderr).toContain('--out: ');
    expect(run.stderr).toContain('cannot be written');
    expect(readdirSync(dir)).toEqual([]);
  });
});
