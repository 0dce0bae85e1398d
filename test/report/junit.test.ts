import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { evaluateAll } from '../../src/analysis/evaluate.js';
import { checkReport } from '../../src/report/check-report.js';
import { checkSuite, confirmSuite, junitXml, mcSuite, verdictSuite } from '../../src/report/junit.js';
import { junitBuilder } from '../../src/cli/junit-builder.js';
import { runMonteCarlo } from '../../src/analysis/montecarlo.js';
import { mcReport } from '../../src/report/mc-report.js';
import { provenance } from '../../src/report/provenance.js';
import { runVerdict } from '../../src/report/verdict.js';
import { design, resolveYaml, ROOT, tempDir } from '../helpers.js';
import { requireTool } from '../tools.js';

requireTool('xmllint', 'libxml2-utils');

// The schema: test/report/fixtures/junit.xsd, written after the Jenkins xunit plugin's junit-10.xsd
// (github.com/jenkinsci/xunit-plugin); validated with xmllint from Debian's libxml2-utils.
const XSD = join(ROOT, 'test', 'report', 'fixtures', 'junit.xsd');

function validate(xml: string): string {
  const file = join(tempDir(), 'junit.xml');
  writeFileSync(file, xml);
  try {
    return execFileSync('xmllint', ['--noout', '--schema', XSD, file], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] });
  } catch (error) {
    throw new Error(`xmllint (Debian package libxml2-utils) refused the XML: ${String((error as { stderr?: string }).stderr ?? error)}`);
  }
}

const record = provenance({
  version: '1.2.3',
  now: new Date(Date.UTC(2026, 5, 1)),
  command: ['check', 'x.yaml'],
  inputs: [],
  model: 'analytic',
});

describe('junitXml', () => {
  const bad = resolveYaml(readFileSync(design('too-tight'), 'utf8'));
  const report = checkReport(bad, evaluateAll(bad));
  const verdict = runVerdict(report, null, null);

  it('checkSuite gives one case per check and one per corner where it fails', () => {
    const suite = checkSuite(report);
    const checks = new Set(report.corners.flatMap((c) => c.checks.map((k) => k.name)));
    const failing = report.corners.flatMap((c) => c.checks.filter((k) => !k.pass).map((k) => `${k.name} at ${c.name}`));
    expect(failing.length).toBeGreaterThan(0);
    expect(
      suite.cases
        .filter((c) => checks.has(c.name))
        .map((c) => c.name)
        .sort(),
    ).toEqual([...checks].sort());
    expect(
      suite.cases
        .filter((c) => !checks.has(c.name))
        .map((c) => c.name)
        .sort(),
    ).toEqual(failing.sort());
    const bbm = suite.cases.find((c) => c.name === 's_high/s_low break-before-make + 50.0 ps')!;
    expect(bbm.failure).toMatch(/^fails at \d+ of 45 corners; worst margin -\S+ ps at sf\/1\.98V\/125C$/);
  });

  it('validates against the common JUnit schema, counts failures and skips, and carries the provenance', () => {
    const xml = junitXml([verdictSuite('too-tight', verdict), checkSuite(report)], record, junitBuilder);
    expect(validate(xml)).toBe('');
    const failures = checkSuite(report).cases.filter((c) => c.failure !== undefined).length;
    expect(xml).toMatch(
      new RegExp(`<testsuite name="too-tight-clock: corner checks" tests="\\d+" failures="${failures}" errors="0" skipped="0">`),
    );
    expect(xml).toContain('<testsuite name="too-tight: verdict" tests="3" failures="1" errors="0" skipped="2">');
    expect(xml).toContain('<property name="phasegap.version" value="1.2.3"/>');
    expect(xml).toContain('<property name="phasegap.date" value="2026-06-01T00:00:00.000Z"/>');
  });

  it('keeps hostile names well-formed and valid', () => {
    const xml = junitXml(
      [{ name: 'a<b>&"c\u0001', cases: [{ name: ']]><x/>\u0007', className: 'k', failure: 'm<', output: ']]>' }] }],
      record,
      junitBuilder,
    );
    expect(validate(xml)).toBe('');
    expect(xml).not.toMatch(/[\u0001\u0007]/);
  });
});

