/**
 * JUnit XML for CI servers: one test suite for the run's verdict (a case per part, skipped when it
 * did not run) and one per analysis, with a case per check (and per corner where it fails). The
 * XML is written by junit-report-builder, which escapes text and drops characters XML 1.0 forbids.
 */
import type { Builder } from 'junit-report-builder';
import { compareChecks } from '../checks/check.js';
import type { CornerComparison } from './confirm-report.js';
import { formatMargin } from './margin-format.js';
import type { CheckReport } from './check-report.js';
import { mcPercent, type McReport } from './mc-report.js';
import { provenanceLines, type Provenance } from './provenance.js';
import type { RunVerdict } from './verdict.js';
import { formatSignedTime, formatTime } from '../units/format.js';
import { formatCircuitFigure } from './confirm-text.js';

export interface JunitCase {
  readonly name: string;
  readonly className: string;
  /** The failure message; absent when the case passes. */
  readonly failure?: string;
  readonly skipped?: string;
  /** Words shown beside the case (system-out). */
  readonly output?: string;
}

export interface JunitSuite {
  readonly name: string;
  readonly cases: readonly JunitCase[];
}

/** The verdict's parts, one case each: a part that did not run is skipped. */
export function verdictSuite(design: string, v: RunVerdict): JunitSuite {
  return {
    name: `${design}: verdict`,
    cases: v.parts.map((p) => ({
      name: p.name,
      className: `phasegap.verdict.${p.key}`,
      output: p.reason,
      ...(p.verdict === 'fail' ? { failure: p.reason } : p.verdict === 'not-run' ? { skipped: p.reason } : {}),
    })),
  };
}

/** A case per check (its worst corner), and a case per corner where it fails. */
export function checkSuite(r: CheckReport): JunitSuite {
  const worst = new Map<string, { check: CheckReport['corners'][number]['checks'][number]; corner: string; failing: string[] }>();
  for (const c of r.corners) {
    for (const k of c.checks) {
      const seen = worst.get(k.name);
      if (!seen) worst.set(k.name, { check: k, corner: c.name, failing: k.pass ? [] : [c.name] });
      else {
        if (!k.pass) seen.failing.push(c.name);
        if (compareChecks(k, seen.check) < 0) Object.assign(seen, { check: k, corner: c.name });
      }
    }
  }
  const cases: JunitCase[] = [];
  for (const [name, w] of worst) {
    const className = `phasegap.check.${w.check.kind}`;
    const margin = `margin ${formatMargin(w.check.margin, w.check.kind)} at ${w.corner}`;
    cases.push({
      name,
      className,
      output: `worst ${margin}`,
      ...(w.failing.length > 0 ? { failure: `fails at ${w.failing.length} of ${r.corners.length} corners; worst ${margin}` } : {}),
    });
    for (const corner of w.failing) {
      const k = r.corners.find((c) => c.name === corner)!.checks.find((x) => x.name === name)!;
      cases.push({
        name: `${name} at ${corner}`,
        className,
        failure: `margin ${formatMargin(k.margin, k.kind)}${k.detail ? ` (${k.detail})` : ''}`,
      });
    }
  }
  for (const c of r.corners)
    if (c.reason !== undefined) cases.push({ name: `steady state at ${c.name}`, className: 'phasegap.check.corner', failure: c.reason });
  return { name: `${r.design}: corner checks`, cases };
}

/**
 * A case for the yield and one per check: a check fails its case when dies fail it and the yield
 * misses its requirement, so the cases agree with the exit code.
 */
