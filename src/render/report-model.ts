/**
 * Everything the review page shows, computed once: the check report, the three drawings as SVG
 * text, the per-check worst cases, the dead-time ranges and (when computed) fmax. The HTML and
 * Markdown renderers only lay this out.
 */
import { greatest, least as d3least } from 'd3-array';
import type { CornerResult } from '../analysis/evaluate.js';
import type { FmaxResult } from '../analysis/fmax.js';
import type { ResolvedDesign } from '../analysis/resolve.js';
import { checkReport, type CheckReport } from '../report/check-report.js';
import { hasHandovers, modelErrorText } from '../report/model-error.js';
import { formatEngineering } from '../units/format.js';
import { worstCornerIndex } from '../analysis/corner-choice.js';
import { buildDiagram } from './diagram.js';
import { marginRows, namedRequirements, processOrder, type MarginRow } from './margins.js';
import type { MarginChartInput } from './svg/margins.js';
import { renderMarginSvg } from './svg/margins.js';
import { renderTimingSvg } from './svg/timing.js';
import type { McSection } from './mc-section.js';
import type { TuneReport } from '../report/tune-report.js';
import type { CornerComparison } from '../report/confirm-report.js';
import { runVerdict, type RunVerdict } from '../report/verdict.js';
import type { Provenance } from '../report/provenance.js';
import { withRunMetadata } from './svg/metadata.js';
import { circuitSection, type CircuitSection } from './circuit-section.js';

/** ngspice against the model at some corners, when the report was asked for it. */
export interface ConfirmSection {
  readonly simulator: string;
  readonly tolerance: number;
  readonly comparisons: readonly CornerComparison[];
}

export interface DeadTimeRange {
  readonly from: string;
  readonly to: string;
  /** s */
  readonly least: number;
  readonly leastCorner: string;
  readonly most: number;
  readonly mostCorner: string;
}

export interface ReportModel {
  readonly report: CheckReport;
  /** The run's one verdict: corner checks, Monte Carlo yield and simulator agreement, each with its own. */
  readonly verdict: RunVerdict;
  readonly description: string;
  /** Where the process card came from: a path as written in the design, or "inline". */
  readonly processSource: string;
  readonly resolved: ResolvedDesign;
  readonly worstCorner: string;
  readonly deadTimes: readonly DeadTimeRange[];
  readonly checks: readonly MarginRow[];
  /** null when fmax was not computed; `fmaxNote` says why. */
  readonly fmax: FmaxResult | null;
  readonly fmaxNote: string;
  readonly svg: { readonly worst: string; readonly all: string; readonly margins: string };
  /** Monte Carlo results when the report was asked for them. */
  readonly mc: McSection | null;
  /** Delay-chain proposals (template generators, unless skipped). */
  readonly tune: TuneReport | null;
  readonly confirm: ConfirmSection | null;
  /** What made the page (version, inputs and their hashes, command, date); null when not recorded. */
  readonly provenance: Provenance | null;
  /** The circuit's figures per corner and its frequency sweep; null without a circuit section. */
  readonly circuit: CircuitSection | null;
}

export function marginChartInput(resolved: ResolvedDesign, results: readonly CornerResult[]): MarginChartInput {
  const named = namedRequirements(results);
  const rows = marginRows(results).map((r) => (named.has(r.name) ? { ...r, requirement: named.get(r.name)! } : r));
  const failing = rows.filter((r) => r.failing > 0).length;
  return {
    title: {
      design: resolved.design.name,
      line: `margin of every check at all ${results.length} corners · clock ${formatEngineering(resolved.design.clock.frequency, 'Hz')}`,
      note: `${resolved.model.name} delay model · process card ${resolved.card.name} · margin = measured value minus its requirement · ${modelErrorText(resolved.model.name, resolved.card.name, hasHandovers(resolved))}`,
      pass: failing === 0,
      detail: failing === 0 ? `all ${rows.length} checks hold everywhere` : `${failing} of ${rows.length} checks fail somewhere`,
    },
    rows,
    processes: processOrder(results),
  };
}

function deadTimeRanges(results: readonly CornerResult[]): DeadTimeRange[] {
  const out: DeadTimeRange[] = [];
  for (const index of [0, 1] as const) {
    const measured = results.flatMap((r) => (r.measurement.ok ? [{ corner: r.corner.name, d: r.measurement.deadTimes[index] }] : []));
    const first = measured[0];
    if (!first) continue;
    const least = d3least(measured, (m) => m.d.t50) ?? first;
    const most = greatest(measured, (m) => m.d.t50) ?? first;
    out.push({
      from: first.d.from,
      to: first.d.to,
      least: least.d.t50,
      leastCorner: least.corner,
      most: most.d.t50,
      mostCorner: most.corner,
    });
  }
  return out;
}

export interface ReportExtras {
  readonly processSource: string;
  readonly fmax: FmaxResult | null;
  readonly fmaxNote: string;
  readonly mc?: McSection | null;
  readonly tune?: TuneReport | null;
  readonly confirm?: ConfirmSection | null;
  readonly provenance?: Provenance | null;
}

export function buildReportModel(resolved: ResolvedDesign, results: readonly CornerResult[], extras: ReportExtras): ReportModel {
  const worst = worstCornerIndex(results);
  const report = checkReport(resolved, results);
  const verdict = runVerdict(report, extras.mc?.report ?? null, extras.confirm ?? null, resolved.design.requirements.deadTime);
  const provenance = extras.provenance ?? null;
  const stamp = (svg: string) => (provenance === null ? svg : withRunMetadata(svg, verdict, provenance));
  const circuit = circuitSection(resolved, results);
  return {
    report,
    verdict,
    provenance,
    description: resolved.design.description ?? '',
    processSource: extras.processSource,
    resolved,
    worstCorner: results[worst]?.corner.name ?? '',
    deadTimes: deadTimeRanges(results),
    checks: marginRows(results),
    fmax: extras.fmax,
    fmaxNote: extras.fmaxNote,
    mc: extras.mc ?? null,
    tune: extras.tune ?? null,
    confirm: extras.confirm ?? null,
    circuit: circuit && { ...circuit, chart: stamp(circuit.chart) },
    svg: {
      worst: stamp(
        renderTimingSvg(buildDiagram(resolved, results, { kind: 'corner', index: worst }, 'phases'), { idPrefix: 'worst', run: verdict }),
      ),
      all: stamp(
        renderTimingSvg(buildDiagram(resolved, results, { kind: 'all', reference: worst }, 'phases'), { idPrefix: 'all', run: verdict }),
      ),
      margins: stamp(renderMarginSvg(marginChartInput(resolved, results), { idPrefix: 'margins', run: verdict })),
    },
  };
}
