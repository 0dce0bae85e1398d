import { describe, expect, it } from 'vitest';
import { runMonteCarlo } from '../../src/analysis/montecarlo.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { loadDesign } from '../../src/cli/load.js';
import { mcReport, renderMcText } from '../../src/report/mc-report.js';
import { mcHeadline, mcRows, mcShownNote } from '../../src/render/mc-section.js';
import { design } from '../helpers.js';

describe('mcShownNote', () => {
  const { design: d, card } = loadDesign(design('doubler'));
  const resolved = resolveDesign(d, card);
  const report = mcReport(d.name, card.name, runMonteCarlo(resolved, 20, 1), undefined);

  it('says the table shows 8 of the 45 corners, as many rows as the table has', () => {
    expect(mcRows(report)).toHaveLength(8);
    expect(mcShownNote(report)).toBe(
      'The table shows the 8 of 45 corners with the lowest yield (then the least sigma margin); phasegap mc lists every corner.',
    );
  });

  it('says nothing when the table shows every corner', () => {
    expect(mcShownNote({ ...report, corners: report.corners.slice(0, 8) })).toBe('');
    expect(mcShownNote(report, 45)).toBe('');
  });
});

describe('mcHeadline and mcRows', () => {
  const { design: d, card } = loadDesign(design('doubler'), ['corners.process=[tt]', 'corners.vdd=[1.8V]', 'corners.temperature=[27]']);
  const report = mcReport(d.name, card.name, runMonteCarlo(resolveDesign(d, card), 20, 1), undefined);

  it("print percentages with the precision of phasegap mc's text", () => {
    // 20 of 20 dies pass: yield 100 %, Wilson 95 % interval 83.9 % .. 100 % (z = 1.96, common practice).
    expect(report.yield.value).toBe(1);
    expect(mcHeadline(report)).toContain('yield at every corner 100.0 % (95 % Wilson interval 83.9 % .. 100.0 %)');
    expect(mcRows(report)[0]!.slice(0, 3)).toEqual(['tt/1.8V/27C', '100.0 %', '83.9 % .. 100.0 %']);
    expect(renderMcText(report)).toContain('83.9 % .. 100.0 %');
  });
});
