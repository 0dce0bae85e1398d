import { describe, it, expect } from 'vitest';
import { evaluateAll } from '../../src/analysis/evaluate.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { parseAxis, summarizePoint, sweepColumns } from '../../src/analysis/sweep.js';
import { loadDesign } from '../../src/cli/load.js';
import { csvColumnsJson, csvHeader, csvRow } from '../../src/report/sweep-format.js';
import { design } from '../helpers.js';

/** As a sweep grid point is evaluated (src/cli/sweep-points.ts): only the circuit figures a requirement checks. */
const POINT = { borrowScratch: false, warmStart: false, circuit: 'checked-figures' } as const;

function row(name: string) {
  const { design: d, card } = loadDesign(design(name), ['corners.process=[tt]', 'corners.vdd=[1.8V]', 'corners.temperature=[27]']);
  const resolved = resolveDesign(d, card);
  return { r: summarizePoint(0, [20e6], evaluateAll(resolved, POINT)), columns: sweepColumns(resolved) };
}

describe('csvHeader and csvRow', () => {
  const axes = [parseAxis('clock.frequency=20MHz')];

  it('put a timing limit under limiting_margin_s and names each check column with its unit', () => {
    const { r, columns } = row('doubler');
    const header = csvHeader(axes, columns).trim().split(',');
    const cells = csvRow(r, columns).trim().split(',');
    const at = (col: string) => cells[header.indexOf(col)];
    // At tt/1.8V/27C the dead-time minimum is the closest (+1.33 ns); the handovers, less the
    // switch-instant band (7.6 % of their path), keep more.
    expect(r.limiting?.kind).toBe('dead-time-min');
    expect(Number(at('limiting_margin_s'))).toBeCloseTo(r.limiting!.margin!, 15);
    expect(at('limiting_margin_V')).toBe('');
    expect(header).toContain('margin_V.s_chg_holds_off');
    expect(header).toContain('margin_s.dead_p1_p2_min');
    expect(header).toContain('margin_s.dead_p1_p2_max');
    expect(header).toContain('dead_p1_p2_min_s');
    for (const key of header) expect(key).toMatch(/^[a-z][a-z0-9_]*(?:\.[a-z0-9_]+)?$|^limiting_margin_V$|^margin_V\.[a-z0-9_]+$/);
    expect(new Set(header).size).toBe(header.length);
  });

  it('put a failing switch bias check under limiting_margin_V', () => {
    const { r, columns } = row('doubler-unboosted');
    const header = csvHeader(axes, columns).trim().split(',');
    const cells = csvRow(r, columns).trim().split(',');
    expect(r.limiting?.kind).toBe('stress');
    expect(cells[header.indexOf('limiting_margin_s')]).toBe('');
    // Junction forward bias at tt/1.8V: the top plate at 2 VDD = 3.6 V over a 1.8 V body.
    expect(Number(cells[header.indexOf('limiting_margin_V')])).toBeCloseTo(-1.8, 12);
  });
});

