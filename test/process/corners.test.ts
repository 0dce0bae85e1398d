import { describe, it, expect } from 'vitest';
import { expandCorners } from '../../src/process/corners.js';
import { cornerName } from '../../src/process/corner.js';
import { cornersSchema, type CornersSpec } from '../../src/schema/design.js';
import { parseWith } from '../../src/schema/validate.js';
import { loadProcess } from '../../src/cli/load.js';
import { processCard, inputErrorMessage, inputIssues } from '../helpers.js';

const card = loadProcess(processCard('generic180'));
const spec = (raw: unknown): CornersSpec => parseWith(cornersSchema, raw);

const message = inputErrorMessage;

describe('cornerName', () => {
  it.each([
    ['ss', 1.62, 125, undefined, 'ss/1.62V/125C'],
    ['ff', 1.98, -40, undefined, 'ff/1.98V/-40C'],
    ['tt', 1.8, 27, 0.47, 'tt/1.8V/27C/duty0.47'],
  ] as const)('names %s %d V %d C as %s', (process, vdd, t, duty, name) => {
    expect(cornerName(process, vdd, t, duty)).toBe(name);
  });
});

describe('expandCorners', () => {
  it('takes the cartesian product in process, vdd, temperature order', () => {
    const corners = expandCorners(
      spec({
        process: ['tt', 'ss', 'ff', 'fs', 'sf'],
        vdd: ['1.62V', '1.8V', '1.98V'],
        temperature: [-40, 27, 125],
      }),
      card,
      0.5,
    );
    expect(corners).toHaveLength(45);
    expect(corners.slice(0, 4).map((c) => c.corner.name)).toEqual(['tt/1.62V/-40C', 'tt/1.62V/27C', 'tt/1.62V/125C', 'tt/1.8V/-40C']);
    expect(corners[44]!.corner).toEqual({ name: 'sf/1.98V/125C', process: 'sf', vdd: 1.98, temperature: 125, duty: 0.5 });
    expect(new Set(corners.map((c) => c.corner.name)).size).toBe(45);
  });

  it('fills missing axes with the card nominal, t0 and the clock duty', () => {
    const corners = expandCorners(spec({}), card, 0.45);
    expect(corners.map((c) => c.corner)).toEqual([{ name: 'tt/1.8V/27C', process: 'tt', vdd: 1.8, temperature: 27, duty: 0.45 }]);
    expect(corners[0]!.paths.vdd).toEqual(['process', 'vddNominal']);
  });

  it('adds the duty to the name only when the duty axis varies', () => {
    const corners = expandCorners(spec({ duty: [0.47, 0.53] }), card, 0.5);
    expect(corners.map((c) => c.corner.name)).toEqual(['tt/1.8V/27C/duty0.47', 'tt/1.8V/27C/duty0.53']);
    expect(corners.map((c) => c.corner.duty)).toEqual([0.47, 0.53]);
  });

  it('accepts an explicit list with the nominal duty by default', () => {
    const corners = expandCorners(
      spec({
        list: [
          { process: 'ss', vdd: '1.62V', temperature: '125C' },
          { process: 'ff', vdd: 1.98, temperature: -40 },
        ],
      }),
      card,
      0.5,
    );
    expect(corners.map((c) => c.corner.name)).toEqual(['ss/1.62V/125C', 'ff/1.98V/-40C']);
    expect(corners[1]!.paths.vdd).toEqual(['corners', 'list', 1, 'vdd']);
  });

  it('refuses a list mixed with axes', () => {
    expect(inputIssues(() => expandCorners(spec({ vdd: [1.8], list: [{ process: 'tt', vdd: 1.8, temperature: 27 }] }), card, 0.5))).toEqual(
      [expect.objectContaining({ code: 'value.invalid', path: ['corners'] })],
    );
  });

  it('names the axis entry of an unknown process corner and lists the known ones', () => {
    expect(message(() => expandCorners(spec({ process: ['tt', 'xx'] }), card, 0.5))).toBe(
      'corners.process[1]: "xx" is not a process corner of card "generic180"; it defines tt, ss, ff, fs, sf',
    );
  });

  it.each(['constructor', 'toString', '__proto__', 'hasOwnProperty'])(
    "finds no process corner %s among the card's inherited members",
    (name) => {
      expect(inputIssues(() => expandCorners(spec({ list: [{ process: name, vdd: 1.8, temperature: 27 }] }), card, 0.5))).toEqual([
        expect.objectContaining({ code: 'reference.unknown', path: ['corners', 'list', 0, 'process'], value: `"${name}"` }),
      ]);
    },
  );

  it('refuses more than 10000 corners before expanding them', () => {
    const axis = (n: number) => Array.from({ length: n }, (_, i) => 1.6 + i / 10_000);
    expect(
      inputIssues(() =>
        expandCorners(spec({ process: ['tt', 'ss'], vdd: axis(1000), temperature: [0, 27, 85, 125, 150, 175] }), card, 0.5),
      ),
    ).toEqual([expect.objectContaining({ code: 'value.too-many', path: ['corners'], value: '"2 x 1000 x 6 x 1 = 12000 corners"' })]);
  });

  it('refuses a corner listed twice', () => {
    expect(
      inputIssues(() =>
        expandCorners(
          spec({
            list: [
              { process: 'tt', vdd: 1.8, temperature: 27 },
              { process: 'tt', vdd: '1.8V', temperature: '27C' },
            ],
          }),
          card,
          0.5,
        ),
      ),
    ).toEqual([expect.objectContaining({ code: 'value.duplicate', path: ['corners'], value: '"tt/1.8V/27C"' })]);
  });

  it('names corners.vdd[i] and the corner where a supply cannot turn a device on', () => {
    // 0.5 V clears the tt thresholds at 27 C (0.45 V) but not at -40 C, where the higher one is the p device's
    // 0.45 V + 1.78 mV/K * 67 K = 0.569 V (n: 0.45 V + 1.56 mV/K * 67 K = 0.555 V): only that corner fails.
    const issues = inputIssues(() => expandCorners(spec({ vdd: [1.8, 0.5], temperature: [27, -40] }), card, 0.5));
    expect(issues).toEqual([expect.objectContaining({ code: 'physics.device-off', path: ['corners', 'vdd', 1] })]);
    const text = message(() => expandCorners(spec({ vdd: [1.8, 0.5], temperature: [27, -40] }), card, 0.5));
    expect(text).toMatch(/^corners\.vdd\[1\]: /);
    expect(text).toContain('tt/0.5V/-40C');
    expect(text).toContain('0.569 V');
    expect(text).not.toContain('tt/0.5V/27C');
  });
});
