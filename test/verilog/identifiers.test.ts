/**
 * Names in exported Verilog are data: checked against Icarus Verilog (Debian package iverilog:
 * iverilog + vvp), which must compile exactly the intended modules from a design of hostile names.
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { tempDir } from '../helpers.js';
import { verilogComment, verilogIdentifier, verilogString } from '../../src/verilog/identifiers.js';
import { verilogModule, verilogTestbench } from '../../src/verilog/export.js';
import { hostileName, hostileResolved } from '../schema/hostile.js';
import { requireTool } from '../tools.js';

requireTool('iverilog', 'iverilog');

const HOSTILE = ['a b', 'x\n`define y', 'endmodule', 'a\u0000b\u007f\u0085\u202e', '', hostileName('/tmp/x', 'all')];

/** The module scopes of a compiled design, from the vvp file: [instance, module type, parent or null]. */
function scopes(vvp: string): Array<[string, string, boolean]> {
  return [...vvp.matchAll(/^S_\S+ \.scope module, "((?:[^"\\]|\\.)*)" "((?:[^"\\]|\\.)*)" [^;]*?(, S_\S+)?;$/gm)].map((m) => [
    m[1]!,
    m[2]!,
    m[3] !== undefined,
  ]);
}

describe('verilogIdentifier', () => {
  it.each(HOSTILE)('writes %j as one escaped identifier of printable ASCII ended by a space', (name) => {
    expect(verilogIdentifier(name)).toMatch(/^\\[\x21-\x7e]+ $/);
  });

  it('leaves simple identifiers alone and escapes keywords', () => {
    expect(verilogIdentifier('p1')).toBe('p1');
    expect(verilogIdentifier('module')).toBe('\\module ');
  });
});

describe('verilogComment', () => {
  it.each(HOSTILE)('writes %j as one // line of printable ASCII', (text) => {
    expect(verilogComment(text)).toMatch(/^\/\/ [\x20-\x7e]*$/);
    expect(verilogComment(`${text}\\`)).not.toMatch(/\\$/);
  });
});

describe('verilogString', () => {
  it('holds quotes, backslashes, line breaks and UTF-8 exactly: vvp prints the bytes back (Icarus Verilog)', () => {
    const text = 'say "hi"\\ \n.end\r\u2028é\u0001';
    const dir = tempDir();
    writeFileSync(join(dir, 's.v'), `module t; initial $write(${verilogString(text)}); endmodule\n`);
    const compile = spawnSync('iverilog', ['-o', 's.vvp', 's.v'], { cwd: dir, encoding: 'utf8' });
    expect(compile.stderr).toBe('');
    const run = spawnSync('vvp', ['-n', 's.vvp'], { cwd: dir });
    expect(run.stdout.toString('utf8')).toBe(text);
  });
});

describe('verilogModule with hostile names', () => {
  it('compiles in Icarus Verilog to exactly the generator and its testbench, and runs no injected code', () => {
    const marker = join(tempDir(), 'ran');
    const resolved = hostileResolved(marker);
    const n = resolved.netlist.gateCount;
    const delays = { rise: new Float64Array(n).fill(100e-12), fall: new Float64Array(n).fill(80e-12) };
    const name = hostileName(marker, 'module');
    const module = verilogModule(resolved.netlist, delays, name, [hostileName(marker, 'header'), 'second line']);
    const dir = tempDir();
    writeFileSync(join(dir, 'gen.v'), module.text + verilogTestbench(module, 50e-9, 0.5, 4, 'gen.vcd'));
    const compile = spawnSync('iverilog', ['-o', 'gen.vvp', 'gen.v'], { cwd: dir, encoding: 'utf8' });
    expect(compile.stderr).toBe('');
    expect(compile.status).toBe(0);
    const found = scopes(readFileSync(join(dir, 'gen.vvp'), 'utf8'));
    const type = verilogIdentifier(name).slice(1, -1).replace(/"/g, '\\"');
    expect(found).toEqual([
      [`${type}_tb`, `${type}_tb`, false],
      ['dut', type, true],
    ]);
    const run = spawnSync('vvp', ['-n', 'gen.vvp'], { cwd: dir, encoding: 'utf8' });
    expect(run.status).toBe(0);
    expect(run.stdout).not.toContain('EVIL');
    const vcd = readFileSync(join(dir, 'gen.vcd'), 'utf8');
    expect(vcd).toMatch(/\$var wire 1 \S+ p1 \$end/);
  });
});

describe('verilogIdentifier on reserved words beyond the common ones', () => {
  // IEEE 1364-2005 keywords (switch primitives, strengths) and SystemVerilog ones, as remembered.
  it.each(['tran', 'rtranif1', 'pmos', 'weak0', 'specify', 'logic', 'int', 'class'])('escapes %s', (word) => {
    expect(verilogIdentifier(word)).toBe(`\\${word} `);
  });

  it('compiles a module named tran in iverilog (a design called tran once stopped it with a syntax error)', () => {
    const dir = tempDir();
    const file = join(dir, 'tran.v');
    writeFileSync(file, `module ${verilogIdentifier('tran')} (a);\n  input a;\nendmodule\n`);
    const run = spawnSync('iverilog', ['-o', join(dir, 'out'), file], { encoding: 'utf8' });
    expect(run.status, run.stderr).toBe(0);
  });
});