describe('csvHeader and csvRow with a circuit', () => {
  const axes = [parseAxis('clock.frequency=20MHz')];

  it('give efficiency and lost charge their own columns and units, and keep the other keys', () => {
    const { r, columns } = row('doubler-pump');
    const header = csvHeader(axes, columns).trim().split(',');
    const cells = csvRow(r, columns).trim().split(',');
    const at = (col: string) => cells[header.indexOf(col)];
    expect(header.slice(5, 9)).toEqual(['limiting_margin_s', 'limiting_margin_V', 'limiting_margin_C', 'limiting_margin_frac']);
    expect(header).toContain('margin_V.v_out_min');
    expect(header).toContain('margin_V.v_out_max');
    expect(header).toContain('margin_V.ripple_out_max');
    expect(header).toContain('margin_s.dead_p1_p2_min');
    const check = (kind: string) => r.checks.find((c) => c.kind === kind)!;
    expect(Number(at('margin_frac.efficiency_min'))).toBeCloseTo(check('efficiency-min').margin!, 9);
    expect(Number(at('margin_C.lost_charge_max'))).toBeCloseTo(check('lost-charge-max').margin!, 20);
    expect(check('lost-charge-max').margin!).toBeGreaterThan(0.9e-12);
    expect(check('lost-charge-max').margin!).toBeLessThanOrEqual(1e-12);
    const sidecar = JSON.parse(csvColumnsJson(axes, columns)) as { columns: Array<{ key: string; unit: string | null }> };
    const unitOf = (key: string) => sidecar.columns.find((c) => c.key === key)?.unit;
    expect(unitOf('margin_frac.efficiency_min')).toBe('fraction');
    expect(unitOf('margin_C.lost_charge_max')).toBe('C');
    expect(unitOf('margin_V.ripple_out_max')).toBe('V');
    expect(unitOf('limiting_margin_C')).toBe('C');
  });

  it('put a failing efficiency limit under limiting_margin_frac and nowhere else', () => {
    const { design: d, card } = loadDesign(design('doubler-pump'), [
      'corners.process=[tt]',
      'corners.vdd=[1.8V]',
      'corners.temperature=[27]',
      'circuit.requirements.efficiency.min=0.99',
    ]);
    const resolved = resolveDesign(d, card);
    const r = summarizePoint(0, [20e6], evaluateAll(resolved, POINT));
    const columns = sweepColumns(resolved);
    const header = csvHeader(axes, columns).trim().split(',');
    const cells = csvRow(r, columns).trim().split(',');
    expect(r.limiting?.kind).toBe('efficiency-min');
    expect(cells[header.indexOf('limiting_margin_s')]).toBe('');
    expect(cells[header.indexOf('limiting_margin_V')]).toBe('');
    expect(cells[header.indexOf('limiting_margin_C')]).toBe('');
    // The efficiency at tt/1.8V/27C is 41.9 %, which the check reads over 1.027 (the model's measured
    // efficiency error, figure-error.ts) as 40.8 %, so 40.8 % - 99 % = -58.2 %.
    expect(Number(cells[header.indexOf('limiting_margin_frac')])).toBeCloseTo(-0.582, 3);
  });

  it('keep the header of a design without a circuit unchanged', () => {
    const { columns } = row('doubler');
    expect(csvHeader(axes, columns)).not.toMatch(/limiting_margin_C|limiting_margin_frac|margin_C\.|margin_frac\./);
  });
});

describe('csvRow with names a spreadsheet would run', () => {
  it('puts an apostrophe before a text cell that starts with =, +, - or @, and leaves negative numbers alone', () => {
    const columns = { deadTimes: [], widths: [], checks: ['=HYPERLINK("x")'], voltChecks: [], chargeChecks: [], fractionChecks: [] };
    const row = {
      index: 0,
      point: ['@SUM(A1)'],
      corners: 1,
      verdict: 'fail' as const,
      limiting: { corner: '+tt', check: '=HYPERLINK("x")', kind: 'order' as const, margin: -2e-12 },
      deadTimes: [],
      widths: [],
      checks: [{ name: '=HYPERLINK("x")', kind: 'order', margin: -2e-12 }],
    };
    expect(csvHeader([{ path: '-x', values: [1] }], columns)).toBe(
      `'-x,corners,verdict,limiting_corner,limiting_check,limiting_margin_s,limiting_margin_V,margin_s.hyperlink_x\n`,
    );
    expect(csvRow(row as never, columns)).toBe(`'@SUM(A1),1,fail,'+tt,"'=HYPERLINK(""x"")",-2e-12,,-2e-12\n`);
  });
});

describe('csvColumnsJson', () => {
  it('lists every header key in order with its label and unit', () => {
    const { columns } = row('doubler');
    const axes = [parseAxis('clock.frequency=20MHz')];
    const sidecar = JSON.parse(csvColumnsJson(axes, columns)) as {
      format: string;
      columns: Array<{ key: string; label: string; unit: string | null }>;
    };
    expect(sidecar.format).toBe('phasegap-sweep-columns/1');
    expect(sidecar.columns.map((c) => c.key)).toEqual(csvHeader(axes, columns).trim().split(','));
    const dead = sidecar.columns.find((c) => c.key === 'margin_s.dead_p1_p2_min')!;
    expect(dead).toEqual({ key: 'margin_s.dead_p1_p2_min', label: 'least margin over the corners: dead p1->p2 >= 500 ps', unit: 's' });
    expect(sidecar.columns.find((c) => c.key === 'margin_V.s_chg_holds_off')!.unit).toBe('V');
  });
});
