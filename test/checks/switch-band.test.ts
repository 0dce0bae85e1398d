/**
 * Break-before-make against ngspice (Debian package ngspice, fixtures/models/generic180.lib) on
 * too-tight.yaml, whose level-shifted switch decides the verdict: at the corners where the model's
 * handover and ngspice's disagree, where ngspice fails or the model alone is above it, plus tt.
 * The check takes the model's measured switch-instant error off each handover (src/switches/instant-band.ts), so it never passes where
 * ngspice fails, and its margin is never above ngspice's.
 *
 * Measured on the current model (ngspice 39, time step at most 10 ps, ps; model = handover before
 * the error band, check = the check's margin with it; test/bench/instant-band.bench.ts has all 45
 * corners). The deck's level shifter is sized from the card, so ngspice's numbers move with the card:
 *   corner          model   ngspice   check
 *   tt/1.8V/27C      74.9    106.6      0.0   (the check passes by 0.02 ps)
 *   tt/1.8V/125C     -8.4    -22.0   -112.4   (the model alone is 14 ps above ngspice)
 *   tt/1.98V/125C   -13.0    -66.3   -108.0   (53 ps above)
 *   ss/1.98V/125C    43.1     10.4    -72.9   (33 ps above)
 *   ff/1.62V/125C   -58.3    -55.9   -154.2
 *   ff/1.8V/125C    -53.8    -95.6   -140.9   (42 ps above)
 *   ff/1.98V/27C      9.1      3.9    -47.1   (5 ps above)
 *   ff/1.98V/125C   -50.2   -125.6   -130.2   (75 ps above)
 *   fs/1.98V/125C    25.4    -10.9    -79.8   (36 ps above: the model alone passes, ngspice fails)
 *   sf/1.62V/125C  -101.3    -81.9   -210.7
 *   sf/1.8V/125C    -93.2   -121.5   -192.1   (28 ps above)
 *   sf/1.98V/27C    -17.3     -6.6    -81.9
 *   sf/1.98V/125C   -86.3   -152.4   -176.9   (66 ps above)
 * Over all 45 corners ngspice fails 10 and the check 27, every one of ngspice's among them; the
 * model alone fails two where ngspice passes (tt/1.62V/125C, sf/1.8V/27C) and passes one where it
 * fails (fs/1.98V/125C). (Before the card stated its devices' saturation voltage the model gave
 * 76.0 ps at tt/1.8V/27C and -99.2 ps at sf/1.98V/125C, and the check failed 28. The ngspice
 * column is as measured then: re-run now it comes within 0.11 ps of it, the shifter sizes having
 * moved by about 0.02 % with the fits' rescaled coefficients.)
 */
import { describe, expect, it } from 'vitest';
import { evaluateCorner } from '../../src/analysis/evaluate.js';
import { loadDesign, loadModel } from '../../src/cli/load.js';
import { resolveDesign } from '../../src/analysis/resolve.js';
import { instantBand } from '../../src/switches/instant-band.js';
import { cli, design } from '../helpers.js';
import { requireTool } from '../tools.js';

requireTool('ngspice', 'ngspice');

const CORNERS = [
  'tt/1.8V/27C',
  'tt/1.8V/125C',
  'tt/1.98V/125C',
  'ss/1.98V/125C',
  'ff/1.62V/125C',
  'ff/1.8V/125C',
  'ff/1.98V/27C',
  'ff/1.98V/125C',
  'fs/1.98V/125C',
  'sf/1.62V/125C',
  'sf/1.8V/125C',
  'sf/1.98V/27C',
  'sf/1.98V/125C',
];
const GUARD = 50e-12;

interface ConfirmJson {
  corners: Array<{ corner: string; breakBeforeMake: Array<{ check: string; model: number; simulator: number | null }> }>;
}

describe('break-before-make with the switch-instant error band, against ngspice on too-tight.yaml', () => {
  const run = cli('confirm', design('too-tight'), '--json', '--jobs', '2', '--corners', CORNERS.join(','));
  const report = JSON.parse(run.stdout) as ConfirmJson;
  const loaded = loadDesign(design('too-tight'));
  const resolved = resolveDesign(
    loaded.design,
    loaded.card,
    loadModel(loaded.card, loaded.cardDir, {}, () => {}),
  );
  const byName = new Map(resolved.corners.map(({ corner }) => [corner.name, corner]));
  const rows = CORNERS.map((name) => {
    const simulated = report.corners.find((c) => c.corner === name)!.breakBeforeMake[0]!;
    const check = evaluateCorner(resolved, byName.get(name)!).checks.find((c) => c.kind === 'break-before-make')!;
    return { name, simulated, check };
  });

  it('never passes where ngspice fails, and its margin is at most ngspice’s at every chosen corner', () => {
    expect(run.stderr).toBe('');
    for (const { name, simulated, check } of rows) {
      expect(simulated.simulator, name).not.toBeNull();
      if (simulated.simulator! < 0) expect(check.pass, name).toBe(false);
      expect(check.margin!, name).toBeLessThanOrEqual(simulated.simulator!);
    }
    // ngspice fails at ten of them, all but tt/1.8V/27C, ss/1.98V/125C and ff/1.98V/27C (+3.9 ps): the
    // ff and sf corners at 125 C, sf at 1.98 V and 27 C, tt at 125 C and the upper supplies, fs/1.98V/125C.
    const passing = ['tt/1.8V/27C', 'ss/1.98V/125C', 'ff/1.98V/27C'];
    expect(rows.filter((r) => r.simulated.simulator! < 0).map((r) => r.name)).toEqual(CORNERS.filter((name) => !passing.includes(name)));
  });

  it('needs the band: at sf/1.98V/125C the handover alone (-86.3 ps) is above ngspice’s (-152.4 ps), the check’s margin below it', () => {
    const { simulated, check } = rows.find((r) => r.name === 'sf/1.98V/125C')!;
    expect(simulated.model).toBeGreaterThan(simulated.simulator!);
    const raw = Math.min(...check.parts!.map((p) => p.span!)) - GUARD;
    // The check's handover before the band is confirm's model margin (the deck's instants are the evaluator's).
    expect(Math.abs(raw - simulated.model)).toBeLessThan(1e-13);
    expect(check.margin!).toBeLessThan(simulated.simulator!);
    expect(check.pass).toBe(false);
    expect(instantBand('analytic', 'generic180')).toBe(0.067);
    // At ss/1.98V/125C the handover alone clears its guard (+43.1 ps, ngspice +10.4 ps) by less than the band:
    // the check fails there and says why.
    const near = rows.find((r) => r.name === 'ss/1.98V/125C')!;
    expect(near.simulated.model).toBeGreaterThan(0);
    expect(near.check.pass).toBe(false);
    expect(near.check.detail).toContain("model's measured switch-instant error");
    // At fs/1.98V/125C the handover alone would pass (+25.4 ps) where ngspice fails (-10.9 ps): the band fails it.
    const wrong = rows.find((r) => r.name === 'fs/1.98V/125C')!;
    expect(wrong.simulated.model).toBeGreaterThan(0);
    expect(wrong.simulated.simulator!).toBeLessThan(0);
    expect(wrong.check.pass).toBe(false);
  });
});
