/**
 * How far each delay model's 50 % dead time has been measured from ngspice, per model and process
 * card, so a margin can be read against it. Source: test/bench/accuracy.bench.ts, the shipped
 * designs (fixtures/designs) at every one of their corners, the product's own decks on the
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
  // negative-pump, sc-integrator, sc-integrator-path, too-tight: 10 designs x 45 corners x 2 dead
  // times on the card's alpha-power law fitted to its transistor models (fixtures/processes/generic180.yaml),
  // its prefactor unscaled and bent below full drive as the level-3 current is (ramp-response.ts,
  // driveBend), with their own saturation voltage (vdsatRatio), its transistor-model capacitances, each
  // drain's gate overlap counted twice on its own net (Miller), driven edges shaped by their
  // drivers (each driving edge solved with the driver's own threshold and opposing network), Meyer
  // channel charge, the opposing device at its own threshold and with its Miller charge, fanout pins
  // as charged to the 50 % point, the kickback on driven inputs: -2.80..+2.33 % (-54..+15 ps), most
  // optimistic on too-tight at sf/1.98V/125C (657.1 ps against 642.2), most pessimistic on
  // sc-integrator at ss/1.62V/27C (1654.6 ps against 1702.3), median |error| 0.65 %. (Before the
  // driving edges took their drivers' own devices: -2.8..+2.2 %, median 0.6 %; with x^alpha below
  // full drive, no drain overlap and the
  // prefactor scaled by 0.955 to make up for both on the doubler's chain: -2.5..+2.5 %, median 1.1 %;
  // with the saturation voltage at (alpha - 1) of the overdrive: -2.5..+4.6 %, median 1.6 %; the
  // card's earlier hand-set law -5.3..+3.9 % on three corners and -12.6 % at ss/1.62V/-40C.)
  { model: 'analytic', card: 'generic180', count: 900, median: 0.007, worst: 0.029, low: -0.029, high: 0.024 },
  // The shipped fixtures/tables/generic180.json on the same 900 dead times: every one short
  // (-7.1..-3.5 %, -185..-17 ps), median |error| 5.2 %, so the card keeps the analytic model.
  // New tables (`npm run tables`) need measuring again.
  { model: 'table', card: 'generic180', count: 900, median: 0.052, worst: 0.072, low: -0.072, high: -0.035 },
  // lp-netlist (80 fF chain loads) at its 45 corners, 90 dead times, on the card's alpha-power law
  // fitted to its transistor models (fixtures/processes/generic-lp.yaml), bent below full drive, its
  // drains' overlap on their nets, driving edges from the drivers' own devices: -3.58..+5.00 %
  // (-33..+145 ps), short at sf/1.1V/27C, long (optimistic) at fs/1V/-40C (1454.9 ps against 1385.6)
  // and fs/0.9V/-40C (+4.9 %), median |error| 1.6 %. (With each driving edge solved as a like gate's:
  // -4.2..+4.1 %, median 1.5 %; before the bend and the overlap: -6.4..+3.0 %,
  // median 2.3 %; the card's earlier hand-set law: -27.8..+19.3 %, median 9.6 %, measured with the
  // decks' earlier 100 ps step.)
  { model: 'analytic', card: 'generic-lp', count: 90, median: 0.016, worst: 0.051, low: -0.036, high: 0.051 },
  // The shipped fixtures/tables/generic-lp.json (wide grid, which covers lp-netlist's 80 fF chain
  // nodes and its slowest edges) on the same 90: -2.8..+2.5 % (-12..+61 ps), median |error| 1.2 %:
  // closer than the analytic model, so the card names its tables.
  { model: 'table', card: 'generic-lp', count: 90, median: 0.012, worst: 0.028, low: -0.028, high: 0.025 },
];

/**
 * How far each delay model's clean gap (both phases below the gap level) has been measured
 * optimistic, as a fraction of the 50 % dead time, per model and card: what the gap checks take
 * off the model's gap. Source: test/bench/accuracy.bench.ts on the shipped designs at every corner
 * (ngspice 39), (model gap - ngspice gap) / model dead time; each end rounded outward to 0.1 %.
 */
export interface GapBand {
  readonly model: string;
  readonly card: string;
  /** Gaps compared. */
  readonly count: number;
  /** Signed error range as a fraction of the dead time: most pessimistic, most optimistic. */
  readonly low: number;
  readonly high: number;
}

