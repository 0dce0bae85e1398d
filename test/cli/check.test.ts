import { describe, it, expect } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { cli, design, processCard, ROOT, TYPICAL_ONLY, tempDir, withoutStamp } from '../helpers.js';

interface JsonCheck {
  kind: string;
  name: string;
  margin: number | null;
  pass: boolean;
}
interface JsonCorner {
  name: string;
  process: string;
  vdd: number;
  temperature: number;
  duty: number;
  deadTimes: Array<{ from: string; to: string; t50: number; gap: number }>;
  widths: Record<string, number>;
  checks: JsonCheck[];
  verdict: 'pass' | 'fail';
}
interface JsonReport {
  design: string;
  verdict: 'pass' | 'fail';
  corners: JsonCorner[];
  limiting: { corner: string; check: string; kind: string; margin: number | null } | null;
}

function report(name: string, ...extra: string[]): { code: number; json: JsonReport; stdout: string } {
  const run = cli('check', design(name), '--json', ...extra);
  expect(run.stderr).toBe('');
  return { code: run.code, json: JSON.parse(run.stdout) as JsonReport, stdout: run.stdout };
}

describe('phasegap check --json', () => {
  const { code, json } = report('doubler');

  it('passes the demo design with exit 0', () => {
    expect(code).toBe(0);
    expect(json.design).toBe('doubler-clock');
    expect(json.verdict).toBe('pass');
  });

  it('lists every corner of the product with its process, supply (V), temperature (C) and duty', () => {
    expect(json.corners).toHaveLength(45);
    const expected: string[] = [];
    for (const p of ['tt', 'ss', 'ff', 'fs', 'sf'])
      for (const v of ['1.62V', '1.8V', '1.98V']) for (const t of ['-40C', '27C', '125C']) expected.push(`${p}/${v}/${t}`);
    expect(json.corners.map((c) => c.name)).toEqual(expected);
    const c = json.corners.find((x) => x.name === 'ss/1.62V/125C')!;
    expect([c.process, c.vdd, c.temperature, c.duty]).toEqual(['ss', 1.62, 125, 0.5]);
  });

  it('gives both dead times per corner in seconds, the clean gap below the 50 % dead time', () => {
    for (const c of json.corners) {
      expect(c.deadTimes.map((d) => [d.from, d.to])).toEqual([
        ['p1', 'p2'],
        ['p2', 'p1'],
      ]);
      for (const d of c.deadTimes) {
        // SI seconds: a dead time of this generator is between 100 ps and 10 ns, never ps-valued numbers.
        expect(d.t50).toBeGreaterThan(100e-12);
        expect(d.t50).toBeLessThan(10e-9);
        expect(d.gap).toBeLessThan(d.t50);
        expect(d.gap).toBeGreaterThan(0);
      }
    }
  });

  it('gives each phase width in seconds, less than the period', () => {
    for (const c of json.corners) {
      expect(Object.keys(c.widths).sort()).toEqual(['p1', 'p2']);
      for (const w of Object.values(c.widths)) {
        expect(w).toBeGreaterThan(0);
        expect(w).toBeLessThan(50e-9);
      }
    }
  });

  it('gives checks with kind, name, margin and pass, and corner verdicts that follow from them', () => {
    for (const c of json.corners) {
      expect(c.checks.length).toBeGreaterThan(0);
      for (const k of c.checks) {
        expect(typeof k.kind).toBe('string');
        expect(typeof k.name).toBe('string');
        expect(typeof k.pass).toBe('boolean');
        if (k.margin !== null) expect(k.pass).toBe(k.margin >= 0);
      }
      expect(c.verdict).toBe(c.checks.every((k) => k.pass) ? 'pass' : 'fail');
    }
    const kinds = new Set(json.corners.flatMap((c) => c.checks.map((k) => k.kind)));
    for (const kind of ['non-overlap', 'dead-time-min', 'dead-time-max', 'width-min']) expect(kinds.has(kind)).toBe(true);
  });

  it('names the limiting corner and check: the least margin of all', () => {
    const all = json.corners.flatMap((c) => c.checks.map((k) => ({ corner: c.name, check: k.name, margin: k.margin! })));
    const least = all.reduce((a, b) => (b.margin < a.margin ? b : a));
    expect(json.limiting).toMatchObject({ corner: least.corner, check: least.check, margin: least.margin });
  });

  it('measures the requirement margins from the dead times it reports', () => {
    // The demo requires at least 500 ps dead time.
    const c = json.corners.find((x) => x.name === 'ff/1.98V/-40C')!;
    const check = c.checks.find((k) => k.kind === 'dead-time-min' && k.name.startsWith('dead p1->p2'))!;
    expect(check.margin).toBeCloseTo(c.deadTimes[0]!.t50 - 500e-12, 20);
  });

  it('is deterministic: two runs print the same bytes but for the date they record', () => {
    const first = report('doubler').stdout;
    expect(first).toMatch(/"date": "\d{4}-\d\d-\d\dT[\d:.]+Z"/);
    expect(withoutStamp(first)).toBe(withoutStamp(report('doubler').stdout));
  });
});

