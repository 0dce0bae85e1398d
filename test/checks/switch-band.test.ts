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
 *   tt/1.8V/27C     152.2    159.0    120.1   (the check passes)
 *   tt/1.98V/125C    39.0     38.5     -3.1   (both pass; the band fails it)
 *   ff/1.62V/125C    31.2     42.8    -10.1
 *   ff/1.8V/125C      2.8      4.7    -35.4
 *   ff/1.98V/125C   -17.7    -24.3    -53.4   (the model alone is 7 ps above ngspice)
 *   fs/1.98V/125C    86.7    104.4     40.2   (the check passes)
 *   sf/1.62V/125C    26.9     12.7    -19.7
 *   sf/1.8V/125C     -3.9    -25.1    -46.8   (21 ps above)
 *   sf/1.98V/125C   -25.5    -53.7    -65.5   (28 ps above; the band takes it 12 ps below)
 * Over all 45 corners ngspice fails 3 and the check 7, every one of ngspice's among them. The
 * model alone fails ngspice's 3 and no other: its verdict is ngspice's at all 45 corners (the
 * shifter's edges take its first stages' switching points against the input ramp and its output
 * stage's swing, shifter-edges.ts). Before those, the model alone passed the 3 ngspice fails
 * (+3.5, +11.5, +7.9 ps: the shifter's rise 22-27 ps fast at sf/1.8-1.98V/125C, its edge's 88 %
 * point 20 ps early) and the band, 5.0 %, was what failed them. (With the net's full-swing
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
    // The model alone fails all three too (-17.7, -3.9, -25.5 ps).
    for (const { name, simulated } of rows) if (simulated.simulator! < 0) expect(simulated.model, name).toBeLessThan(0);
    // Where ngspice passes, so does the model alone.
    for (const { name, simulated } of rows) if (simulated.simulator! > 0) expect(simulated.model, name).toBeGreaterThan(0);
  });

  it('needs the band: at sf/1.98V/125C the handover alone (-25.5 ps) is above ngspice’s (-53.7 ps), the check’s margin (-65.5 ps) below it', () => {
    const { simulated, check } = rows.find((r) => r.name === 'sf/1.98V/125C')!;
    expect(simulated.model).toBeGreaterThan(simulated.simulator!);
    const raw = Math.min(...check.parts!.map((p) => p.span!)) - GUARD;
    // The check's handover before the band is confirm's model margin (the deck's instants are the evaluator's).
    expect(Math.abs(raw - simulated.model)).toBeLessThan(1e-13);
    expect(check.margin!).toBeLessThan(simulated.simulator!);
    expect(check.pass).toBe(false);
    expect(instantBand('analytic', 'generic180')).toBe(0.031);
    // At tt/1.98V/125C the handover alone clears its guard (+39.0 ps, ngspice +38.5 ps) by less than the band:
    // the check fails there and says why.
    const near = rows.find((r) => r.name === 'tt/1.98V/125C')!;
    expect(near.simulated.model).toBeGreaterThan(0);
    expect(near.check.pass).toBe(false);
    expect(near.check.detail).toContain("model's measured switch-instant error");
  });
});
