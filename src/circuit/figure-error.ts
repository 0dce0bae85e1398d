/**
 * The circuit figures' measured error against ngspice, printed beside the circuit table and taken
 * off the circuit checks' margins (circuit-checks.ts), as the gap band is off the gap's:
 * `confirm --corners all` on the shipped circuits (dickson-pump, doubler-diode-pump, doubler-pump,
 * negative-pump, sc-integrator-path; 45 corners each, ngspice-39), the model less ngspice. Only the
 * generic180 card has circuits measured; another card is held to the widest measured.
 */
export interface FigureError {
  readonly card: string;
  /** Mean output, fraction of VDD. */
  readonly output: readonly [number, number];
  /** Ripple and efficiency, fraction of ngspice's. */
  readonly ripple: readonly [number, number];
  readonly efficiency: readonly [number, number];
  readonly corners: number;
}

export const FIGURE_ERRORS: readonly FigureError[] = [
  // Each end rounded outward to 0.1 %: output -0.24 % of VDD (dickson-pump, ff/1.8V/27C) .. +0.20 %
  // (sc-integrator-path, ff/1.98V/125C); ripple -4.63 % (sc-integrator-path, tt/1.8V/-40C) .. +3.86 %
  // (the same, fs/1.8V/125C); efficiency -1.81 % (negative-pump, fs/1.62V/-40C) .. +2.67 %
  // (doubler-pump, tt/1.98V/-40C: the up-shifters' energy, 6.1-8.8 % low alone,
  // scripts/shifter-energy-bench.mjs). Re-measured with the switches' thresholds and 2 phi_F on
  // SPICE level 3's own temperature law (R_on within -0.6..+0.2 % of ngspice on every shipped
  // design; with the straight law the ripple read -5.4 .. +5.0 % and the efficiency -1.5 .. +2.7 %).
  // Re-measured after each driving edge took its driver's own devices and the latch shifters their
  // per-corner fits and their nets' central slope (225 corners, every circuit agreeing): output
  // -0.24 % (dickson-pump, ff/1.8V/27C) .. +0.20 % (sc-integrator-path, ff/1.98V/125C), ripple
  // -4.67 % (sc-integrator-path, sf/1.8V/-40C) .. +3.90 % (the same, fs/1.8V/125C), efficiency
  // -1.75 % (negative-pump, fs/1.62V/-40C) .. +2.42 % (doubler-pump, tt/1.8V/-40C): inside the
  // ends below, which are kept.
  { card: 'generic180', output: [-0.003, 0.002], ripple: [-0.047, 0.039], efficiency: [-0.019, 0.027], corners: 225 },
];

/** The card's measured circuit error, else the widest measured on any card (both ends). */
export function figureErrorFor(card: string): FigureError {
  const own = FIGURE_ERRORS.find((x) => x.card === card);
  if (own) return own;
  const span = (pick: (e: FigureError) => readonly [number, number]): [number, number] => [
    Math.min(...FIGURE_ERRORS.map((e) => pick(e)[0])),
    Math.max(...FIGURE_ERRORS.map((e) => pick(e)[1])),
  ];
  return { card, output: span((e) => e.output), ripple: span((e) => e.ripple), efficiency: span((e) => e.efficiency), corners: 0 };
}

const pct = (v: number) => `${v > 0 ? '+' : ''}${(100 * v).toFixed(1)} %`;

/** One line for the circuit tables: the measured error on this card, or that none was measured. */
export function figureErrorText(card: string): string {
  const e = FIGURE_ERRORS.find((x) => x.card === card);
  if (!e)
    return `circuit model error: not measured on card ${card}; the circuit checks take the widest measured off their margins; run phasegap confirm before trusting a small circuit margin`;
  return (
    `circuit model error against ngspice (${e.corners} corners of the shipped circuits): output ${pct(e.output[0])} to ${pct(e.output[1])} of VDD, ` +
    `ripple ${pct(e.ripple[0])} to ${pct(e.ripple[1])}, efficiency ${pct(e.efficiency[0])} to ${pct(e.efficiency[1])}; the circuit checks take it off their margins`
  );
}
