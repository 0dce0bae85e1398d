import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { evaluateCorner } from '../../src/analysis/evaluate.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { HANDOVER_KINDS } from '../../src/checks/check.js';
import { loadDesign, loadModel } from '../../src/cli/load.js';
import { errorBandText } from '../../src/delay/error-band.js';
import { hasHandovers, modelErrorText } from '../../src/report/model-error.js';
import { ROOT } from '../helpers.js';

describe('modelErrorText', () => {
  it('is the dead-time and gap line alone for a design without handovers', () => {
    expect(modelErrorText('analytic', 'generic180', false)).toBe(errorBandText('analytic', 'generic180'));
  });

  it("adds the switch-instant band the handover checks take off, before the line's closing words", () => {
    // src/switches/instant-band.ts: analytic on generic180 measured to +3.03 %, stated +3.1 %.
    const text = modelErrorText('analytic', 'generic180', true);
    expect(text).toContain(
      "; the handover checks take its measured switch-instant error, 3.1 % of each handover's path, off the model's handover; read small margins against it",
    );
    expect(text.startsWith(errorBandText('analytic', 'generic180').replace(/; read small margins against it$/, ''))).toBe(true);
  });

  it('says a model never measured on the card takes the worst measured', () => {
    expect(modelErrorText('table', 'generic180', true)).toContain(
      "its switch-instant error is not measured: the handover checks take the worst measured, 3.1 % of each handover's path",
    );
  });
});

describe('hasHandovers', () => {
  // check-text knows only the report's check kinds, the other reports the resolved design's
  // subjects: on every shipped design the two must say the same.
  const dir = join(ROOT, 'fixtures', 'designs');
  for (const file of readdirSync(dir).filter((f) => f.endsWith('.yaml'))) {
    it(`agrees with the check kinds a corner reports on ${file}`, () => {
      const loaded = loadDesign(join(dir, file));
      const resolved = resolveDesign(
        loaded.design,
        loaded.card,
        loadModel(loaded.card, loaded.cardDir, {}, () => {}),
      );
      const checks = evaluateCorner(resolved, resolved.corners[0]!.corner).checks;
      expect(checks.some((c) => HANDOVER_KINDS.has(c.kind))).toBe(hasHandovers(resolved));
    });
  }
});
