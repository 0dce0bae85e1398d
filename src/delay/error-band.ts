/**
 * How far each delay model's 50 % dead time has been measured from ngspice, per model and process
 * card, so a margin can be read against it. Source: test/bench/accuracy.bench.ts, the shipped
 * designs (fixtures/designs) at three corners each (tt at the middle supply and temperature, ss at
 * the lowest supply and hottest, ff at the highest and coldest), the product's own decks on the
 * cards' invented device models, ngspice 39. Relative error is (model - ngspice) / ngspice; each
 * end is rounded outward to 0.1 %, so a band is never narrower than what was measured.
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
  // times on the card's transistor-model capacitances, driven edges shaped by their drivers, Meyer
  // channel charge, the opposing device at its own threshold and with its Miller charge, fanout pins
  // as charged to the 50 % point, the kickback on driven inputs: -5.3..+3.9 % (-99..+24 ps), most
  // optimistic on too-tight at ff/1.98V/-40C, most pessimistic on sc-integrator at tt/1.8V/27C,
  // median |error| 2.3 %.
  { model: 'analytic', card: 'generic180', count: 60, median: 0.023, worst: 0.053, low: -0.053, high: 0.039 },
  // The shipped fixtures/tables/generic180.json on the same 60 dead times: every one short
  // (-6.3..-4.8 %, -185..-18 ps), median |error| 5.6 %. New tables (`npm run tables`) need measuring again.
  { model: 'table', card: 'generic180', count: 60, median: 0.056, worst: 0.063, low: -0.063, high: -0.047 },
  // lp-netlist: 1 design x 3 corners x 2 dead times, -26.9..+11.8 % (-136..+27 ps), short at
  // ss/0.9V/125C, long (optimistic) at ff/1.1V/-40C, median |error| 5.8 %
  { model: 'analytic', card: 'generic-lp', count: 6, median: 0.058, worst: 0.269, low: -0.269, high: 0.118 },
  // The shipped fixtures/tables/generic-lp.json on the same 6: -6.6..+27.3 % (-17..+107 ps, long
  // at ss/0.9V/125C), median |error| 8.1 %
  { model: 'table', card: 'generic-lp', count: 6, median: 0.081, worst: 0.273, low: -0.066, high: 0.273 },
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