describe('phasegap check exit codes', () => {
  it("passes sc-integrator (exit 0) and reports its early phases' widths", () => {
    const { code, json } = report('sc-integrator');
    expect(code).toBe(0);
    expect(json.verdict).toBe('pass');
    expect(Object.keys(json.corners[0]!.widths).sort()).toEqual(['p1', 'p1e', 'p2', 'p2e']);
  });

  it("fails too-tight (exit 1) wherever its handover is closer than the model's switch-instant error, ngspice's three failing corners among them", () => {
    const { code, json } = report('too-tight');
    expect(code).toBe(1);
    expect(json.verdict).toBe('fail');
    expect(json.limiting!.margin).toBeLessThan(0);
    expect(json.limiting!.corner).toBe('sf/1.98V/125C');
    const passing = json.corners.filter((c) => c.verdict === 'pass').map((c) => c.name);
    // Every corner below 125 C and every 125 C corner but tt/1.98V, ff and sf keeps enough handover
    // beside the error band (3.1 % of the handover's path, src/switches/instant-band.ts; measured):
    // 38 pass, 7 fail. tt/1.98V/125C misses by 3.1 ps once the band is off (raw model +39.0 ps,
    // ngspice +38.5 ps); ff/1.62V, ff/1.8V and sf/1.62V at 125 C pass on the model alone (+31.2,
    // +2.8, +26.9 ps; ngspice +42.8, +4.7, +12.7 ps) and fail with the band; ff/1.98V, sf/1.8V and
    // sf/1.98V at 125 C fail on the model alone as in ngspice, the limiting one sf/1.98V/125C at
    // -65.5 ps (ngspice -53.7 ps).
    expect(passing).toEqual([
      'tt/1.62V/-40C',
      'tt/1.62V/27C',
      'tt/1.62V/125C',
      'tt/1.8V/-40C',
      'tt/1.8V/27C',
      'tt/1.8V/125C',
      'tt/1.98V/-40C',
      'tt/1.98V/27C',
      'ss/1.62V/-40C',
      'ss/1.62V/27C',
      'ss/1.62V/125C',
      'ss/1.8V/-40C',
      'ss/1.8V/27C',
      'ss/1.8V/125C',
      'ss/1.98V/-40C',
      'ss/1.98V/27C',
      'ss/1.98V/125C',
      'ff/1.62V/-40C',
      'ff/1.62V/27C',
      'ff/1.8V/-40C',
      'ff/1.8V/27C',
      'ff/1.98V/-40C',
      'ff/1.98V/27C',
      'fs/1.62V/-40C',
      'fs/1.62V/27C',
      'fs/1.62V/125C',
      'fs/1.8V/-40C',
      'fs/1.8V/27C',
      'fs/1.8V/125C',
      'fs/1.98V/-40C',
      'fs/1.98V/27C',
      'fs/1.98V/125C',
      'sf/1.62V/-40C',
      'sf/1.62V/27C',
      'sf/1.8V/-40C',
      'sf/1.8V/27C',
      'sf/1.98V/-40C',
      'sf/1.98V/27C',
    ]);
    // ngspice 39 fails break-before-make at these (test/checks/switch-band.test.ts): none passes here.
    for (const c of ['ff/1.98V/125C', 'sf/1.8V/125C', 'sf/1.98V/125C']) expect(passing).not.toContain(c);
  });

  it('exits 1 in table mode too', () => {
    expect(cli('check', design('too-tight')).code).toBe(1);
  });
});

