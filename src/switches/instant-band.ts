/**
 * How far the model's break-before-make handovers have been measured from ngspice, so a handover
 * closer than the model can tell is not called a pass. A handover from switch a turning off to b
 * turning on is the time between their gate nets' 50 % edges plus each instant's lag behind its
 * net's edge (ramp to the device's turn-on level, level shifter); the model's error on it is
 * stated as a fraction of that path, |edge to edge| + |lag a| + |lag b|, since each piece is a
 * modelled time whose error grows with it.
 *
 * Source: test/bench/instant-band.bench.ts, the `confirm` decks of every shipped design with
 * break-before-make constraints at all 45 corners, ngspice 39 on the cards' model files, each
 * handover in both directions as (model - ngspice) / path; each end rounded outward to 0.1 %, so
 * a band is never narrower than what was measured (test/checks/switch-band.test.ts checks the
 * check against ngspice on too-tight.yaml's deciding corners).
 */
export interface InstantBand {
  readonly model: string;
  readonly card: string;
  /** Handovers compared. */
  readonly count: number;
  /** Signed error as a fraction of the handover's path, (model - ngspice) / path: most conservative, most optimistic. */
  readonly low: number;
  readonly high: number;
}

export const INSTANT_BANDS: readonly InstantBand[] = [
  // dickson-pump, doubler, doubler-diode-pump, doubler-pump, doubler-unboosted, doubler-unboosted-pump,
  // negative-pump, sc-integrator, sc-integrator-path, too-tight: 1620 handovers, -4.01 % .. +3.03 %,
  // median -0.7 %, with the latch shifters' edges taking their first stages' switching points
  // against the input ramp and the output stage's swing (shifter-edges.ts): conservative at
  // too-tight's s_low->s_high, ss/1.62V/-40C (1008.8 ps against 1053.6), optimistic at
  // negative-pump's s_neg->s_gnd, ff/1.98V/125C (1540.7 ps against 1469.9); too-tight's
  // level-shifted handovers within -4.0 % .. +2.2 %, its raw break-before-make verdict ngspice's at
  // all 45 corners. Before those two terms: -4.47 % .. +4.91 %,
  // median -0.7 %, with the latch shifters driven by their gate nets' central slope
  // (centralTransitions: the 20-80 % crossings over 0.6), their edges fitted to ngspice-39 at every
  // corner (shifter-sizing.ts's `edges`: the latch fight as the pull-down against the p device's
  // triode current, fightTime), the output edge's shape (shifter-shape.ts), the switches'
  // thresholds on SPICE level 3's own temperature law (spice-temperature.ts) and each driving edge
  // from its driver's own devices. Both ends on too-tight's level-shifted switch: s_high->s_low
  // -4.5 % at fs/1.62V/125C (200.9 ps against 281.5), +4.9 % at sf/1.98V/125C (57.9 ps against
  // -3.7: the generator's p2 edge 15 ps earlier than p1's against ngspice, the shifter's rise 27 ps
  // fast, its edge's 88 % point a further 20 ps early). With the shifter's input the net's
  // full-swing transition, its tail read as a slow input (the shifter +6.8 ps slow in the circuit,
  // median, up to +14.8), the same bench gave -5.26 % .. +3.51 %: that bias happened to cover
  // the fits' fast rise at sf/1.98V/125C. (With the shifters' edges on the
  // nominal-corner sizing fits and the fight against the p device's saturation current: -4.97 % ..
  // +7.28 %, s_low->s_high +7.3 % at sf/1.62V/-40C, the shifter's fall up to 117 ps slow; with each
  // driving edge solved as a like gate's: -5.2 % .. +7.3 %. On the straight threshold law: -5.3 % ..
  // +7.3 %, the low end at fs/1.62V/27C. With the shifter output a linear ramp and fits from an
  // older simulator: -6.5 % .. +7.0 %, median -0.7 %, the high-side switch's turn-off up to 90 ps
  // early at fs/1.98V/125C; before the drive law was bent below full drive and the drains' gate
  // overlap counted: -7.4 % .. +6.7 %; with gates read as linear ramps: -7.8 % .. +7.0 %; the card's
  // earlier hand-set law: -16.2 % .. +12.3 %.)
  { model: 'analytic', card: 'generic180', count: 1620, low: -0.041, high: 0.031 },
  // lp-netlist (80 fF chain loads): 90 handovers, -3.56 % .. +4.71 %, median +0.3 %, on the same
  // drive law, overlaps and driving edges; conservative at sf/1.1V/27C, optimistic at fs/1V/-40C
  // (1518.7 ps against 1447.2). (With each driving edge solved as a like gate's: -3.8 % .. +3.9 %,
  // median +0.1 %; before the bend
  // and the overlaps: -6.7 % .. +2.8 %; with gates read as linear ramps: -7.5 % .. +3.0 %; the
  // card's earlier hand-set law, with the decks' earlier 100 ps step: -37.2 % .. +15.7 %.)
  { model: 'analytic', card: 'generic-lp', count: 90, low: -0.036, high: 0.048 },
  // The card's tables (its default model) on the same 90: -3.8 % .. +2.7 %, conservative at
  // sf/1.1V/125C, optimistic at tt/0.9V/27C (-3.7 % .. +2.7 % on the straight threshold law).
  { model: 'table', card: 'generic-lp', count: 90, low: -0.038, high: 0.027 },
];

/**
 * The optimistic end of the measured band (>= 0), what a handover's margin is lowered by per second
 * of path. A model never measured on the card gets the largest optimistic end measured on that
 * card (the switch instants come from the same devices), a card never measured the largest on any.
 */
export function instantBand(model: string, card: string): number {
  const band = INSTANT_BANDS.find((b) => b.model === model && b.card === card);
  if (band) return Math.max(0, band.high);
  const sameCard = INSTANT_BANDS.filter((b) => b.card === card);
  return (sameCard.length > 0 ? sameCard : INSTANT_BANDS).reduce((worst, b) => Math.max(worst, b.high), 0);
}
