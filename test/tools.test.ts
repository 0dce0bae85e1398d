import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { ROOT } from './helpers.js';
import { findOnPath, missingToolError, missingToolMessage } from './tools.js';
import { INTEGRATION_FILES, integrationFiles, missingToolsReport, TOOLS, underCi } from './outside-tools.js';

/** Every test source under test/, recursively. */
function testSources(dir = join(ROOT, 'test')): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    return statSync(path).isDirectory() ? testSources(path) : name.endsWith('.ts') ? [path] : [];
  });
}

/** The Debian packages .ci/run installs. */
function ciPackages(): string[] {
  const m = /^packages=\(([^)]*)\)/m.exec(readFileSync(join(ROOT, '.ci', 'run'), 'utf8'));
  return m ? m[1]!.trim().split(/\s+/) : [];
}

describe('findOnPath', () => {
  it('finds an executable in a PATH folder and nothing for a name that no folder holds', () => {
    expect(findOnPath('sh', '/nonexistent:/bin')).toBe('/bin/sh');
    expect(findOnPath('sh', '/nonexistent')).toBeUndefined();
    expect(findOnPath('sh', '')).toBeUndefined();
  });
});

describe('missingToolError', () => {
  it('is one line naming the Debian package, with no stack frames', () => {
    const error = missingToolError('no-such-tool-xyz', 'libxml2-utils')!;
    expect(error.message).toBe(missingToolMessage('no-such-tool-xyz', 'libxml2-utils'));
    expect(error.message).toContain('sudo apt-get install libxml2-utils');
    expect(error.message).not.toContain('\n');
    expect(error.stack).toBe(error.message);
  });

  it('is undefined when the program is installed', () => {
    expect(missingToolError('sh', 'dash')).toBeUndefined();
  });
});

describe('requireTool calls in the tests', () => {
  const calls = testSources().flatMap((file) =>
    [...readFileSync(file, 'utf8').matchAll(/requireTool\('([^']+)', '([^']+)'\)/g)].map((m) => ({
      file: relative(ROOT, file),
      command: m[1]!,
      pkg: m[2]!,
    })),
  );

  it('name only packages that .ci/run installs', () => {
    expect(calls.length).toBeGreaterThanOrEqual(15);
    const packages = ciPackages();
    expect(packages).toContain('ngspice');
    expect(calls.filter((c) => !packages.includes(c.pkg))).toEqual([]);
  });

  it('are made by exactly the integration files, each for the programs the project table lists', () => {
    const byFile = new Map<string, Set<string>>();
    for (const c of calls) byFile.set(c.file, (byFile.get(c.file) ?? new Set()).add(c.command));
    const table = Object.fromEntries(
      Object.entries(INTEGRATION_FILES)
        .filter(([, tools]) => tools.length > 0)
        .map(([file, tools]) => [file, [...tools].sort()]),
    );
    expect(Object.fromEntries([...byFile].map(([file, tools]) => [file, [...tools].sort()]))).toEqual(table);
    for (const c of calls) expect(c.pkg).toBe(TOOLS[c.command as keyof typeof TOOLS]);
  });

  it('cover every outside program the tests drive', () => {
    const tools = new Set(calls.map((c) => c.command));
    for (const tool of ['ngspice', 'chromium', 'sigrok-cli', 'iverilog', 'rsvg-convert', 'xmllint']) expect(tools).toContain(tool);
  });
});

describe('integrationFiles', () => {
  it('blocks exactly the files that need a missing program', () => {
    const { runnable, blocked } = integrationFiles(['iverilog']);
    expect(blocked).toEqual(['test/fuzz/fuzz.test.ts', 'test/verilog/identifiers.test.ts', 'test/verilog/verilog.test.ts']);
    expect(runnable).toHaveLength(Object.keys(INTEGRATION_FILES).length - 3);
    expect(integrationFiles([]).blocked).toEqual([]);
  });
});

describe('missingToolsReport', () => {
  it('names each missing program, what happens to their tests and the packages to install', () => {
    expect(missingToolsReport(['xmllint', 'rsvg-convert'], false)).toBe(
      'integration: missing xmllint, rsvg-convert: 8 test files that need them are skipped; install with `sudo apt-get install libxml2-utils librsvg2-bin` (or `sudo bash .ci/run`)',
    );
    expect(missingToolsReport(['chromium'], true)).toBe(
      'integration: missing chromium: CI is set, so the run fails; install with `sudo apt-get install chromium` (or `sudo bash .ci/run`)',
    );
    expect(missingToolsReport([], true)).toBe('');
  });
});

describe('underCi', () => {
  it('is true for any CI value but empty and false', () => {
    expect(underCi({ CI: 'true' })).toBe(true);
    expect(underCi({ CI: '1' })).toBe(true);
    expect(underCi({ CI: '' })).toBe(false);
    expect(underCi({ CI: 'false' })).toBe(false);
    expect(underCi({})).toBe(false);
  });
});
