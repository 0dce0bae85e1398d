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
 *   tt/1.8V/27C     139.2    159.0    101.4   (the check passes)
 *   tt/1.98V/125C    46.3     38.5     -2.2   (both pass; the band fails it)
 *   ff/1.62V/125C    -6.8     42.8    -56.1
 *   ff/1.8V/125C     -8.6      4.7    -53.4
 *   ff/1.98V/125C    -9.0    -24.3    -50.2   (the model alone is 15 ps above ngspice)
 *   fs/1.98V/125C    88.2    104.4     34.3   (the check passes)
 *   sf/1.62V/125C    -1.4     12.7    -56.6
 *   sf/1.8V/125C     -6.8    -25.1    -56.8
 *   sf/1.98V/125C    -9.1    -53.7    -54.9   (45 ps above; the band takes it 1.2 ps below)
 * Over all 45 corners ngspice fails 3 and the check 7, every one of ngspice's among them; the
 * model alone fails 3 where ngspice passes (ff/1.62V/125C, ff/1.8V/125C, sf/1.62V/125C: the
 * shifter's delay read 20-35 ps slow in the circuit, its standalone delay there within 3 %) and
 * passes none where it fails. (With the shifter's edges on the nominal-corner sizing fits and the
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
    // The model alone passes none of them: with the shifter output's top tail it no longer reads the
    // high-side switch off early.
    for (const { name, simulated } of rows) if (simulated.simulator! < 0) expect(simulated.model, name).toBeLessThan(0);
  });

  it('needs the band: at sf/1.98V/125C the handover alone (-9.1 ps) is above ngspice’s (-53.7 ps), the check’s margin below it', () => {
    const { simulated, check } = rows.find((r) => r.name === 'sf/1.98V/125C')!;
    expect(simulated.model).toBeGreaterThan(simulated.simulator!);
    const raw = Math.min(...check.parts!.map((p) => p.span!)) - GUARD;
    // The check's handover before the band is confirm's model margin (the deck's instants are the evaluator's).
    expect(Math.abs(raw - simulated.model)).toBeLessThan(1e-13);
    expect(check.margin!).toBeLessThan(simulated.simulator!);
    expect(check.pass).toBe(false);
    expect(instantBand('analytic', 'generic180')).toBe(0.036);
    // At tt/1.98V/125C the handover alone clears its guard (+46.3 ps, ngspice +38.5 ps) by less than the band:
    // the check fails there and says why.
    const near = rows.find((r) => r.name === 'tt/1.98V/125C')!;
    expect(near.simulated.model).toBeGreaterThan(0);
    expect(near.check.pass).toBe(false);
    expect(near.check.detail).toContain("model's measured switch-instant error");
  });
});
