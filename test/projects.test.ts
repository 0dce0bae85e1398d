import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { ROOT } from './helpers.js';
import { INTEGRATION_FILES } from './outside-tools.js';
import { NOT_IN_UNIT, projectOf, SYSTEM_FILES, SYSTEM_FOLDER } from './projects.js';

/** Every test file under test/, from the repository root. */
function testFiles(dir = join(ROOT, 'test')): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return testFiles(path);
    return name.endsWith('.test.ts') ? [relative(ROOT, path)] : [];
  });
}

describe('projectOf', () => {
  it('puts outside programs in integration, test/cli and the listed whole-program files in system, the rest in unit', () => {
    expect(projectOf('test/verilog/verilog.test.ts')).toBe('integration');
    expect(projectOf('test/cli/report.test.ts')).toBe('integration');
    expect(projectOf('test/cli/check.test.ts')).toBe('system');
    expect(projectOf('test/golden/golden.test.ts')).toBe('system');
    expect(projectOf('test/fuzz/fuzz.test.ts')).toBe('integration');
    expect(projectOf('test/sim/engine.test.ts')).toBe('unit');
  });
});

describe('the project tables', () => {
  const files = testFiles();

  it('name only test files that exist, each in one table', () => {
    for (const file of [...Object.keys(SYSTEM_FILES), ...Object.keys(INTEGRATION_FILES)]) expect(files).toContain(file);
    expect(Object.keys(SYSTEM_FILES).filter((file) => file in INTEGRATION_FILES || file.startsWith(SYSTEM_FOLDER))).toEqual([]);
  });

  it('leave the unit project files that start no process or thread and mock no module', () => {
    const unit = files.filter((file) => projectOf(file) === 'unit');
    expect(unit.length).toBeGreaterThan(60);
    const offending = unit.filter((file) => NOT_IN_UNIT.test(readFileSync(join(ROOT, file), 'utf8')));
    expect(offending).toEqual([]);
  });
});