describe('phasegap check on a generator that never settles', () => {
  function netlistDesign(name: string, phases: string, gates: string[]): string {
    const path = join(tempDir(), `${name}.yaml`);
    writeFileSync(
      path,
      [
        `name: ${name}`,
        `process: ${JSON.stringify(processCard('generic180'))}`,
        'clock: { frequency: 1MHz }',
        'generator:',
        '  template: netlist',
        `  phases: ${phases}`,
        '  gates:',
        ...gates.map((g) => `    - ${g}`),
        '',
      ].join('\n'),
    );
    return path;
  }

  it('reports a gated ring oscillator as a failed steady-state check with the reason (exit 1)', () => {
    const path = netlistDesign('gated-ring', '[r1, r2]', [
      '{ name: g0, cell: NAND2, inputs: [clk, r3], output: r1 }',
      '{ name: g1, cell: INV, inputs: [r1], output: r2 }',
      '{ name: g2, cell: INV, inputs: [r2], output: r3 }',
    ]);
    const run = cli('check', path, '--json');
    expect(run.code).toBe(1);
    const json = JSON.parse(run.stdout) as JsonReport & { corners: Array<JsonCorner & { reason?: string }> };
    expect(json.verdict).toBe('fail');
    expect(json.corners[0]!.reason).toMatch(/^the generator oscillates: /);
    expect(json.corners[0]!.deadTimes).toEqual([]);
    expect(json.limiting).toMatchObject({ check: 'periodic steady state', margin: null });
    expect(cli('check', path).stdout).toContain('FAIL (the generator oscillates');
  });
});

describe('phasegap check table', () => {
  const run = cli('check', design('doubler'));
  const { json } = report('doubler');

  it('prints one row per corner with the dead times in ps', () => {
    const lines = run.stdout.split('\n');
    for (const c of json.corners) {
      const row = lines.find((l) => l.startsWith(`${c.name} `));
      expect(row, c.name).toBeDefined();
      expect(row).toContain(String(Math.round(c.deadTimes[0]!.t50 * 1e12)));
    }
  });

  it('marks the smallest and largest dead time of the column', () => {
    const rowOf = (name: string) => run.stdout.split('\n').find((l) => l.startsWith(`${name} `))!;
    const min = json.corners.reduce((a, b) => (b.deadTimes[0]!.t50 < a.deadTimes[0]!.t50 ? b : a));
    const max = json.corners.reduce((a, b) => (b.deadTimes[0]!.t50 > a.deadTimes[0]!.t50 ? b : a));
    expect(rowOf(min.name)).toContain(`${Math.round(min.deadTimes[0]!.t50 * 1e12)} v`);
    expect(rowOf(max.name)).toContain(`${Math.round(max.deadTimes[0]!.t50 * 1e12)} ^`);
  });

  it('names the limiting corner and quantity and the verdict', () => {
    expect(run.stdout).toContain(`limiting: ${json.limiting!.check} at ${json.limiting!.corner}`);
    expect(run.stdout).toMatch(/verdict: PASS \(45\/45 corners pass\)/);
  });
});

