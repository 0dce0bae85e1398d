/**
 * The outside programs the integration tests drive, and which test file drives which. The vitest
 * config reads this table to split the suite into the `unit` project (no outside program) and the
 * `integration` project; `test/tools.test.ts` holds every file's `requireTool` calls to it.
 * No vitest import here: the config loads this module before any test runs.
 */
import { accessSync, constants } from 'node:fs';
import { delimiter, join } from 'node:path';

/** Each outside program and the Debian package that installs it (the list `.ci/run` installs). */
export const TOOLS = {
  ngspice: 'ngspice',
  chromium: 'chromium',
  iverilog: 'iverilog',
  'sigrok-cli': 'sigrok-cli',
  xmllint: 'libxml2-utils',
  'rsvg-convert': 'librsvg2-bin',
} as const;

export type Tool = keyof typeof TOOLS;

/**
 * The `integration` project: test files (from the repository root) that need outside programs, with
 * the programs each needs.
 */
export const INTEGRATION_FILES: Readonly<Record<string, readonly Tool[]>> = {
  'test/checks/gap-band.test.ts': ['ngspice'],
  'test/fuzz/fuzz.test.ts': ['iverilog', 'ngspice', 'sigrok-cli', 'xmllint'],
  'test/analysis/tune-ngspice.test.ts': ['ngspice'],
  'test/analysis/tune.test.ts': ['ngspice'],
  'test/cli/deck-progress.test.ts': ['ngspice'],
  'test/cli/report.test.ts': ['ngspice'],
  'test/cli/waves.test.ts': ['sigrok-cli'],
  'test/delay/table.test.ts': ['ngspice'],
  'test/process/device-ngspice.test.ts': ['ngspice'],
  'test/reference/reference.test.ts': ['ngspice'],
  'test/render/browser.test.ts': ['chromium', 'ngspice'],
  'test/render/histogram.test.ts': ['xmllint'],
  'test/render/svg/circuit-sweep-chart.test.ts': ['xmllint'],
  'test/render/svg/circuit-waves.test.ts': ['xmllint'],
  'test/render/hostile-names.test.ts': ['xmllint'],
  'test/checks/switch-band.test.ts': ['ngspice'],
  'test/render/timing-legibility.test.ts': ['xmllint'],
  'test/render/timing.test.ts': ['rsvg-convert'],
  'test/render/vcd.test.ts': ['sigrok-cli'],
  'test/report/junit.test.ts': ['xmllint'],
  'test/spice/agreement.test.ts': ['ngspice'],
  'test/spice/circuit-confirm.test.ts': ['ngspice'],
  'test/spice/characterize-ron.test.ts': ['ngspice'],
  'test/spice/deck.test.ts': ['ngspice'],
  'test/spice/down-shifter.test.ts': ['ngspice'],
  'test/spice/hostile-deck.test.ts': ['ngspice'],
  'test/spice/injection-deck.test.ts': ['ngspice'],
  'test/spice/pump.test.ts': ['ngspice'],
  'test/spice/runner.test.ts': ['ngspice'],
  'test/switches/physics-ngspice.test.ts': ['ngspice'],
  'test/switches/shifter-hand-deck.test.ts': ['ngspice'],
  'test/switches/shifter-timing.test.ts': ['ngspice'],
  'test/verilog/identifiers.test.ts': ['iverilog'],
  'test/verilog/verilog.test.ts': ['iverilog'],
};

/** The path of `command` on `path` (a PATH value), or undefined. */
export function findOnPath(command: string, path: string = process.env.PATH ?? ''): string | undefined {
  for (const dir of path.split(delimiter)) {
    if (dir === '') continue;
    const file = join(dir, command);
    try {
      accessSync(file, constants.X_OK);
      return file;
    } catch {
      // not in this folder
    }
  }
  return undefined;
}

/** The outside programs that are not on `path`. */
export function missingTools(path: string = process.env.PATH ?? ''): Tool[] {
  return (Object.keys(TOOLS) as Tool[]).filter((tool) => findOnPath(tool, path) === undefined);
}

/** The integration files whose programs are all on `path`, and those that need a missing one. */
export function integrationFiles(missing: readonly Tool[]): { runnable: string[]; blocked: string[] } {
  const files = Object.keys(INTEGRATION_FILES);
  const blocked = files.filter((file) => INTEGRATION_FILES[file]!.some((tool) => missing.includes(tool)));
  return { runnable: files.filter((file) => !blocked.includes(file)), blocked };
}

/** True under continuous integration (`CI` set to anything but empty or `false`), where a missing program fails the run. */
export function underCi(env: NodeJS.ProcessEnv = process.env): boolean {
  return env.CI !== undefined && env.CI !== '' && env.CI !== 'false';
}

/** What the integration project says at its start about missing programs (empty when none is missing). */
export function missingToolsReport(missing: readonly Tool[], ci: boolean): string {
  if (missing.length === 0) return '';
  const install = [...new Set(missing.map((tool) => TOOLS[tool]))].join(' ');
  const { blocked } = integrationFiles(missing);
  const consequence = ci ? 'CI is set, so the run fails' : `${blocked.length} test files that need them are skipped`;
  return `integration: missing ${missing.join(', ')}: ${consequence}; install with \`sudo apt-get install ${install}\` (or \`sudo bash .ci/run\`)`;
}
