import { describe, expect, it } from 'vitest';
import { runMonteCarlo } from '../../src/analysis/montecarlo.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { loadDesign } from '../../src/cli/load.js';
import { mcReport } from '../../src/report/mc-report.js';
import { mcRows, mcShownNote } from '../../src/render/mc-section.js';
import { design } from '../helpers.js';

describe('mcShownNote', () => {
  const { design: d, card } = loadDesign(design('doubler'));
  const resolved = resolveDesign(d, card);
  const report = mcReport(d.name, card.name, runMonteCarlo(resolved, 20, 1), undefined);

  it('says the table shows 8 of the 45 corners, as many rows as the table has', () => {
    expect(mcRows(report)).toHaveLength(8);
    expect(mcShownNote(report)).toBe('The table shows the 8 of 45 corners with the lowest yield (then the least sigma margin); phasegap mc lists every corner.');
  });

  it('says nothing when the table shows every corner', () => {
    expect(mcShownNote({ ...report, corners: report.corners.slice(0, 8) })).toBe('');
    expect(mcShownNote(report, 45)).toBe('');
  });
});
