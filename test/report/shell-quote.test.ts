import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { shellCommand, shellQuote } from '../../src/report/shell-quote.js';

describe('shellQuote', () => {
  it('leaves plain words alone', () => {
    expect(shellQuote('fixtures/designs/doubler.yaml')).toBe('fixtures/designs/doubler.yaml');
    expect(shellQuote('generator.stageLoad=40fF')).toBe('generator.stageLoad=40fF');
  });

  it.each([
    "my design's copy.yaml",
    'a b',
    '$(touch x)',
    '`id`',
    'generator.stageSize=[1,2]',
    'x;rm -rf y',
    '*',
    '~/d.yaml',
    "'",
    'a"b\\c',
    '-',
    '',
  ])('quotes %j so that /bin/sh reads it back as one word', (word) => {
    const run = spawnSync('/bin/sh', ['-c', `printf '%s|' ${shellQuote(word)}`], { encoding: 'utf8' });
    expect(run.stdout).toBe(`${word}|`);
  });

  it('shows control characters as \\xNN inside the quotes', () => {
    expect(shellQuote('a\nb\u001b[2J')).toBe("'a\\x0ab\\x1b[2J'");
  });
});

describe('shellCommand', () => {
  it('quotes each word', () => {
    expect(shellCommand(['phasegap', 'check', 'my file.yaml', '--set', 'generator.stageSize=[1,2]'])).toBe(
      "phasegap check 'my file.yaml' --set 'generator.stageSize=[1,2]'",
    );
  });
});