describe('phasegap check -o', () => {
  it('writes the same JSON to the file atomically, with no temporary file left and nothing on stdout', () => {
    const dir = tempDir();
    const out = join(dir, 'report.json');
    const run = cli('check', design('doubler'), '--json', '-o', out);
    expect(run.code).toBe(0);
    expect(run.stdout).toBe('');
    expect(withoutStamp(readFileSync(out, 'utf8'), true)).toBe(withoutStamp(report('doubler').stdout, true));
    expect(JSON.parse(readFileSync(out, 'utf8')).provenance.command).toEqual(['check', design('doubler'), '--json', '-o', out]);
    expect(readdirSync(dir)).toEqual(['report.json']);
  });

  it('writes the table to a file and replaces an existing one', () => {
    const dir = tempDir();
    const out = join(dir, 'report.txt');
    expect(cli('check', design('too-tight'), '-o', out).code).toBe(1);
    expect(readFileSync(out, 'utf8')).toContain('verdict: FAIL');
    expect(cli('check', design('doubler'), '-o', out).code).toBe(0);
    expect(withoutStamp(readFileSync(out, 'utf8'), true)).toBe(withoutStamp(cli('check', design('doubler')).stdout, true));
    expect(readdirSync(dir)).toEqual(['report.txt']);
  });

  it('prints to stdout with -o -', () => {
    const run = cli('check', design('doubler'), '--json', '-o', '-');
    expect(withoutStamp(run.stdout, true)).toBe(withoutStamp(report('doubler').stdout, true));
  });
});

describe('the compiled binary', () => {
  // `npm test` builds before vitest runs, so dist/ holds the shipped JavaScript.
  it('runs check on the demo design from dist/ with exit 0', () => {
    const main = join(ROOT, 'dist', 'src', 'cli', 'main.js');
    expect(existsSync(main), 'dist/src/cli/main.js is missing: run npm run build').toBe(true);
    const pkg = JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')) as { bin: Record<string, string> };
    expect(pkg.bin.phasegap).toBe('dist/src/cli/main.js');
    const run = spawnSync(process.execPath, [main, 'check', 'fixtures/designs/doubler.yaml'], { cwd: ROOT, encoding: 'utf8' });
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    expect(run.stdout).toContain('verdict: PASS');
    expect(readFileSync(main, 'utf8').startsWith('#!/usr/bin/env node')).toBe(true);
  });
});

describe('phasegap check: switch terminals', () => {
  interface BiasCheck extends JsonCheck {
    switch?: string;
    phase?: string;
    detail?: string;
  }

  it('exits 1 on doubler-unboosted.yaml with an off-state failure on s_chg in phase 2 that names reverse conduction', () => {
    const run = cli('check', design('doubler-unboosted'), '--json');
    expect(run.code).toBe(1);
    const json = JSON.parse(run.stdout) as JsonReport;
    const failing = json.corners.flatMap((c) => c.checks as BiasCheck[]).filter((k) => !k.pass);
    const off = failing.filter((k) => k.kind === 'off-state');
    expect(off).toHaveLength(json.corners.length);
    for (const k of off) {
      expect(k.switch).toBe('s_chg');
      expect(k.phase).toBe('phase p2');
      expect(k.detail).toMatch(/reverse conduction/);
    }
    // Only the power stage fails: every timing check still passes, which no delay chain would change.
    expect(failing.every((k) => ['off-state', 'stress'].includes(k.kind) && k.switch === 's_chg')).toBe(true);
    expect(json.limiting?.kind).toBe('stress');
  });

  it('tells the designer that no delay chain fixes it, instead of pointing to tune', () => {
    const run = cli('check', design('doubler-unboosted'));
    expect(run.stderr).toMatch(/hint: no delay chain can fix s_chg \(off-state, stress\)/);
    expect(run.stderr).not.toMatch(/phasegap tune/);
    expect(run.stdout).toMatch(/off-state\s+s_chg holds off\s+-1\.96 V\s+ff\/1\.98V\/125C\s+FAIL at 45 corners/);
  });

  it('passes the boosted doubler.yaml with every bias check met and no warning', () => {
    const run = cli('check', design('doubler'), '--json');
    expect(run.code).toBe(0);
    const json = JSON.parse(run.stdout) as JsonReport & { warnings: string[] };
    expect(json.warnings).toEqual([]);
    const kinds = new Set(json.corners[0]!.checks.map((c) => c.kind));
    for (const k of ['off-state', 'on-state', 'stress']) expect(kinds.has(k)).toBe(true);
  });

  it('warns in the text and the JSON when a switch uses the older signal form', () => {
    const dir = tempDir();
    const file = join(dir, 'old.yaml');
    const text = readFileSync(design('too-tight'), 'utf8')
      .replace(/nodes:[\s\S]*?switches:/, 'switches:')
      .replace('terminals: [lv, 0V]', 'signal: 0V')
      .replace('terminals: [2vdd, hv]', 'signal: 2vdd')
      .replace('../processes/', `${processCard('generic180').replace(/generic180\.yaml$/, '')}`);
    writeFileSync(file, text);
    const run = cli('check', file);
    expect(run.stdout).toMatch(/warning: s_low: terminals undeclared/);
    expect(run.stdout).toMatch(/limited: 2 warnings above/);
    const json = JSON.parse(cli('check', file, '--json').stdout) as { warnings: string[] };
    expect(json.warnings).toHaveLength(2);
  });
});

