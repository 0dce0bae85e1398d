/**
 * `npm run golden`: recomputes the pinned numbers of every demo design with the built CLI, prints
 * each value that moved beyond the tolerance (golden -> now, relative change), and rewrites
 * `test/golden/<design>.json`. Commit the files with the change that moved the numbers.
 * GOLDEN_ONLY=NAME[,NAME] refreshes only those designs.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { basename, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { differences, goldenNumbers, goldenText, type GoldenNumbers } from './numbers.js';

const ROOT = fileURLToPath(new URL('../../..', import.meta.url));
const MAIN = join(ROOT, 'dist', 'src', 'cli', 'main.js');
const DESIGNS = join(ROOT, 'fixtures', 'designs');
const GOLDEN = join(ROOT, 'test', 'golden');

/** The report text a command prints; exit 1 (a failing design) still prints the report. */
function report(...argv: string[]): string {
  const run = spawnSync(process.execPath, [MAIN, ...argv], { cwd: ROOT, encoding: 'utf8', maxBuffer: 256 * 1024 * 1024 });
  if (run.status !== 0 && run.status !== 1) throw new Error(`phasegap ${argv.join(' ')} exited ${run.status}: ${run.stderr}`);
  return run.stdout;
}

const only = process.env.GOLDEN_ONLY?.split(',');
const names = readdirSync(DESIGNS)
  .filter((f) => f.endsWith('.yaml'))
  .map((f) => basename(f, '.yaml'))
  .filter((n) => !only || only.includes(n))
  .sort();
let changed = 0;
for (const name of names) {
  const path = join('fixtures', 'designs', `${name}.yaml`);
  const now = goldenNumbers(name, report('check', '--json', path), report('fmax', '--json', path));
  const file = join(GOLDEN, `${name}.json`);
  const lines = existsSync(file) ? differences(now, JSON.parse(readFileSync(file, 'utf8')) as GoldenNumbers) : ['(new golden file)'];
  if (lines.length > 0) changed++;
  process.stdout.write(
    lines.length === 0 ? `${name}: unchanged\n` : `${name}: ${lines.length} changed\n${lines.map((l) => `  ${l}\n`).join('')}`,
  );
  writeFileSync(file, goldenText(now));
}
process.stdout.write(`${names.length} designs, ${changed} with changed numbers\n`);
