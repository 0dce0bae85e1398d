import { describe, it, expect } from 'vitest';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { cli, design, tempDir } from '../helpers.js';

/** Each bad edit of the doubler's switches: exit 2, the field path named, nothing written. */
describe('check rejects bad switches and constraints', () => {
  it.each([
    ['a switch driven by a net that does not exist', 'switches[0].gate=p9', 'switches[0].gate', 'is not a net of the generator'],
    [
      'a pair naming an unknown switch',
      'constraints.breakBeforeMake[0].between[1]=s_nope',
      'constraints.breakBeforeMake[0].between[1]',
      'is not a switch of the design',
    ],
    [
      'a level shifter whose high level is below its low level',
      'switches[3].levelShifter.high=0.5vdd',
      'switches[3].levelShifter.high',
      'must be above the low level',
    ],
    ['a zero width', 'switches[0].w=0', 'switches[0].w', 'greater than 0'],
    ['a negative length', 'switches[1].l=-0.18um', 'switches[1].l', 'greater than 0'],
    ['a settle path with both error and bits', 'constraints.settle[0].bits=10', 'constraints.settle[0]', 'exactly one of'],
    ['an unknown switch type', 'switches[0].type=jfet', 'switches[0].type', 'nmos'],
    ['a tgate without its p gate net', 'switches[0].type=tgate', 'switches[0].gateBar', 'is required for a tgate'],
  ])('%s', (_what, set, path, words) => {
    const dir = tempDir();
    const out = join(dir, 'report.json');
    const r = cli('check', design('doubler'), '--set', set, '--json', '-o', out);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain(path);
    expect(r.stderr).toContain(words);
    expect(r.stderr).not.toMatch(/\n\s+at /);
    expect(existsSync(out)).toBe(false);
  });
});
