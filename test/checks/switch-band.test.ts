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
 *   tt/1.8V/27C      79.3    106.6      1.7   (the check passes by 1.7 ps)
 *   tt/1.8V/125C     -2.4    -21.9   -109.8   (the model alone is 20 ps above ngspice)
 *   tt/1.98V/125C    -7.7    -66.2   -105.9   (59 ps above)
 *   ss/1.98V/125C    50.4     10.5    -69.6   (40 ps above)
 *   ff/1.62V/125C   -53.3    -55.8   -152.5
 *   ff/1.8V/125C    -49.3    -95.6   -139.3   (46 ps above)
 *   ff/1.98V/27C     12.8      3.9    -45.3   (9 ps above)
 *   ff/1.98V/125C   -46.1   -126.0   -128.7   (80 ps above)
 *   fs/1.98V/125C    29.5    -10.9    -79.0   (40 ps above: the model alone passes, ngspice fails)
 *   sf/1.62V/125C   -91.0    -81.8   -204.4
 *   sf/1.8V/125C    -84.0   -121.0   -186.5   (37 ps above)
 *   sf/1.98V/27C    -11.0     -6.6    -77.9
 *   sf/1.98V/125C   -78.1   -152.4   -171.9   (74 ps above)
 * Over all 45 corners ngspice fails 10 and the check 26, every one of ngspice's among them; the
 * model alone fails one where ngspice passes (sf/1.8V/27C) and passes one where it fails
 * (fs/1.98V/125C). (Before the drive law's bend below full drive and the drains' Miller overlap the
 * model gave 74.9 ps at tt/1.8V/27C and -86.3 ps at sf/1.98V/125C, and the check failed 27; before
 * the card stated its devices' saturation voltage, 76.0 and -99.2 ps, and it failed 28. The ngspice
 * column is as measured with the fits' rescaled coefficients, which keep the shifter sizes.)
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

  it('needs the band: at sf/1.98V/125C the handover alone (-78.1 ps) is above ngspice’s (-152.4 ps), the check’s margin below it', () => {
    const { simulated, check } = rows.find((r) => r.name === 'sf/1.98V/125C')!;
    expect(simulated.model).toBeGreaterThan(simulated.simulator!);
    const raw = Math.min(...check.parts!.map((p) => p.span!)) - GUARD;
    // The check's handover before the band is confirm's model margin (the deck's instants are the evaluator's).
    expect(Math.abs(raw - simulated.model)).toBeLessThan(1e-13);
    expect(check.margin!).toBeLessThan(simulated.simulator!);
    expect(check.pass).toBe(false);
    expect(instantBand('analytic', 'generic180')).toBe(0.07);
    // At ss/1.98V/125C the handover alone clears its guard (+50.4 ps, ngspice +10.5 ps) by less than the band:
    // the check fails there and says why.
    const near = rows.find((r) => r.name === 'ss/1.98V/125C')!;
    expect(near.simulated.model).toBeGreaterThan(0);
    expect(near.check.pass).toBe(false);
    expect(near.check.detail).toContain("model's measured switch-instant error");
    // At fs/1.98V/125C the handover alone would pass (+29.5 ps) where ngspice fails (-10.9 ps): the band fails it.
    const wrong = rows.find((r) => r.name === 'fs/1.98V/125C')!;
    expect(wrong.simulated.model).toBeGreaterThan(0);
    expect(wrong.simulated.simulator!).toBeLessThan(0);
    expect(wrong.check.pass).toBe(false);
  });
});
