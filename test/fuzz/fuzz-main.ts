/**
 * `npm run fuzz`: the long campaign. FUZZ_RUNS cases (default 10000) from FUZZ_SEED (default: the
 * clock, printed first so the run replays), FUZZ_TIMEOUT ms per run (default 60000). Writes
 * fuzz-summary.json and fuzz-summary.txt and keeps failing cases under FUZZ_OUT (default $TMPDIR/phasegap-fuzz-<seed>).
 * Exit 1 when any property failed.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { renderSummary, runCampaign } from './campaign.js';

const runs = Number(process.env.FUZZ_RUNS ?? 10_000);
/** First case index: a long campaign can run as several processes (FUZZ_START=0, 1000, ...), same cases. */
const start = Number(process.env.FUZZ_START ?? 0);
const seed = Number(process.env.FUZZ_SEED ?? Date.now() % 2 ** 31);
const timeoutMs = Number(process.env.FUZZ_TIMEOUT ?? 60_000);
const outDir = resolve(process.env.FUZZ_OUT ?? join(tmpdir(), `phasegap-fuzz-${seed}`));
if (!Number.isInteger(runs) || runs < 1 || !Number.isInteger(seed) || !(timeoutMs > 0) || !Number.isInteger(start) || start < 0) {
  process.stderr.write(
    'fuzz: FUZZ_RUNS must be a whole number >= 1, FUZZ_SEED a whole number, FUZZ_START a whole number >= 0, FUZZ_TIMEOUT ms > 0\n',
  );
  process.exit(2);
}
mkdirSync(outDir, { recursive: true });
process.stdout.write(`fuzz: seed ${seed}, ${runs} cases from case ${start}, failing cases kept in ${outDir}\n`);
const started = Date.now();
let done = 0;
let failing = 0;
const { outcomes, summary } = await runCampaign({
  runs,
  start,
  seed,
  timeoutMs,
  keepDir: outDir,
  onCase: (index, c, violations) => {
    done++;
    if (violations.length > 0) {
      failing++;
      process.stdout.write(`case ${index} ${c.command}: ${[...new Set(violations.map((v) => v.property))].join(', ')}\n`);
    }
    if (done % 100 === 0)
      process.stdout.write(`... ${done}/${runs} cases, ${failing} failing, ${Math.round((Date.now() - started) / 1000)} s\n`);
  },
});
const text = renderSummary(summary, outcomes);
writeFileSync(
  join(outDir, 'fuzz-summary.json'),
  `${JSON.stringify({ ...summary, seconds: Math.round((Date.now() - started) / 1000) }, null, 2)}\n`,
);
writeFileSync(join(outDir, 'fuzz-summary.txt'), text);
process.stdout.write(text);
process.exitCode = summary.failing > 0 ? 1 : 0;