export function mcSuite(r: McReport): JunitSuite {
  const pct = mcPercent(r);
  const required = r.minYield === null ? 'every die must pass (no requirements.minYield)' : `required ${pct(r.minYield)}`;
  const cases: JunitCase[] = [
    {
      name: 'yield at every corner',
      className: 'phasegap.mc.yield',
      output: `${pct(r.yield.value)} over ${r.samples} dies, ${required}`,
      ...(r.verdict === 'fail' ? { failure: `yield ${pct(r.yield.value)} over ${r.samples} dies; ${required}` } : {}),
    },
  ];
  const names = new Map<string, { kind: string; failures: number; corner: string }>();
  for (const c of r.corners) {
    for (const q of c.quantities) {
      if (q.kind === 'measure') continue;
      const n = q.failures ?? 0;
      const seen = names.get(q.name);
      if (!seen || n > seen.failures) names.set(q.name, { kind: q.kind, failures: n, corner: c.name });
    }
  }
  for (const [name, x] of names) {
    const words = x.failures === 0 ? 'no die fails it at any corner' : `${x.failures} of ${r.samples} dies fail it at ${x.corner}`;
    cases.push({
      name,
      className: `phasegap.mc.${x.kind}`,
      output: words,
      ...(x.failures > 0 && r.verdict === 'fail' ? { failure: words } : {}),
    });
  }
  return { name: `${r.design}: Monte Carlo`, cases };
}

/** A case per compared quantity and per break-before-make pair at each corner. */
export function confirmSuite(design: string, simulator: string, tolerance: number, comparisons: readonly CornerComparison[]): JunitSuite {
  const cases: JunitCase[] = [];
  for (const c of comparisons) {
    for (const q of c.quantities) {
      const words =
        `model ${formatTime(q.model)}, ${simulator} ${q.simulator === null ? 'not measured' : formatTime(q.simulator)}` +
        `${q.relativeError === null ? '' : `, difference ${(q.relativeError * 100).toFixed(1)} %`}, tolerance ${(tolerance * 100).toFixed(1)} %`;
      cases.push({
        name: `${q.quantity} at ${c.corner}`,
        className: `phasegap.confirm.${q.kind}`,
        output: words,
        ...(q.pass ? {} : { failure: words }),
      });
    }
    for (const b of c.breakBeforeMake) {
      const words = `margin: model ${formatSignedTime(b.model)}, ${simulator} ${formatSignedTime(b.simulator, 'not measured')}`;
      cases.push({
        name: `${b.check} at ${c.corner}`,
        className: 'phasegap.confirm.break-before-make',
        output: words,
        ...(b.agrees ? {} : { failure: `verdicts disagree; ${words}` }),
      });
    }
    for (const f of c.circuit?.figures ?? []) {
      if (f.tolerance === null) continue;
      const words =
        `model ${f.model === null ? 'no periodic steady state' : formatCircuitFigure(f, f.model)}, ${simulator} ${formatCircuitFigure(f, f.simulator)}${f.difference === null ? '' : `, difference ${(f.difference * 100).toFixed(2)} %`}` +
        `, tolerance ${(f.tolerance * 100).toFixed(0)} %${f.figure === 'output' ? ` of VDD${c.circuit!.settled ? '' : '; not settled'}` : ''}`;
      cases.push({
        name: `circuit ${f.figure} at ${c.corner}`,
        className: 'phasegap.confirm.circuit',
        output: words,
        ...(f.pass ? {} : { failure: words }),
      });
    }
  }
  return { name: `${design}: ${simulator} against the model`, cases };
}

/** The suites as one JUnit XML document; the provenance goes into each suite's properties. */
/** `junitBuilder` is the package's export, loaded by the caller (the CLI). */
export function junitXml(suites: readonly JunitSuite[], p: Provenance, junitBuilder: Builder): string {
  const builder = junitBuilder.newBuilder();
  const record = provenanceLines(p);
  for (const s of suites) {
    const suite = builder.testSuite().name(s.name);
    suite.property('phasegap.version', p.version).property('phasegap.date', p.date);
    record.forEach((line, i) => {
      suite.property(`phasegap.provenance.${i}`, line);
    });
    for (const c of s.cases) {
      const tc = suite.testCase().className(c.className).name(c.name);
      if (c.failure !== undefined) tc.failure(c.failure);
      if (c.skipped !== undefined) tc.skipped();
      if (c.output !== undefined) tc.standardOutput(c.output);
    }
  }
  // The common schema (the Jenkins xunit plugin's junit-10.xsd) has no skipped count on the root; each suite keeps its own.
  return `${builder.build().replace(/^(<testsuites\b[^>]*?) skipped="\d+"/m, '$1')}\n`;
}
