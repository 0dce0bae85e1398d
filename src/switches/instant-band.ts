/**
 * How far the model's break-before-make handovers have been measured from ngspice, so a handover
 * closer than the model can tell is not called a pass. A handover from switch a turning off to b
 * turning on is the time between their gate nets' 50 % edges plus each instant's lag behind its
 * net's edge (ramp to the device's turn-on level, level shifter); the model's error on it is
 * stated as a fraction of that path, |edge to edge| + |lag a| + |lag b|, since each piece is a
 * modelled time whose error grows with it.
 *
 * Source: `confirm` decks of the shipped designs with break-before-make constraints, ngspice 39 on
 * the cards' model files, each handover's (model - ngspice) / path (test/checks/switch-band.test.ts
 * holds the measurement on too-tight.yaml's corners).
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
  // too-tight at all 45 corners (90 handovers: -16.2 % .. +8.6 %, optimistic at the hot corners), and the
  // worst corners of doubler, doubler-unboosted, doubler-pump, doubler-unboosted-pump, doubler-diode-pump,
  // dickson-pump, sc-integrator, sc-integrator-path, negative-pump (84 handovers: -14.3 % .. +2.7 %); median -3.2 %
  { model: 'analytic', card: 'generic180', count: 174, low: -0.162, high: 0.086 },
  // lp-netlist at all 45 corners: optimistic at the high supply and cold (tt/1.1V/-40C +18.7 %),
  // conservative at 0.9 V (-39.6 %); median -4.6 %. The same with phi2f 0.9 V or 0.55 V on the card.
  { model: 'analytic', card: 'generic-lp', count: 90, low: -0.396, high: 0.187 },
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
