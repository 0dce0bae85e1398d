import { afterEach, describe, expect, it } from 'vitest';
import { copyFileSync, existsSync, mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { expectClose, fixture, inputIssues, tempDir } from '../helpers.js';
import { parseSimulatorOutput } from '../../src/spice/results.js';
import { runDecks } from '../../src/spice/runner.js';
import { cornerModels } from '../../src/spice/models.js';
import { loadProcess } from '../../src/cli/load.js';
import { requireTool } from '../tools.js';

requireTool('ngspice', 'ngspice');

/** A one-resistor deck whose resistance comes from an included file: 1 V across it, ngspice prints the current. */
function includingDeck(include: string): string {
  return ['* include test', include, 'v1 a 0 1', 'r1 a 0 {rv}', '.tran 1n 10n', '.meas tran ia AVG i(v1)', '.end', ''].join('\n');
}

/** The measured current through v1, A (NaN when ngspice measured nothing). */
function current(output: string): number {
  return parseSimulatorOutput(output, ['ia']).values.get('ia') ?? NaN;
}

describe('runDecks', () => {
  const home = process.cwd();
  const tmp = process.env.TMPDIR;
  afterEach(() => {
    process.chdir(home);
    if (tmp === undefined) delete process.env.TMPDIR;
    else process.env.TMPDIR = tmp;
  });

  it('runs ngspice in a fresh folder, so a .spiceinit in the working directory is not read (ngspice reads ./.spiceinit)', () => {
    const dir = tempDir();
    const marker = join(dir, 'spiceinit-ran');
    writeFileSync(join(dir, '.spiceinit'), `shell touch ${marker}\n`);
    process.chdir(dir);
    const [out] = runDecks([{ name: 'r', text: ['* r', 'v1 a 0 1', 'r1 a 0 1k', '.op', '.end', ''].join('\n') }], { parallel: 1 });
    expect(out!.output).not.toMatch(/wrote no output/);
    expect(existsSync(marker)).toBe(false);
  });

  it('works with a temporary folder whose path holds spaces and quotes', () => {
    const odd = join(tempDir(), `it's a "tmp" dir`);
    mkdirSync(odd);
    process.env.TMPDIR = odd;
    const [out] = runDecks(
      [{ name: 'r', text: ['* r', 'v1 a 0 1', 'r1 a 0 2k', '.tran 1n 10n', '.meas tran ia AVG i(v1)', '.end', ''].join('\n') }],
      { parallel: 1 },
    );
    // 1 V across 2 kohm: -0.5 mA through the source (ngspice's sign: current into its + node).
    expectClose(current(out!.output), -0.5e-3, 1e-6);
  });

  it('includes a model file from a folder whose name holds spaces and a single quote', () => {
    const folder = join(tempDir(), "o'brien models");
    mkdirSync(folder);
    const lib = join(folder, 'r.lib');
    writeFileSync(lib, '.param rv=4k\n');
    const card = loadProcess(fixture('processes', 'generic180.yaml'));
    const include = cornerModels(card, { process: 'tt', temperature: 27 }, lib).header[0]!;
    expect(include).toBe(`.include "${lib}"`);
    const [out] = runDecks([{ name: 'r', text: includingDeck(include) }], { parallel: 1 });
    expectClose(current(out!.output), -0.25e-3, 1e-6);
  });

  it('refuses a model path with a double quote before any deck is written', () => {
    const folder = join(tempDir(), 'say "cheese"');
    mkdirSync(folder);
    const lib = join(folder, 'generic180.lib');
    copyFileSync(fixture('models', 'generic180.lib'), lib);
    const card = loadProcess(fixture('processes', 'generic180.yaml'));
    expect(inputIssues(() => cornerModels(card, { process: 'tt', temperature: 27 }, lib))).toEqual([
      expect.objectContaining({ code: 'value.invalid', path: ['process', 'spice', 'models'] }),
    ]);
    expect(() => cornerModels(card, { process: 'tt', temperature: 27 }, lib)).toThrow(
      /process\.spice\.models: ".*say \\"cheese\\".*" cannot be written in a deck's \.include line \(it comes from the process card or --models\)/,
    );
  });
});
