/**
 * The short fuzz campaign of `npm test`: FUZZ_SHORT_RUNS cases (default 100) from a fixed seed
 * (FUZZ_SEED overrides it), every property of oracles.ts on every case. A failure prints the
 * seed, the summary and the first case of each failure class; `FUZZ_SEED=<seed> FUZZ_RUNS=<n>
 * npm run fuzz` replays the same cases with their files kept.
 */
import { describe, expect, it } from 'vitest';
import { requireTool } from '../tools.js';
import { renderSummary, runCampaign } from './campaign.js';

const SEED = Number(process.env.FUZZ_SEED ?? 20_240_607);
const RUNS = Number(process.env.FUZZ_SHORT_RUNS ?? 100);

describe('phasegap under hostile design files', () => {
  // The oracles judge every output with these programs (oracles.ts).
  requireTool('xmllint', 'libxml2-utils');
  requireTool('ngspice', 'ngspice');
  requireTool('iverilog', 'iverilog');
  requireTool('sigrok-cli', 'sigrok-cli');
  it(`keeps every property on ${RUNS} mutated cases (seed ${SEED})`, async () => {
    const { outcomes, summary } = await runCampaign({ runs: RUNS, seed: SEED, timeoutMs: 60_000 });
    const text = renderSummary(summary, outcomes);
    process.stdout.write(text);
    expect(summary.failing, text).toBe(0);
  }, 600_000);
});
