import { describe, it, expect } from 'vitest';
import { applyOverrides } from '../../src/cli/overrides.js';
import { cli, design, inputErrorMessage } from '../helpers.js';

const message = inputErrorMessage;

describe('applyOverrides', () => {
  const raw = { clock: { frequency: '20MHz' }, corners: { vdd: ['1.62V', '1.8V'] }, name: 'x' };

  it('returns the same object when there is nothing to apply', () => {
    expect(applyOverrides(raw, [])).toBe(raw);
  });

  it('sets nested keys and list items, reading values as YAML, without touching the input', () => {
    const before = structuredClone(raw);
    const out = applyOverrides(raw, [
      'clock.frequency=40MHz',
      'corners.vdd[1]=1.9V',
      'generator.stages=4',
      'loads={p1: 1pF}',
      'corners.process=[tt, ss]',
    ]);
    expect(out).toEqual({
      clock: { frequency: '40MHz' },
      corners: { vdd: ['1.62V', '1.9V'], process: ['tt', 'ss'] },
      name: 'x',
      generator: { stages: 4 },
      loads: { p1: '1pF' },
    });
    expect(raw).toEqual(before);
  });

  it('applies overrides in order: the last one wins', () => {
    expect(applyOverrides(raw, ['name=a', 'name=b'])).toMatchObject({ name: 'b' });
  });

  it('creates lists for index paths that do not exist yet', () => {
    expect(applyOverrides({}, ['corners.temperature[0]=-40'])).toEqual({ corners: { temperature: [-40] } });
  });

  it('keeps = signs inside the value', () => {
    expect(applyOverrides({}, ['description=a=b'])).toEqual({ description: 'a=b' });
  });

  it.each([
    ['clock.frequency', '--set: "clock.frequency" must read PATH=VALUE'],
    ['=5', '--set: "=5" must read PATH=VALUE'],
    ['a..b=1', '--set: "a..b=1" has a malformed path'],
    ['a[x]=1', '--set: "a[x]=1" has a malformed path'],
    ['name.first=1', '--set: "name.first=1" cannot set inside name, which holds a plain value'],
    ['name={a: [1', '--set: "name={a: [1" has a value that is not a YAML scalar, list or mapping'],
    ['name={a: 1, a: 2}', '--set: "name={a: 1, a: 2}" has a value that is not a YAML scalar, list or mapping'],
    ['__proto__.x=1', '--set: "__proto__.x=1" names the reserved key "__proto__"'],
    ['clock.constructor=1', '--set: "clock.constructor=1" names the reserved key "constructor"'],
    ['corners.vdd[100001]=1V', '--set: "corners.vdd[100001]=1V" has list index 100001; a list holds at most 100000 items'],
    ['corners.vdd[3]=1V', 'sets item [3] of corners.vdd, which has 2 items; give an index from 0 to 2 (the last appends)'],
    ['corners.list[1]=1', 'sets item [1] of corners.list, which has 0 items; give an index from 0 to 0'],
    [
      'corners.list[0].x=1',
      'sets a field of item [0] of corners.list, which has 0 items; to add an item, set it whole, e.g. corners.list[0]={...}',
    ],
    ['corners.vdd.x=1', 'cannot set key "x" in corners.vdd, which is a list; write corners.vdd[N]'],
    ['clock[0]=1', 'cannot set item [0] in clock, which is a mapping; write clock.KEY'],
    ['name=__proto__', '--set: "name=__proto__" is refused at name: it is a reserved name'],
    ['switches[0]={name: constructor}', '--set: "switches[0]={name: constructor}" is refused at switches[0].name: it is a reserved name'],
    [
      'loads={constructor: 1pF}',
      '--set: "loads={constructor: 1pF}" is refused at loads.constructor: it uses the reserved key "constructor"',
    ],
    [`${'a.'.repeat(40)}b=1`, 'has a path 41 levels deep; design fields nest at most 32 deep'],
  ])('refuses %s', (text, expected) => {
    expect(message(() => applyOverrides(raw, [text]))).toContain(expected);
    expect(({} as Record<string, unknown>).x).toBeUndefined();
  });

  it('appends one item past the end of a list', () => {
    expect(applyOverrides(raw, ['corners.vdd[2]=2V'])).toMatchObject({ corners: { vdd: ['1.62V', '1.8V', '2V'] } });
  });
});

describe('check --set on a list item that does not exist', () => {
  it.each(['switches[4].w=1u', 'switches[9].w=1u'])('prints one error line for %s, exit 2', (set) => {
    const run = cli('check', design('doubler'), '--set', set);
    expect(run.code).toBe(2);
    expect(run.stderr.trim().split('\n')).toHaveLength(1);
    expect(run.stderr).toContain('of switches, which has 4 items');
  });
});

describe('check --set', () => {
  const json = (...set: string[]) => {
    const run = cli('check', design('doubler'), '--json', ...set.flatMap((s) => ['--set', s]));
    expect(run.stderr).toBe('');
    return JSON.parse(run.stdout) as {
      clock: { frequency: number };
      corners: Array<{ name: string; deadTimes: Array<{ t50: number }>; widths: Record<string, number> }>;
    };
  };

  it('changes the clock frequency without editing the file', () => {
    const base = json('corners.process=[tt]', 'corners.vdd=[1.8V]', 'corners.temperature=[27]');
    const fast = json('corners.process=[tt]', 'corners.vdd=[1.8V]', 'corners.temperature=[27]', 'clock.frequency=40MHz');
    expect(base.clock.frequency).toBe(20e6);
    expect(fast.clock.frequency).toBe(40e6);
    // Half the period: each phase is about half as wide.
    const ratio = fast.corners[0]!.widths.p1! / base.corners[0]!.widths.p1!;
    expect(ratio).toBeGreaterThan(0.45);
    expect(ratio).toBeLessThan(0.5);
  });

  it('changes the chain length: fewer stages, shorter dead time', () => {
    const corner = ['corners.process=[tt]', 'corners.vdd=[1.8V]', 'corners.temperature=[27]'];
    const six = json(...corner);
    const four = json(...corner, 'generator.stages=4');
    expect(six.corners.map((c) => c.name)).toEqual(['tt/1.8V/27C']);
    expect(four.corners[0]!.deadTimes[0]!.t50).toBeLessThan(six.corners[0]!.deadTimes[0]!.t50);
  });

  it('picks corners by axis edits', () => {
    const run = json('corners.process=[ss, ff]', 'corners.vdd=[1.62V]', 'corners.temperature=[125]');
    expect(run.corners.map((c) => c.name)).toEqual(['ss/1.62V/125C', 'ff/1.62V/125C']);
  });
});
