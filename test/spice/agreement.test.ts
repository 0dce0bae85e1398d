/**
 * The model against ngspice (Debian package ngspice) on the same invented device models
 * (fixtures/models/generic180.lib): the table model characterized from them must match the
 * simulator's dead times, and the analytic model must rank the corners as the simulator does.
 */
import { describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { sampleRankCorrelation } from 'simple-statistics';
import { cli, design, processCard, ROOT, tempDir } from '../helpers.js';
import { requireTool } from '../tools.js';

requireTool('ngspice', 'ngspice');

interface ConfirmJson {
  verdict: string;
  model: string;
  corners: Array<{
    corner: string;
    quantities: Array<{ quantity: string; kind: string; model: number; simulator: number | null; relativeError: number | null }>;
  }>;
}

const CORNERS = ['ss/1.62V/125C', 'tt/1.8V/27C', 'ff/1.98V/-40C'];

function confirmJson(...args: string[]): { code: number; report: ConfirmJson } {
  const r = cli('confirm', design('doubler'), '--json', '--jobs', '2', ...args);
  expect(r.stderr).toBe('');
  return { code: r.code, report: JSON.parse(r.stdout) as ConfirmJson };
}

function deadTimes(report: ConfirmJson, label: string): { model: number[]; simulator: number[] } {
  const model: number[] = [];
  const simulator: number[] = [];
  for (const c of report.corners) {
    const q = c.quantities.find((x) => x.quantity === label)!;
    expect(q.simulator, `${c.corner} ${label}`).not.toBeNull();
    model.push(q.model);
    simulator.push(q.simulator!);
  }
  return { model, simulator };
}

describe('table model vs ngspice', () => {
  it('dead times of doubler.yaml agree within 10 % at ss/1.62V/125C, tt/1.8V/27C, ff/1.98V/-40C (coarse grid)', () => {
    const tables = join(tempDir(), 'tables.json');
    const made = cli(
      'characterize',
      processCard('generic180'),
      '--corners',
      CORNERS.join(','),
      '--grid',
      'coarse',
      '--jobs',
      '2',
      '-o',
      tables,
    );
    expect(made.code).toBe(0);
    const { code, report } = confirmJson('--tables', tables, '--corners', CORNERS.join(','), '--tolerance', '10%');
    expect(report.model).toBe('table');
    expect(report.corners.map((c) => c.corner)).toEqual(CORNERS);
    for (const c of report.corners) {
      for (const q of c.quantities.filter((x) => x.kind === 'dead')) {
        expect(Math.abs(q.relativeError!), `${c.corner} ${q.quantity}`).toBeLessThanOrEqual(0.1);
      }
    }
    expect(code).toBe(0);
    expect(report.verdict).toBe('agree');
  }, 180_000);
});

describe('shipped tables vs ngspice', () => {
  it('fixtures/tables/generic180.json (fine grid) keeps every dead time of doubler.yaml within 10 % at all 45 corners', () => {
    const { code, report } = confirmJson(
      '--tables',
      join(ROOT, 'fixtures', 'tables', 'generic180.json'),
      '--corners',
      'all',
      '--tolerance',
      '10%',
    );
    expect(report.corners.length).toBe(45);
    for (const c of report.corners) {
      for (const q of c.quantities.filter((x) => x.kind === 'dead'))
        expect(Math.abs(q.relativeError!), `${c.corner} ${q.quantity}`).toBeLessThanOrEqual(0.1);
    }
    expect(code).toBe(0);
  }, 180_000);
});

describe('analytic model vs ngspice', () => {
  it('ranks the 45 corners of doubler.yaml by dead time alike (Spearman >= 0.9) and spans the same slowest/fastest ratio within 20 %', () => {
    const { report } = confirmJson('--model', 'analytic', '--corners', 'all');
    expect(report.corners.length).toBe(45);
    for (const label of ['dead p1->p2', 'dead p2->p1']) {
      const { model, simulator } = deadTimes(report, label);
      expect(sampleRankCorrelation(model, simulator), label).toBeGreaterThanOrEqual(0.9);
      const spread = (xs: number[]) => Math.max(...xs) / Math.min(...xs);
      expect(Math.abs(spread(model) / spread(simulator) - 1), label).toBeLessThanOrEqual(0.2);
    }
  }, 180_000);
});
