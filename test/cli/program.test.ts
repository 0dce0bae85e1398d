import { describe, expect, it } from 'vitest';
import { Option } from 'commander';
import { COMMANDS } from '../../src/cli/commands.js';
import { buildProgram } from '../../src/cli/program.js';
import { cliAsync, design } from '../helpers.js';
import type { Io } from '../../src/cli/io.js';

const silentIo = { stdout: () => undefined, stderr: () => undefined } as unknown as Io;

describe('buildProgram', () => {
  it('registers every command of the list once, in list order, with its declared options', () => {
    const program = buildProgram(silentIo, () => undefined);
    expect(program.commands.map((c) => c.name())).toEqual(COMMANDS.map((c) => c.name));
    for (const definition of COMMANDS) {
      const command = program.commands.find((c) => c.name() === definition.name)!;
      expect(command.options.map((o) => o.flags)).toEqual(Object.values(definition.options).map((o) => o.flags));
    }
  });

  it('declares each option under the key commander reads it by (--histogram-corner as histogramCorner, --no-fmax as fmax)', () => {
    for (const definition of COMMANDS) {
      for (const [key, spec] of Object.entries(definition.options)) expect(new Option(spec.flags).attributeName()).toBe(key);
    }
  });
});

describe('option parsers', () => {
  it('refuse a bad value with exit 2 before the design is read', async () => {
    const r = await cliAsync('mc', '--samples', '0', 'no-such-design.yaml');
    expect(r.code).toBe(2);
    expect(r.stderr).toBe('phasegap: error: --samples: "0" must be a whole number of dies from 1 to 10000000\n');
  });

  it('apply a text default through the parser (waves --periods 2) and a fallback when absent (verilog --periods 6)', async () => {
    const waves = await cliAsync('waves', design('doubler'), '-o', '-');
    expect(waves.code).toBe(0);
    expect(waves.stdout).toContain('repeated 2 times');
    const finish = (text: string) => text.split('\n').find((line) => line.includes('$finish'));
    const absent = await cliAsync('verilog', '--testbench', design('doubler'), '-o', '-');
    const six = await cliAsync('verilog', '--testbench', '--periods', '6', design('doubler'), '-o', '-');
    const three = await cliAsync('verilog', '--testbench', '--periods', '3', design('doubler'), '-o', '-');
    expect(finish(absent.stdout)).toBeDefined();
    expect(finish(absent.stdout)).toBe(finish(six.stdout));
    expect(finish(absent.stdout)).not.toBe(finish(three.stdout));
  });
});
