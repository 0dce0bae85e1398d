/**
 * The circuit figures' measured error against ngspice, printed beside the circuit table so a small
 * efficiency or output margin is read against it: `confirm --corners all` on the shipped circuits
 * (dickson-pump, doubler-diode-pump, doubler-pump, negative-pump, sc-integrator-path; 45 corners
 * each, ngspice-39), the model less ngspice. Only the generic180 card has circuits measured.
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
  { card: 'generic180', output: [-0.002, 0.002], ripple: [-0.051, 0.052], efficiency: [-0.025, 0.029], corners: 225 },
];

const pct = (v: number) => `${v > 0 ? '+' : ''}${(100 * v).toFixed(1)} %`;

/** One line for the circuit tables: the measured error on this card, or that none was measured. */
export function figureErrorText(card: string): string {
  const e = FIGURE_ERRORS.find((x) => x.card === card);
  if (!e) return `circuit model error: not measured on card ${card}; run phasegap confirm before trusting a small circuit margin`;
  return (
    `circuit model error against ngspice (${e.corners} corners of the shipped circuits): output ${pct(e.output[0])} to ${pct(e.output[1])} of VDD, ` +
    `ripple ${pct(e.ripple[0])} to ${pct(e.ripple[1])}, efficiency ${pct(e.efficiency[0])} to ${pct(e.efficiency[1])}; read small margins against it`
  );
}
