/**
 * A fuzz campaign: `runs` cases drawn by fast-check from one seed (so any case replays from the
 * seed and its index), run two at a time, every property checked; returns each case's
 * violations and a summary per property and per command. A failing case's files and command line
 * are kept under `keepDir` for reproduction.
 */
import fc from 'fast-check';
import { cpSync, mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { cpus } from 'node:os';
import { join } from 'node:path';
import { parse } from 'yaml';
import { argv, caseArbitrary, type Case, type CommandName } from './cases.js';
import { layOut, runCase, WorkerRunner, type RunResult } from './execute.js';
import { hasTool, outputProperties, runProperties, type Violation } from './oracles.js';

export interface CampaignOptions {
  readonly runs: number;
  /** Index of the first case (default 0); case i is the same in every campaign of the seed. */
  readonly start?: number;
  readonly seed: number;
  /** Time limit of one run, ms. */
  readonly timeoutMs: number;
  /** Where failing cases are copied (their folder, with a command.txt). */
  readonly keepDir?: string;
  readonly lanes?: number;
  readonly onCase?: (index: number, c: Case, violations: readonly Violation[], r: RunResult) => void;
}

export interface CaseOutcome {
  readonly index: number;
  /** The command and whether it ran in a child process: the case's files are not kept in memory. */
  readonly case: Pick<Case, 'command' | 'child'>;
  readonly code: number | undefined;
  readonly ms: number;
  readonly violations: readonly Violation[];
  readonly kept?: string;
}

export interface Summary {
  readonly seed: number;
  readonly runs: number;
  readonly byProperty: Record<string, number>;
  readonly byCommand: Record<string, { cases: number; failing: number; exit: Record<string, number> }>;
  readonly crashes: number;
  readonly hangs: number;
  readonly malformed: number;
  readonly failing: number;
}

/** The design name the case ends up with (after --set name=...), if the file reads as YAML. */
function designName(c: Case, bytes: Buffer): string | undefined {
  let name: unknown;
  try {
    name = (parse(bytes.toString('utf8'), { logLevel: 'silent' }) as { name?: unknown } | null)?.name;
  } catch {
    name = undefined;
  }
  for (const s of c.sets) {
    if (!s.startsWith('name=')) continue;
    try {
      name = parse(s.slice(5), { logLevel: 'silent' });
    } catch {
      /* the run rejects it */
    }
  }
  return typeof name === 'string' ? name : undefined;
}

/**
 * Case `index` of a campaign, drawn from its own seed (mixed from the campaign's seed and the
 * index), so cases are made one at a time: a long campaign never holds thousands of mutated
 * files at once, and any case replays from the seed and its index alone.
 */
export function drawCase(seed: number, index: number, confirm: boolean): Case {
  const own = (Math.imul(seed | 0, 0x9e3779b1) ^ Math.imul(index + 1, 0x85ebca6b)) | 0;
  return fc.sample(caseArbitrary({ confirm }), { seed: own, numRuns: 1 })[0]!;
}

export async function runCampaign(options: CampaignOptions): Promise<{ outcomes: CaseOutcome[]; summary: Summary }> {
  const confirm = await hasTool('ngspice');
  const lanes = options.lanes ?? Math.max(1, Math.min(2, cpus().length));
  const outcomes: CaseOutcome[] = [];
  const first = options.start ?? 0;
  let next = first;
  const lane = async () => {
    const runner = new WorkerRunner();
    try {
      while (next < first + options.runs) {
        const index = next++;
        const c = drawCase(options.seed, index, confirm);
        const ws = layOut(c);
        const r = await runCase(c, ws, runner, options.timeoutMs);
        const violations = [...runProperties(r), ...(await outputProperties(c, ws, r, designName(c, ws.designBytes)))];
        let kept: string | undefined;
        if (violations.length > 0 && options.keepDir) {
          kept = join(options.keepDir, `case-${index}`);
          mkdirSync(kept, { recursive: true });
          cpSync(ws.dir, kept, { recursive: true, verbatimSymlinks: true });
          writeFileSync(
            join(kept, 'command.txt'),
            `${['phasegap', ...argv(c, ws.designPath, ws.outPath)].map((a) => JSON.stringify(a)).join(' ')}\n` +
              `# seed ${options.seed}, case ${index}\n# ${violations.map((v) => `${v.property}: ${v.detail}`).join('\n# ')}\n`,
          );
        }
        rmSync(ws.dir, { recursive: true, force: true });
        outcomes.push({
          index,
          case: { command: c.command, child: c.child },
          code: r.code,
          ms: r.ms,
          violations,
          ...(kept ? { kept } : {}),
        });
        options.onCase?.(index, c, violations, r);
      }
    } finally {
      await runner.close();
    }
  };
  await Promise.all(Array.from({ length: lanes }, lane));
  outcomes.sort((a, b) => a.index - b.index);
  return { outcomes, summary: summarize(outcomes, options) };
}

export function summarize(outcomes: readonly CaseOutcome[], options: Pick<CampaignOptions, 'seed' | 'runs'>): Summary {
  const byProperty: Record<string, number> = {};
  const byCommand: Summary['byCommand'] = {};
  for (const o of outcomes) {
    const name = o.case.command as CommandName;
    const cmd = byCommand[name] ?? { cases: 0, failing: 0, exit: {} };
    byCommand[name] = cmd;
    cmd.cases++;
    const exit = o.code === undefined ? 'none' : String(o.code);
    cmd.exit[exit] = (cmd.exit[exit] ?? 0) + 1;
    if (o.violations.length > 0) cmd.failing++;
    for (const p of new Set(o.violations.map((v) => v.property))) byProperty[p] = (byProperty[p] ?? 0) + 1;
  }
  const count = (pred: (p: string) => boolean) => outcomes.filter((o) => o.violations.some((v) => pred(v.property))).length;
  return {
    seed: options.seed,
    runs: options.runs,
    byProperty,
    byCommand,
    crashes: count((p) => p === 'crash' || p === 'exit-code' || p === 'memory'),
    hangs: count((p) => p === 'hang'),
    malformed: count((p) => p.startsWith('malformed-') || p.endsWith('-injection') || p === 'markdown-html'),
    failing: outcomes.filter((o) => o.violations.length > 0).length,
  };
}

/** Text for a person: the counts, then the first case of each distinct (property, detail shape). */
export function renderSummary(summary: Summary, outcomes: readonly CaseOutcome[]): string {
  const lines = [
    `fuzz: seed ${summary.seed}, ${summary.runs} cases, ${summary.failing} failing (crashes ${summary.crashes}, hangs ${summary.hangs}, malformed outputs ${summary.malformed})`,
    `by property: ${
      Object.entries(summary.byProperty)
        .map(([p, n]) => `${p} ${n}`)
        .join(', ') || 'none'
    }`,
    'by command:',
    ...Object.entries(summary.byCommand).map(
      ([cmd, s]) =>
        `  ${cmd.padEnd(8)} ${String(s.cases).padStart(5)} cases, ${String(s.failing).padStart(4)} failing, exits ${JSON.stringify(s.exit)}`,
    ),
  ];
  const seen = new Set<string>();
  for (const o of outcomes) {
    for (const v of o.violations) {
      const shape = `${v.property}|${o.case.command}|${v.detail.replace(/\d+/g, 'N').slice(0, 60)}`;
      if (seen.has(shape)) continue;
      seen.add(shape);
      lines.push(
        `  [${v.property}] case ${o.index} (${o.case.command}${o.case.child ? ', child process' : ''}): ${v.detail.slice(0, 300)}${o.kept ? `\n      kept in ${o.kept}` : ''}`,
      );
    }
  }
  return `${lines.join('\n')}\n`;
}
