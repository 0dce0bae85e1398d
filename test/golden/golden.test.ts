/**
 * The demo designs' key numbers against their pinned values (test/golden/<design>.json, made by
 * `npm run golden`). A failure lists every moved value; if the change is meant, refresh the goldens.
 */
import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import { basename, join } from 'node:path';
import { cliAsync, design, ROOT } from '../helpers.js';
import { differences, goldenNumbers, type GoldenNumbers } from './numbers.js';

const DESIGNS = readdirSync(join(ROOT, 'fixtures', 'designs'))
  .filter((f) => f.endsWith('.yaml'))
  .map((f) => basename(f, '.yaml'))
  .sort();
const GOLDEN = join(ROOT, 'test', 'golden');

describe('golden numbers of the demo designs', () => {
  it('has one golden file per demo design and none for a design that is gone', () => {
    const files = readdirSync(GOLDEN)
      .filter((f) => f.endsWith('.json'))
      .map((f) => basename(f, '.json'))
      .sort();
    expect(files).toEqual(DESIGNS);
  });

  it.each(DESIGNS)(
    'check and fmax on %s give the pinned numbers (tolerance in test/golden/numbers.ts)',
    async (name) => {
      const check = await cliAsync('check', '--json', design(name));
      const fmax = await cliAsync('fmax', '--json', design(name));
      const golden = JSON.parse(readFileSync(join(GOLDEN, `${name}.json`), 'utf8')) as GoldenNumbers;
      expect(differences(goldenNumbers(name, check.stdout, fmax.stdout), golden)).toEqual([]);
    },
    900_000,
  );
});
