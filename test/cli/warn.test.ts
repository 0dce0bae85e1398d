import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { noteTo, warnTo, warningLine } from '../../src/cli/warn.js';
import type { Io } from '../../src/cli/io.js';
import { cli, design, fixture, tempDir } from '../helpers.js';

const TT = ['--set', 'corners.process=[tt]', '--set', 'corners.vdd=[1.8V]', '--set', 'corners.temperature=[27]'];

/** Every non-empty line of a run's stderr. */
const lines = (stderr: string) => stderr.split('\n').filter((l) => l !== '');

describe('warnTo and noteTo', () => {
  it('write one prefixed line each', () => {
    let text = '';
    const io = {
      stderr: (t: string) => {
        text += t;
      },
    } as Io;
    warnTo(io)('extrapolating');
    noteTo(io, 'wrote x.v');
    expect(text).toBe('phasegap: warning: extrapolating\nphasegap: wrote x.v\n');
    expect(warningLine('a')).toBe('phasegap: warning: a\n');
  });
});

describe('stderr of the commands', () => {
  const dir = tempDir();
  it.each([
    [
      'a table-model warning',
      ['--tables', fixture('tables', 'generic180.json'), 'check', design('doubler'), ...TT, '--set', 'corners.vdd=[1.3V]'],
      /^phasegap: warning: table model: /,
    ],
    ['a hint', ['check', design('doubler-unboosted'), ...TT], /^phasegap: hint: /],
    ['the file init wrote', ['init', '-o', join(dir, 'starter.yaml')], /^phasegap: wrote .*starter\.yaml; next: /],
    [
      'the file verilog wrote',
      ['verilog', design('doubler'), '--corner', 'tt/1.8V/27C', '-o', join(dir, 'gen.v')],
      /^phasegap: wrote .*gen\.v \(tt\/1\.8V\/27C, /,
    ],
    [
      'the deck spice wrote',
      ['spice', design('doubler'), '--corner', 'tt/1.8V/27C', '-o', join(dir, 'deck.sp')],
      /^phasegap: wrote .*deck\.sp \(tt\/1\.8V\/27C, /,
    ],
    ['an unknown option', ['check', design('doubler'), '--bogus'], /^phasegap: error: unknown option '--bogus'$/],
    ['an unknown command with a suggestion', ['chek', design('doubler')], /^phasegap: error: unknown command 'chek'$/],
    ['a missing argument', ['check'], /^phasegap: error: missing required argument 'DESIGN'$/],
    ['a bad design value', ['check', design('doubler'), '--set', 'clock.frequency=fast'], /^phasegap: error: clock\.frequency: /],
  ])('start every line with "phasegap: " for %s', (_what, argv, first) => {
    const run = cli(...argv);
    const text = lines(run.stderr);
    expect(text.length).toBeGreaterThan(0);
    expect(text[0]).toMatch(first);
    for (const line of text) expect(line).toMatch(/^phasegap: /);
  });
});
