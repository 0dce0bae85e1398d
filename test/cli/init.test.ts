import { describe, it, expect } from 'vitest';
import { readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { parse as parseYaml } from 'yaml';
import { cli, tempDir } from '../helpers.js';

describe('phasegap init', () => {
  it.each(['nand', 'nor'] as const)('writes a %s starter design that check passes (exit 0)', (template) => {
    const dir = tempDir();
    const out = join(dir, 'design.yaml');
    const run = cli('init', '--template', template, '-o', out);
    expect(run.code).toBe(0);
    expect(run.stdout).toBe('');
    expect(run.stderr).toBe(`phasegap: wrote ${out}; next: phasegap check ${out}\n`);
    const text = readFileSync(out, 'utf8');
    expect(text.startsWith('#')).toBe(true);
    expect((parseYaml(text) as { generator: { template: string } }).generator.template).toBe(template);
    const check = cli('check', out, '--json');
    expect(check.stderr).toBe('');
    expect(check.code).toBe(0);
    const report = JSON.parse(check.stdout) as { verdict: string; corners: unknown[] };
    expect(report.verdict).toBe('pass');
    expect(report.corners).toHaveLength(45);
    expect(readdirSync(dir)).toEqual(['design.yaml']);
  });

  it.each(['nand', 'nor'] as const)(
    '%s starter shows switches, break-before-make and settle checks, and its commented order example passes too',
    (template) => {
      const out = join(tempDir(), 'design.yaml');
      expect(cli('init', '--template', template, '-o', out).code).toBe(0);
      type Report = { verdict: string; corners: Array<{ checks: Array<{ kind: string; name: string; pass: boolean }> }> };
      const kinds = (file: string) => {
        const report = JSON.parse(cli('check', file, '--json').stdout) as Report;
        expect(report.verdict).toBe('pass');
        return new Set(report.corners[0]!.checks.map((c) => c.kind));
      };
      const shown = kinds(out);
      for (const kind of ['break-before-make', 'settle', 'off-state', 'on-state']) expect(shown).toContain(kind);
      expect(shown).not.toContain('order');
      const text = readFileSync(out, 'utf8');
      expect(text).toMatch(/^ {2}settle: +# optional/m);
      const uncommented = text.replace(/^ {2}# order:/m, '  order:').replace(/^ {2}# {3}- \{ first/m, '    - { first');
      expect(uncommented).not.toBe(text);
      writeFileSync(out, uncommented);
      expect(kinds(out)).toContain('order');
    },
  );

  it('defaults to the nand template', () => {
    const out = join(tempDir(), 'd.yaml');
    expect(cli('init', '-o', out).code).toBe(0);
    expect(readFileSync(out, 'utf8')).toContain('template: nand');
  });

  it('refuses to overwrite an existing file without --force, leaving it untouched', () => {
    const out = join(tempDir(), 'design.yaml');
    writeFileSync(out, 'my own design\n');
    const run = cli('init', '-o', out);
    expect(run.code).toBe(2);
    expect(run.stderr).toContain(`--out: ${JSON.stringify(out)} already exists`);
    expect(run.stderr).toContain('--force');
    expect(readFileSync(out, 'utf8')).toBe('my own design\n');
  });

  it('overwrites with --force', () => {
    const dir = tempDir();
    const out = join(dir, 'design.yaml');
    writeFileSync(out, 'my own design\n');
    expect(cli('init', '--template', 'nor', '-o', out, '--force').code).toBe(0);
    expect(readFileSync(out, 'utf8')).toContain('template: nor');
    expect(readdirSync(dir)).toEqual(['design.yaml']);
  });

  it('prints the design to stdout with -o -', () => {
    const run = cli('init', '-o', '-');
    expect(run.code).toBe(0);
    expect(run.stdout).toContain('name: starter-nand');
  });

  it('rejects an unknown template with exit 2, naming the allowed ones, and writes nothing', () => {
    const dir = tempDir();
    const run = cli('init', '--template', 'xor', '-o', join(dir, 'd.yaml'));
    expect(run.code).toBe(2);
    expect(run.stderr).toContain("'xor'");
    expect(run.stderr).toContain('nand, nor');
    expect(readdirSync(dir)).toEqual([]);
  });
});

describe('phasegap init: nodes', () => {
  it('writes a starter that declares its nodes, wires every switch to two of them and gets no warning', () => {
    const out = join(tempDir(), 'design.yaml');
    expect(cli('init', '-o', out).code).toBe(0);
    const parsed = parseYaml(readFileSync(out, 'utf8')) as {
      nodes: Record<string, unknown>;
      switches: Array<{ terminals?: unknown[]; signal?: unknown }>;
    };
    expect(Object.keys(parsed.nodes)).toEqual(['vin', 'cs']);
    expect(parsed.switches.length).toBeGreaterThan(0);
    for (const s of parsed.switches) {
      expect(s.terminals).toHaveLength(2);
      expect(s.signal).toBeUndefined();
    }
    const report = JSON.parse(cli('check', out, '--json').stdout) as {
      warnings: string[];
      corners: Array<{ checks: Array<{ kind: string }> }>;
    };
    expect(report.warnings).toEqual([]);
    expect(report.corners[0]!.checks.filter((c) => c.kind === 'off-state')).toHaveLength(parsed.switches.length);
  });
});
