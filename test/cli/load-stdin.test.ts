import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { cliWith, design, fixture } from '../helpers.js';
import { MAX_DESIGN_BYTES } from '../../src/schema/limits.js';

// A design on standard input names its process card relative to the working folder.
const text = readFileSync(design('doubler'), 'utf8').replace('../processes/generic180.yaml', fixture('processes', 'generic180.yaml'));
const stdin = (t: string) => (limit: number) => t.slice(0, limit + 1);

describe('DESIGN - reads standard input', () => {
  it('check - gives the same verdict as the file and hashes the text read', async () => {
    const run = await cliWith({ readStdin: stdin(text) }, 'check', '-', '--json');
    expect(run.code).toBe(0);
    const data = JSON.parse(run.stdout);
    expect(data.corners).toHaveLength(45);
    expect(data.provenance.inputs[0]).toEqual({ role: 'design', path: '-', sha256: createHash('sha256').update(text).digest('hex') });
  });

  it.each([
    ['fmax', []],
    ['draw', ['-o', '-']],
    ['waves', ['-o', '-']],
    ['spice', ['--corner', 'worst']],
    ['verilog', ['--corner', 'worst']],
    ['report', ['--no-fmax', '--no-tune', '-o', '-']],
  ])('%s - reads it', async (command, args) => {
    const run = await cliWith({ readStdin: stdin(text) }, command, '-', ...args);
    expect(run.stderr).toBe('');
    expect(run.code).toBe(0);
    expect(run.stdout.length).toBeGreaterThan(500);
  });

  it('mc - and sweep - hand the text to their threads', async () => {
    const mc = await cliWith({ readStdin: stdin(text) }, 'mc', '-', '--samples', '64', '--workers', '2');
    expect(mc.code).toBe(0);
    expect(mc.stdout).toMatch(/^verdict: PASS$/m);
    const sweep = await cliWith({ readStdin: stdin(text) }, 'sweep', '-', '--vary', 'vdd=1.7,1.8,1.9', '--workers', '2');
    expect(sweep.code).toBe(0);
    expect(sweep.stdout.trim().split('\n')).toHaveLength(4);
  });

  it('JSON on standard input is read as JSON', async () => {
    const json = JSON.stringify({ ...JSON.parse(JSON.stringify((await import('yaml')).parse(text))) });
    const run = await cliWith({ readStdin: stdin(json) }, 'check', '-');
    expect(run.code).toBe(0);
  });

  it('refuses input over the size limit, a missing or unreadable stdin, and a bad design with exit 2 and one clear line', async () => {
    const big = `# ${'x'.repeat(MAX_DESIGN_BYTES.yaml)}\n${text}`;
    const over = await cliWith({ readStdin: stdin(big) }, 'check', '-');
    expect(over.code).toBe(2);
    expect(over.stderr).toBe(
      'phasegap: error: DESIGN: "-" (standard input) is larger than 1 MiB, the limit for a YAML design or process card (a JSON one may have 16 MiB)\n',
    );
    const none = await cliWith({ readStdin: undefined }, 'check', '-');
    expect(none.code).toBe(2);
    expect(none.stderr).toMatch(/^phasegap: error: DESIGN: "-" means standard input, which this run does not have/);
    const { StdinError } = await import('../../src/cli/io.js');
    const tty = await cliWith(
      {
        readStdin: () => {
          throw new StdinError('standard input is a terminal; pipe or redirect a design into it');
        },
      },
      'check',
      '-',
    );
    expect(tty.stderr).toBe('phasegap: error: DESIGN: "-" standard input is a terminal; pipe or redirect a design into it\n');
    const typo = await cliWith({ readStdin: stdin(text.replace('frequency:', 'frequncy:')) }, 'check', '-');
    expect(typo.code).toBe(2);
    expect(typo.stderr).toMatch(/^phasegap: error: clock/m);
  });
});
