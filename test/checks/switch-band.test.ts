/**
 * Break-before-make against ngspice (Debian package ngspice, fixtures/models/generic180.lib) on
 * too-tight.yaml, whose level-shifted switch decides the verdict: at the corners where the model's
 * handover and ngspice's disagree, where ngspice fails or the model alone is above it, plus tt.
 * The check takes the model's measured switch-instant error off each handover (src/switches/instant-band.ts), so it never passes where
 * ngspice fails, and its margin is never above ngspice's.
 *
 * Measured on the current model (ngspice 39, time step at most 10 ps, ps; model = handover before
 * the error band, check = the check's margin with it; test/bench/instant-band.bench.ts has all 45
 * corners). The deck's level shifter is sized from the card and the shifter fits, so ngspice's
 * numbers move with them:
 *   corner          model   ngspice   check
 *   tt/1.8V/27C     149.7    159.0     97.8   (the check passes)
 *   tt/1.98V/125C    61.0     38.5     -5.7   (both pass; the band fails it)
 *   ff/1.62V/125C     7.6     42.8    -60.2
 *   ff/1.8V/125C      4.7      4.7    -56.8
 *   ff/1.98V/125C     3.5    -24.3    -53.1   (the model alone is 28 ps above ngspice)
 *   fs/1.98V/125C   101.3    104.4     27.1   (the check passes)
 *   sf/1.62V/125C    18.3     12.7    -57.4
 *   sf/1.8V/125C     11.5    -25.1    -57.1   (37 ps above)
 *   sf/1.98V/125C     7.9    -53.7    -54.9   (62 ps above; the band takes it 1.2 ps below)
 * Over all 45 corners ngspice fails 3 and the check 7, every one of ngspice's among them. The
 * model alone fails none: its verdict is ngspice's at 42 corners and passes the 3 ngspice fails
 * (its shifter now driven by the phase net's central slope; what is left there is the shifter's
 * rise 22-27 ps fast at sf/1.8-1.98V/125C, its edge's 88 % point 20 ps early and the generator's
 * p2 edge 15 ps early against p1's), so the band is what fails them. (With the net's full-swing
 * transition as the shifter's input, its tail read as a slow input, the model alone failed the 3
 * and 3 more where ngspice passes, ff/1.62V, ff/1.8V and sf/1.62V at 125 C, -6.8, -8.6 and
 * -1.4 ps, and the band was 3.6 %. With the shifter's edges on the nominal-corner sizing fits and the
 * latch fight against the p device's saturation current, the band was 7.3 % and the check failed
 * 16; with the shifter output a linear ramp and the shifter fits from an older simulator, on the
 * shifter those fits sized, ngspice failed 10 and the check 26; the model alone passed
 * fs/1.98V/125C at +29.5 ps where ngspice failed at -10.9 ps, the high-side switch's turn-off read
 * 71 ps early on the output's top tail.)
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
  'tt/1.98V/125C',
  'ff/1.62V/125C',
  'ff/1.8V/125C',
  'ff/1.98V/125C',
  'fs/1.98V/125C',
  'sf/1.62V/125C',
  'sf/1.8V/125C',
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
    // ngspice fails at three of them: ff/1.98V/125C, sf/1.8V/125C and sf/1.98V/125C.
    expect(rows.filter((r) => r.simulated.simulator! < 0).map((r) => r.name)).toEqual(['ff/1.98V/125C', 'sf/1.8V/125C', 'sf/1.98V/125C']);
    // The model alone passes all three (+3.5, +11.5, +7.9 ps): only the band fails them.
    for (const { name, simulated } of rows) if (simulated.simulator! < 0) expect(simulated.model, name).toBeGreaterThan(0);
    // Where ngspice passes, so does the model alone.
    for (const { name, simulated } of rows) if (simulated.simulator! > 0) expect(simulated.model, name).toBeGreaterThan(0);
  });

  it('needs the band: at sf/1.98V/125C the handover alone (+7.9 ps) is above ngspice’s (-53.7 ps), the check’s margin below it', () => {
    const { simulated, check } = rows.find((r) => r.name === 'sf/1.98V/125C')!;
    expect(simulated.model).toBeGreaterThan(simulated.simulator!);
    const raw = Math.min(...check.parts!.map((p) => p.span!)) - GUARD;
    // The check's handover before the band is confirm's model margin (the deck's instants are the evaluator's).
    expect(Math.abs(raw - simulated.model)).toBeLessThan(1e-13);
    expect(check.margin!).toBeLessThan(simulated.simulator!);
    expect(check.pass).toBe(false);
    expect(instantBand('analytic', 'generic180')).toBe(0.05);
    // At tt/1.98V/125C the handover alone clears its guard (+61.0 ps, ngspice +38.5 ps) by less than the band:
    // the check fails there and says why.
    const near = rows.find((r) => r.name === 'tt/1.98V/125C')!;
    expect(near.simulated.model).toBeGreaterThan(0);
    expect(near.check.pass).toBe(false);
    expect(near.check.detail).toContain("model's measured switch-instant error");
  });
});