export const GAP_BANDS: readonly GapBand[] = [
  // 10 designs x 45 corners x 2 gaps: 900 gaps, -3.30..+2.44 % of the dead time (-67.3..+9.3 ps),
  // most optimistic on too-tight at sf/1.98V/-40C (+9.3 ps), most pessimistic on sc-integrator at
  // ss/1.62V/125C (-67.3 ps). (With each driving edge solved as a like gate's: -3.3..+2.2 %,
  // -66.2..+8.3 ps; with x^alpha below full drive, no drain overlap and the prefactor
  // scaled by 0.955: -4.0..+1.6 %, -69.6..+37.4 ps, too-tight's 0.8 pF phases 31 ps short; with the
  // saturation voltage at (alpha - 1) of the overdrive the phase edges were 5-15 % short and this
  // band -0.8..+9.1 %.) The hand-written references of test/reference/ (their own cards) stay within
  // 10 ps, 3 % of their dead times.
  { model: 'analytic', card: 'generic180', count: 900, low: -0.034, high: 0.025 },
  // The shipped fixtures/tables/generic180.json on the same 900: -7.6..-0.1 % (-174.4..-0.9 ps); the
  // tables read every edge late, so their gaps are short.
  { model: 'table', card: 'generic180', count: 900, low: -0.076, high: -0.001 },
  // lp-netlist at all 45 corners with its delay-chain loads at 36, 50, 70 and 80 fF (`phasegap
  // --model analytic confirm --corners all --set loads.d1a=36fF ...`): 360 gaps, -9.72..+4.35 %,
  // short at the sf corners and the lighter loads (36 fF: sf/0.9V/125C -9.7 %), long at the fs cold
  // corners (80 fF: fs/1V/-40C +4.35 %, 63 ps; 36 fF +1.6 %, 50 fF +2.7 %, 70 fF +3.8 %, all at
  // fs/0.9V/-40C). (With each driving edge solved as a like gate's: -10.7..+3.6 %; before the bend
  // and the overlap: -15.2..+2.6 %.)
  { model: 'analytic', card: 'generic-lp', count: 360, low: -0.098, high: 0.044 },
  // The card's tables on the same 360: -3.4..+3.1 % (36 fF: +3.1 % at sf/0.9V/-40C; 50 fF: -3.4 % at
  // sf/1.1V/27C).
  { model: 'table', card: 'generic-lp', count: 360, low: -0.034, high: 0.031 },
];

/** `end` of the band measured for the model and card, else the largest `end` measured for any (never below 0). */
function measuredOrWorst<B extends { readonly model: string; readonly card: string }>(
  bands: readonly B[],
  model: string,
  card: string,
  end: (band: B) => number,
): number {
  const own = bands.find((b) => b.model === model && b.card === card);
  return Math.max(0, own ? end(own) : Math.max(...bands.map(end)));
}

/**
 * The optimistic end of the clean-gap band (>= 0), fraction of the dead time: the measured one for
 * the model and card, else the largest measured for any (a model or card never measured is held to
 * the worst seen). The gap checks are minima, so only a gap read long can pass one wrongly.
 */
export function gapBand(model: string, card: string): number {
  return measuredOrWorst(GAP_BANDS, model, card, (b) => b.high);
}

/**
 * The dead-time band as one figure (>= 0), fraction of the dead time: the largest |error| measured
 * for the model and card, else the largest measured for any. A dead time read long passes a minimum
 * wrongly and one read short a maximum, so a headroom on every margin takes both ends.
 */
export function deadTimeBand(model: string, card: string): number {
  return measuredOrWorst(ERROR_BANDS, model, card, (b) => b.worst);
}

export function errorBand(model: string, card: string): ErrorBand | undefined {
  return ERROR_BANDS.find((b) => b.model === model && b.card === card);
}

/**
 * One line for the reports: the band, or that none was measured; `also` (a clause) joins it before
 * its closing words (the switch-instant band of a design with handovers, report/model-error.ts).
 */
export function errorBandText(model: string, card: string, also?: string): string {
  const band = errorBand(model, card);
  const pct = (v: number) => `${v > 0 ? '+' : ''}${(100 * v).toFixed(1)} %`;
  const measuredGap = GAP_BANDS.some((b) => b.model === model && b.card === card);
  const gap = `${(100 * gapBand(model, card)).toFixed(1)} % of the dead time`;
  const gapText =
    (measuredGap
      ? `the gap checks take its measured gap error, ${gap}, off the model's gap`
      : `its gap error is not measured: the gap checks take the worst measured, ${gap}, off the model's gap`) + (also ? `; ${also}` : '');
  if (!band)
    return `model error: not measured for the ${model} model on card ${card}; ${gapText}; run phasegap confirm before trusting a small margin`;
  return `model error: dead time ${pct(band.low)} to ${pct(band.high)} of ngspice (median |error| ${(100 * band.median).toFixed(1)} %, ${band.count} dead times on the shipped designs); ${gapText}; read small margins against it`;
}