describe('mcSuite and confirmSuite', () => {
  it('mcSuite fails the yield case and the checks dies fail when the yield misses, and validates', () => {
    // The demo with a 979.5 ps minimum, 3.6 ps below its nominal least dead time of 983.1 ps (measured): 30 of 40
    // dies pass (seed 1, measured), a yield strictly between 0 and 1 that misses 99 % and meets 60 % (980 ps
    // gives 29 of 40, 979 ps 33 of 40).
    const resolved = resolveYaml(
      readFileSync(design('doubler'), 'utf8').replace('deadTime: { min: 500ps, max: 4ns }', 'deadTime: { min: 979.5ps, max: 4ns }'),
    );
    const mc = runMonteCarlo(resolved, 40, 1);
    const missed = mcSuite(mcReport('d', 'generic180', mc, 0.99));
    expect(missed.cases[0]).toMatchObject({ name: 'yield at every corner', failure: 'yield 75.0 % over 40 dies; required 99.0 %' });
    expect(missed.cases.filter((c) => c.failure !== undefined).map((c) => c.name)).toContain('dead p1->p2 >= 979.5 ps');
    const accepted = mcSuite(mcReport('d', 'generic180', mc, 0.6));
    expect(accepted.cases.filter((c) => c.failure !== undefined)).toEqual([]);
    expect(validate(junitXml([missed], record, junitBuilder))).toBe('');
  });

  it('confirmSuite gives a case per quantity and pair per corner, failing those beyond tolerance or disagreeing', () => {
    const suite = confirmSuite('d', 'ngspice-42', 0.1, [
      {
        corner: 'tt',
        errors: [],
        pass: false,
        ron: [],
        quantities: [
          { quantity: 'dead p1->p2', kind: 'dead', model: 1e-9, simulator: 1.02e-9, relativeError: -0.0196, pass: true },
          { quantity: 'gap p1->p2', kind: 'gap', model: 9e-10, simulator: null, relativeError: null, pass: false },
        ],
        breakBeforeMake: [{ check: 'a/b break-before-make', model: 1e-10, simulator: -1e-11, agrees: false }],
      },
    ]);
    expect(suite.cases.map((c) => [c.name, c.failure ?? 'pass'])).toEqual([
      ['dead p1->p2 at tt', 'pass'],
      ['gap p1->p2 at tt', 'model 900 ps, ngspice-42 not measured, tolerance 10.0 %'],
      ['a/b break-before-make at tt', 'verdicts disagree; margin: model +100 ps, ngspice-42 -10.0 ps'],
    ]);
    expect(validate(junitXml([suite], record, junitBuilder))).toBe('');
  });

  it('confirmSuite adds a case per judged circuit figure (lost charge is shown, not judged) and names an unsettled output', () => {
    const fig = (
      figure: 'output' | 'ripple' | 'efficiency' | 'lost charge',
      unit: 'V' | 'C' | '',
      model: number,
      simulator: number,
      difference: number | null,
      tolerance: number | null,
      pass: boolean,
    ) => ({ figure, unit, model, simulator, difference, tolerance, pass });
    const power = { input: 1e-4, generator: 1e-4, output: 1e-4 };
    const suite = confirmSuite('d', 'ngspice-42', 0.1, [
      {
        corner: 'tt',
        errors: [],
        pass: false,
        ron: [],
        quantities: [],
        breakBeforeMake: [],
        circuit: {
          periods: 36,
          drift: -0.025,
          settled: false,
          pass: false,
          power: { model: power, simulator: power },
          figures: [
            fig('output', 'V', 2.251, 1.348, 0.5017, 0.02, false),
            fig('ripple', 'V', 0.0288, 0.0284, 0.014, 0.1, true),
            fig('efficiency', '', 0.151, 0.099, 0.52, 0.1, false),
            fig('lost charge', 'C', 11e-12, 4.3e-12, null, null, true),
          ],
        },
      },
    ]);
    expect(suite.cases.map((c) => [c.name, c.failure ?? 'pass'])).toEqual([
      ['circuit output at tt', 'model 2.25 V, ngspice-42 1.35 V, difference 50.17 %, tolerance 2 % of VDD; not settled'],
      ['circuit ripple at tt', 'pass'],
      ['circuit efficiency at tt', 'model 15.1 %, ngspice-42 9.9 %, difference 52.00 %, tolerance 10 %'],
    ]);
    expect(validate(junitXml([suite], record, junitBuilder))).toBe('');
  });
});
