/**
 * How far each delay model's 50 % dead time has been measured from ngspice, per model and process
 * card, so a margin can be read against it. Source: test/bench/accuracy.bench.ts, the shipped
 * designs (fixtures/designs) at three corners each (tt at the middle supply and temperature, ss at
 * the lowest supply and hottest, ff at the highest and coldest), the product's own decks on the
 * cards' invented device models, ngspice 39. Relative error is (model - ngspice) / ngspice.
 */
export interface ErrorBand {
  readonly model: string;
  readonly card: string;
  /** Dead times compared. */
  readonly count: number;
  /** Median and largest |relative error|. */
  readonly median: number;
  readonly worst: number;
  /** Signed relative error range, low to high. */
  readonly low: number;
  readonly high: number;
}

export const ERROR_BANDS: readonly ErrorBand[] = [
  // dickson-pump, doubler, doubler-pump, doubler-diode-pump, doubler-unboosted, doubler-unboosted-pump,
  // negative-pump, sc-integrator, sc-integrator-path, too-tight: 10 designs x 3 corners x 2 dead
  // times (driven edges shaped by their drivers, the opposing device at its own threshold)
  { model: 'analytic', card: 'generic180', count: 60, median: 0.04, worst: 0.085, low: -0.085, high: 0.006 },
  // Tables characterized with the inverter driver, 50 % pin capacitances and R_on, fine grid, at
  // those three corners (-67..+43 ps). fixtures/tables/generic180.json still holds the earlier
  // characterization until `npm run tables` is run again: median 5.6 %, worst 6.1 %, -6.1..-5.1 %.
  { model: 'table', card: 'generic180', count: 42, median: 0.023, worst: 0.068, low: -0.068, high: 0.013 },
  // lp-netlist: 1 design x 3 corners x 2 dead times
  { model: 'analytic', card: 'generic-lp', count: 6, median: 0.041, worst: 0.255, low: -0.255, high: 0.135 },
];

export function errorBand(model: string, card: string): ErrorBand | undefined {
  return ERROR_BANDS.find((b) => b.model === model && b.card === card);
}

/** One line for the reports: the band, or that none was measured. */
export function errorBandText(model: string, card: string): string {
  const band = errorBand(model, card);
  const pct = (v: number) => `${v > 0 ? '+' : ''}${(100 * v).toFixed(1)} %`;
  if (!band) return `model error: not measured for the ${model} model on card ${card}; run phasegap confirm before trusting a small margin`;
  return `model error: dead time ${pct(band.low)} to ${pct(band.high)} of ngspice (median |error| ${(100 * band.median).toFixed(1)} %, ${band.count} dead times on the shipped designs); read small margins against it`;
}