describe('phasegap check verdict headline and --junit', () => {
  it('heads the text with the combined verdict and its part, exits with it, and writes one test case per check and failing corner', () => {
    const dir = tempDir();
    const file = join(dir, 'check.xml');
    const run = cli('check', design('too-tight'), '--junit', file);
    expect(run.code).toBe(1);
    expect(run.stdout.split('\n').slice(0, 3)).toEqual([
      'verdict: FAIL (fails: corner checks)',
      '  corner checks: FAIL: 38 of 45 corners pass; limiting: s_high/s_low break-before-make + 50.0 ps at sf/1.98V/125C',
      '  not run here: Monte Carlo yield, simulator agreement',
    ]);
    const xml = readFileSync(file, 'utf8');
    const failingCorners = (xml.match(/<testcase classname="[^"]+" name="[^"]+ at [^"]+">\s*<failure/g) ?? []).length;
    const report = JSON.parse(cli('check', design('too-tight'), '--json').stdout);
    const failing = report.corners.flatMap((c: { checks: Array<{ pass: boolean }> }) => c.checks.filter((k) => !k.pass)).length;
    expect(failingCorners).toBe(failing);
    // A bad --junit target is refused before anything is written.
    const bad = cli('check', design('doubler'), '--junit', dir);
    expect(bad.code).toBe(2);
    expect(bad.stderr).toMatch(/^phasegap: error: --junit: .* is a directory/);
    expect(readdirSync(dir)).toEqual(['check.xml']);
  });
});

describe('phasegap check on the unboosted pump at all 45 corners', () => {
  it('check of the unboosted pump collapses below its output minimum at every corner: s_out has no overdrive with the top plate clamped near VDD + |V_TP|', () => {
    const run = cli('check', design('doubler-unboosted-pump'), '--json');
    const report = JSON.parse(run.stdout) as {
      corners: { name: string; circuit: { method: string; output: number }; checks: { kind: string; pass: boolean }[] }[];
    };
    expect(report.corners).toHaveLength(45);
    for (const c of report.corners) {
      const vdd = Number(/\/([\d.]+)V\//.exec(c.name)![1]);
      // output minimum 1.75 VDD; with the ideal 50 uA load the output keeps falling, 25 mV a period (2.5 pC on 100 pF): no periodic
      // steady state. The output printed is where the solver stopped (-5.5 V at 44 corners, 2.0 V at ff/1.62V/27C, where the first
      // round gave up), below the minimum either way.
      expect(c.circuit.method, c.name).toBe('none');
      expect(c.circuit.output, c.name).toBeLessThan(1.75 * vdd);
      expect(c.checks.find((k) => k.kind === 'output-min')!.pass, c.name).toBe(false);
    }
  });
});

describe('phasegap check prints an unsettled circuit without its solver-stopped figures', () => {
  it("leaves the unboosted pump's output, ripple, R out, efficiency and lost charge blank and keeps R ssl", () => {
    const run = cli('check', design('doubler-unboosted-pump'), ...TYPICAL_ONLY);
    const row = run.stdout.split('\n').find((l) => l.startsWith('tt/1.8V/27C (unsettled)'))!;
    // corner, V out, ripple, R out, R ssl (two words), R fsl, efficiency, lost/period, start-up (two words)
    expect(row.trim().split(/\s+/).slice(2)).toEqual(['-', '-', '-', '4.97', 'kohm', '-', '-', '-', 'not', 'reached']);
  });
});
