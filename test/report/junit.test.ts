import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { evaluateAll } from '../../src/analysis/evaluate.js';
import { checkReport } from '../../src/report/check-report.js';
import { checkSuite, junitXml, verdictSuite } from '../../src/report/junit.js';
import { provenance } from '../../src/report/provenance.js';
import { runVerdict } from '../../src/report/verdict.js';
import { design, resolveYaml, ROOT, tempDir } from '../helpers.js';

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

const record = provenance({ version: '1.2.3', now: new Date(Date.UTC(2026, 5, 1)), command: ['check', 'x.yaml'], inputs: [], model: 'analytic' });

describe('junitXml', () => {
  const bad = resolveYaml(readFileSync(design('too-tight'), 'utf8'));
  const report = checkReport(bad, evaluateAll(bad));
  const verdict = runVerdict(report, null, null);

  it('checkSuite gives one case per check and one per corner where it fails', () => {
    const suite = checkSuite(report);
    const checks = new Set(report.corners.flatMap((c) => c.checks.map((k) => k.name)));
    const failing = report.corners.flatMap((c) => c.checks.filter((k) => !k.pass).map((k) => `${k.name} at ${c.name}`));
    expect(failing.length).toBeGreaterThan(0);
    expect(suite.cases.filter((c) => checks.has(c.name)).map((c) => c.name).sort()).toEqual([...checks].sort());
    expect(suite.cases.filter((c) => !checks.has(c.name)).map((c) => c.name).sort()).toEqual(failing.sort());
    const bbm = suite.cases.find((c) => c.name === 's_high/s_low break-before-make + 50.0 ps')!;
    expect(bbm.failure).toMatch(/^fails at \d+ of 45 corners; worst margin -\S+ ps at ff\/1\.98V\/-40C$/);
  });

  it('validates against the common JUnit schema, counts failures and skips, and carries the provenance', () => {
    const xml = junitXml([verdictSuite('too-tight', verdict), checkSuite(report)], record);
    expect(validate(xml)).toBe('');
    const failures = checkSuite(report).cases.filter((c) => c.failure !== undefined).length;
    expect(xml).toMatch(new RegExp(`<testsuite name="too-tight-clock: corner checks" tests="\\d+" failures="${failures}" errors="0" skipped="0">`));
    expect(xml).toContain('<testsuite name="too-tight: verdict" tests="3" failures="1" errors="0" skipped="2">');
    expect(xml).toContain('<property name="phasegap.version" value="1.2.3"/>');
    expect(xml).toContain('<property name="phasegap.date" value="2026-06-01T00:00:00.000Z"/>');
  });

  it('keeps hostile names well-formed and valid', () => {
    const xml = junitXml([{ name: 'a<b>&"c\u0001', cases: [{ name: ']]><x/>\u0007', className: 'k', failure: 'm<', output: ']]>' }] }], record);
    expect(validate(xml)).toBe('');
    expect(xml).not.toMatch(/[\u0001\u0007]/);
  });
});
