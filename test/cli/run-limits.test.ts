import { describe, expect, it } from 'vitest';
import { cli, cliAsync, design } from '../helpers.js';
import { MAX_SAMPLES, MAX_WORKERS } from '../../src/cli/run-limits.js';

/** Each refusal comes before any work: these runs would take days or exhaust memory if accepted. */
describe('run-size limits', () => {
  it.each([
    [['mc', '--samples', '1e12'], '--samples: "1e12" must be a whole number of dies from 1 to 10000000'],
    [
      ['mc', '--samples', String(MAX_SAMPLES + 1)],
      `--samples: "${MAX_SAMPLES + 1}" must be a whole number of dies from 1 to ${MAX_SAMPLES}`,
    ],
    [
      ['mc', '--workers', String(MAX_WORKERS + 1)],
      `--workers: "${MAX_WORKERS + 1}" must be a whole number of threads from 1 to ${MAX_WORKERS}`,
    ],
    [['mc', '--seed', '4294967296'], '--seed: "4294967296" must be a whole number of at least 0 and at most 4294967295'],
    [['mc', '--replay', '1e3'], '--replay: "1e3" must be a whole number of die indices from 0 to 9999999'],
    [
      ['sweep', '--vary', 'temperature=0:100:1000000000'],
      '--vary temperature: "0:100:1000000000" asks for 1000000000 points; a sweep has at most 1000000 points (N from 1 to 1000000)',
    ],
    [
      ['sweep', '--vary', 'temperature=0:100:1000', '--vary', 'vdd=1.6:2.0:1001'],
      '--vary: "temperature (1000) x vdd (1001)" makes 1001000 points; a sweep has at most 1000000 points',
    ],
    [['sweep', '--vary', 'vdd=1.8', '--workers', '1e3'], `--workers: "1e3" must be a whole number of threads from 1 to ${MAX_WORKERS}`],
    [['report', '--mc', '20000000', '-o', '-'], '--mc: "20000000" must be a whole number of dies from 1 to 10000000'],
  ])('%j exits 2 with the option, value and range named', async (args, message) => {
    const [command, ...rest] = args;
    const r = await cliAsync(command!, design('doubler'), ...rest);
    expect(r.code).toBe(2);
    expect(r.stderr).toBe(`phasegap: error: ${message}\n`);
    expect(r.stdout).toBe('');
  });

  it.each([
    [['tune', '--top', '1001'], '--top: "1001" must be a whole number of at least 1 and at most 1000'],
    [['fmax', '--resolution', '1e-300'], '--resolution: "1e-300" must be a relative step from 1e-9 up to (not including) 0.5'],
    [['waves', '--periods', '1e6', '-o', '-'], '--periods: "1e6" must be a whole number of clock periods from 1 to 1000'],
    [
      ['verilog', '--corner', 'worst', '--testbench', '--periods', '100000'],
      '--periods: "100000" must be a whole number of clock periods from 3 to 10000',
    ],
    [['confirm', '--jobs', '257'], '--jobs: "257" must be a whole number of simulations at once from 1 to 256'],
  ])('%j exits 2 with the option, value and range named', (args, message) => {
    const [command, ...rest] = args;
    const r = cli(command!, design('doubler'), ...rest);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain(`phasegap: error: ${message}`);
  });

  it('refuses montecarlo.samples above the limit in the design file too', async () => {
    const r = await cliAsync('mc', design('doubler'), '--set', `montecarlo.samples=${MAX_SAMPLES + 1}`);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('montecarlo.samples');
  });
});
