import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { identifier, renderVcd, ticks, vcdName, vcdText } from '../../src/render/vcd/vcd.js';
import { tempDir } from '../helpers.js';
import { hostileName } from '../schema/hostile.js';
import { requireTool } from '../tools.js';

describe('identifier', () => {
  it('counts through printable ASCII 33..126, then two characters (IEEE 1364-2005 clause 18)', () => {
    expect(identifier(0)).toBe('!');
    expect(identifier(93)).toBe('~');
    expect(identifier(94)).toBe('!!');
    expect(identifier(95)).toBe('"!');
    const ids = Array.from({ length: 20000 }, (_, i) => identifier(i));
    expect(new Set(ids).size).toBe(ids.length);
    expect(ids.every((id) => [...id].every((c) => c.charCodeAt(0) >= 33 && c.charCodeAt(0) <= 126))).toBe(true);
  });
});

describe('vcdName', () => {
  it('keeps letters, digits and _ and replaces the rest, $ included', () => {
    expect(vcdName('s_chg.n1')).toBe('s_chg_n1');
    expect(vcdName('bus[3]')).toBe('bus_3_');
    expect(vcdName('1x')).toBe('_1x');
    expect(vcdName('a$end')).toBe('a_end');
    expect(vcdName('$end')).toBe('_end');
  });
});

describe('ticks', () => {
  it('rounds seconds to whole timescale units', () => {
    expect(ticks(1.2345678e-9, '1fs')).toBe(1234568);
    expect(ticks(1.2345678e-9, '10fs')).toBe(123457);
  });
});

describe('renderVcd', () => {
  const text = renderVcd({
    top: 'gen-1',
    comment: 'c',
    version: 'v',
    timescale: '1fs',
    end: 10e-12,
    signals: [
      { scope: [], name: 'clk', initial: 1, changes: [{ time: 5e-12, value: 0 }] },
      {
        scope: ['internal'],
        name: 'a.b',
        initial: 0,
        changes: [
          { time: 2e-12, value: 1 },
          { time: 5e-12, value: 0 },
          { time: 5e-12, value: 0 },
        ],
      },
      { scope: [], name: 'late', initial: 0, changes: [{ time: 10e-12, value: 1 }] },
    ],
  });

  it('writes the header, one scope per generator with nested scopes, and $dumpvars at #0', () => {
    expect(text).toBe(
      [
        '$comment',
        '  c',
        '$end',
        '$version v $end',
        '$timescale 1 fs $end',
        '$scope module gen_1 $end',
        '$var wire 1 ! clk $end',
        '$var wire 1 # late $end',
        '$scope module internal $end',
        '$var wire 1 " a_b $end',
        '$upscope $end',
        '$upscope $end',
        '$enddefinitions $end',
        '#0',
        '$dumpvars',
        '1!',
        '0"',
        '0#',
        '$end',
        '#2000',
        '1"',
        '#5000',
        '0!',
        '0"',
        '#10000',
        '',
      ].join('\n'),
    );
  });

  it('drops repeated values and changes at or after the end marker, so times strictly increase', () => {
    const times = text
      .split('\n')
      .filter((l) => l.startsWith('#'))
      .map((l) => Number(l.slice(1)));
    expect(times).toEqual([0, 2000, 5000, 10000]);
  });
});

describe('vcdText', () => {
  it.each(['x $$end', '$$$end$end', 'a\n$end', 'a\r\n$var wire 1 % evil $end', hostileName('/tmp/x', 'all')])(
    'writes %j as one line of printable ASCII without a $',
    (text) => {
      const clean = vcdText(text);
      expect(clean).toMatch(/^[\x20-\x7e]*$/);
      expect(clean).not.toContain('$');
    },
  );
});

describe('renderVcd with hostile text', () => {
  requireTool('sigrok-cli', 'sigrok-cli');
  it('declares exactly the intended variables, as sigrok-cli (Debian package sigrok-cli) reads the file', () => {
    const evil = (tag: string) => `${tag} $$end $$var wire 1 % evil $$end $end\n$var wire 1 & evil2 $end\n${hostileName('/tmp/x', tag)}`;
    const text = renderVcd({
      top: evil('top'),
      comment: evil('comment'),
      version: evil('version'),
      timescale: '1fs',
      end: 10e-12,
      signals: [
        { scope: [], name: 'clk', initial: 1, changes: [{ time: 5e-12, value: 0 }] },
        { scope: [evil('scope')], name: evil('net'), initial: 0, changes: [{ time: 3e-12, value: 1 }] },
        { scope: [], name: 'a$end', initial: 0, changes: [{ time: 4e-12, value: 1 }] },
      ],
    });
    const file = join(tempDir(), 'h.vcd');
    writeFileSync(file, text);
    const out = execFileSync('sigrok-cli', ['-I', 'vcd', '-i', file, '-O', 'vcd'], { encoding: 'utf8' });
    const names = [...out.matchAll(/\$var wire 1 \S+ (\S+) \$end/g)].map((m) => m[1]);
    // sigrok lists every variable in one flat scope, in the order it meets them.
    expect(names).toEqual(['clk', 'a_end', vcdName(evil('net'))]);
  });
});
