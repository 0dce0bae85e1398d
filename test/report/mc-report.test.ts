import { describe, expect, it } from 'vitest';
import { copyFileSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { cliAsync, design, processCard, tempDir } from '../helpers.js';

describe('renderMcText replay hint', () => {
  it('prints the real design path, shell-quoted, with the --set options, and the hint replays the worst die', async () => {
    const dir = join(tempDir(), 'my designs');
    mkdirSync(dir);
    const path = join(dir, "it's.yaml");
    // The design names its card by a path relative to itself; keep that card beside it.
    const text = readFileSync(design('doubler'), 'utf8');
    writeFileSync(path, text);
    const cardLine = /^process:\s*(\S+)/m.exec(text)?.[1];
    if (cardLine?.includes('/')) {
      mkdirSync(join(dir, cardLine, '..'), { recursive: true });
      copyFileSync(processCard('generic180'), join(dir, cardLine));
    }
    const run = await cliAsync('mc', path, '--samples', '20', '--seed', '7', '--workers', '1', '--set', 'clock.frequency=25MHz');
    expect(run.stderr).toBe('');
    const hint = /^replay the worst die: (.*)$/m.exec(run.stdout)![1]!;
    const quoted = `'${path.replace(/'/g, `'\\''`)}'`;
    expect(hint.startsWith(`phasegap mc ${quoted} --set clock.frequency=25MHz --seed 7 --replay `)).toBe(true);
    const die = Number(/--replay (\d+)$/.exec(hint)![1]);
    const replay = await cliAsync('mc', path, '--set', 'clock.frequency=25MHz', '--seed', '7', '--replay', String(die));
    expect(replay.stdout).toContain(`(die ${die}, seed 7)`);
  });
});
