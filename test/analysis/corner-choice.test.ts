import { describe, expect, it } from 'vitest';
import { chooseCorners, oneCornerName, selectCorner, worstCornerIndex, worstCorners } from '../../src/analysis/corner-choice.js';
import { evaluateAll, limitingCheck } from '../../src/analysis/evaluate.js';
import { InputError } from '../../src/errors.js';
import { loadResolved } from '../../src/cli/load.js';
import { design } from '../helpers.js';

const { resolved } = loadResolved(design('too-tight'), [], {}, () => undefined);
const results = evaluateAll(resolved);
const names = results.map((r) => r.corner.name);

describe('worstCornerIndex and oneCornerName', () => {
  it('name the corner of the limiting check, for --corner worst', () => {
    const limiting = limitingCheck(results)!;
    expect(names[worstCornerIndex(results)]).toBe(limiting.corner);
    expect(oneCornerName(resolved, 'worst')).toBe(limiting.corner);
    expect(oneCornerName(resolved, names[3]!)).toBe(names[3]);
  });
});

describe('selectCorner', () => {
  it('reads worst, a corner name, and all only where the caller allows it', () => {
    expect(selectCorner(results, 'worst', false)).toEqual({ kind: 'corner', index: worstCornerIndex(results) });
    expect(selectCorner(results, names[2]!, false)).toEqual({ kind: 'corner', index: 2 });
    expect(selectCorner(results, 'all', true)).toEqual({ kind: 'all', reference: worstCornerIndex(results) });
    expect(() => selectCorner(results, 'all', false)).toThrow(InputError);
  });
});

describe('worstCorners', () => {
  it('takes the least and the most of each dead time and the limiting corner, in design order', () => {
    // too-tight: both dead times are least at ff/1.98V/-40C and most at ss/1.62V/125C; the limiting
    // check (a break-before-make pair behind the level shifter, less its switch-instant error band,
    // which grows with the handover's path) is at sf/1.98V/125C (this model, measured: -65.5 ps;
    // ff/1.98V/125C -53.4 ps).
    expect(worstCorners(resolved).map((c) => c.name)).toEqual(['ss/1.62V/125C', 'ff/1.98V/-40C', 'sf/1.98V/125C']);
    expect(names[worstCornerIndex(results)]).toBe('sf/1.98V/125C');
    for (const i of [0, 1]) {
      const t50 = (name: string) => {
        const m = results[names.indexOf(name)]!.measurement;
        return m.ok ? m.deadTimes[i]!.t50 : NaN;
      };
      for (const r of results) {
        if (!r.measurement.ok) continue;
        expect(r.measurement.deadTimes[i]!.t50).toBeGreaterThanOrEqual(t50('ff/1.98V/-40C'));
        expect(r.measurement.deadTimes[i]!.t50).toBeLessThanOrEqual(t50('ss/1.62V/125C'));
      }
    }
  });
});

describe('chooseCorners', () => {
  it('reads all, worst and a list of names, and refuses an unknown name with the field', () => {
    expect(chooseCorners(resolved, 'all')).toHaveLength(names.length);
    expect(chooseCorners(resolved, 'worst').map((c) => c.name)).toEqual(worstCorners(resolved).map((c) => c.name));
    expect(chooseCorners(resolved, `${names[1]}, ${names[0]}`).map((c) => c.name)).toEqual([names[1], names[0]]);
    try {
      chooseCorners(resolved, 'xx/1V/0C', '--corner');
      expect.unreachable();
    } catch (error) {
      expect(error).toBeInstanceOf(InputError);
      expect((error as InputError).issues[0]).toMatchObject({ code: 'reference.unknown', path: ['--corner'], value: '"xx/1V/0C"' });
    }
  });
});
