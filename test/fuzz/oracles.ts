/**
 * The properties every case must keep, checked on its exit code, its streams and every file it
 * wrote. External judges: xmllint (libxml2-utils) for SVG, ngspice -b for decks, iverilog for
 * Verilog, sigrok-cli for VCD (cross-checked with the strict reader in vcd-parser.ts).
 */
import { execFile } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { basename, join } from 'node:path';
import { MARKER } from './hostile.js';
import { writesFile, type Case } from './cases.js';
import type { RunResult, Workspace } from './execute.js';
import { readVcdStrict } from './vcd-parser.js';

export interface Violation {
  /** The property broken: one word-ish class name used to group failures. */
  readonly property: string;
  readonly detail: string;
}

interface ToolRun {
  readonly status: number | null;
  readonly stdout: string;
  readonly stderr: string;
  readonly missing: boolean;
}

function tool(cmd: string, args: readonly string[], cwd: string, timeoutMs = 60_000): Promise<ToolRun> {
  return new Promise((resolve) => {
    execFile(
      cmd,
      [...args],
      { cwd, timeout: timeoutMs, maxBuffer: 64 * 1024 * 1024, encoding: 'utf8', killSignal: 'SIGKILL' },
      (error, stdout, stderr) => {
        const e = error as (NodeJS.ErrnoException & { code?: string | number }) | null;
        resolve({ status: e ? (typeof e.code === 'number' ? e.code : -1) : 0, stdout, stderr, missing: e?.code === 'ENOENT' });
      },
    );
  });
}

const available = new Map<string, boolean>();
export async function hasTool(cmd: string): Promise<boolean> {
  if (!available.has(cmd)) available.set(cmd, !(await tool('which', [cmd], '/')).status);
  return available.get(cmd)!;
}

const STACK = /^\s+at\s.+(\(.*:\d+:\d+\)|:\d+:\d+)$/m;
/** User markup that reached a page unescaped: every markup payload carries "pgx" (see hostile.ts). */
const RAW_MARKUP = /<\s*(script[^>]*>[^<]*pgx|img\s+src=x\s+onerror|\/?pgx|!--pgx)|!\[CDATA\[pgx|\son\w+=["']?pgx/i;

function filesUnder(dir: string): string[] {
  if (!existsSync(dir)) return [];
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const path = join(dir, e.name);
    return e.isDirectory() && !e.isSymbolicLink() ? filesUnder(path) : [path];
  });
}

/** Properties of the run itself: exit code, streams, time, memory, global state. */
export function runProperties(r: RunResult): Violation[] {
  const v: Violation[] = [];
  if (r.timedOut) v.push({ property: 'hang', detail: `no exit within the time limit (${r.ms} ms)` });
  if (r.outOfMemory) v.push({ property: 'memory', detail: 'ran out of its heap limit' });
  if (r.died) v.push({ property: 'crash', detail: r.died.split('\n').slice(0, 4).join(' | ') });
  if (r.thrown) v.push({ property: 'crash', detail: r.thrown.split('\n').slice(0, 4).join(' | ') });
  if (!r.timedOut && !r.outOfMemory && !r.died && !r.thrown && r.code !== undefined && ![0, 1, 2].includes(r.code)) {
    v.push({ property: 'exit-code', detail: `exit ${r.code}: ${r.stderr.split('\n').slice(0, 3).join(' | ').slice(0, 400)}` });
  }
  if (/internal error/i.test(r.stderr) || STACK.test(r.stderr)) {
    v.push({
      property: 'crash',
      detail: `stack trace or internal error on stderr: ${r.stderr.split('\n').slice(0, 4).join(' | ').slice(0, 400)}`,
    });
  }
  // Text for a terminal must not carry the file's control characters (escape sequences, carriage returns).
  const control = /[\x00-\x08\x0b-\x1f\x7f\x9b]/.exec(r.stderr) ?? /[\x00-\x08\x0b-\x1f\x7f\x9b]/.exec(r.stdout);
  if (control)
    v.push({
      property: 'terminal-control',
      detail: `raw control character U+${control[0].charCodeAt(0).toString(16).padStart(4, '0')} on ${control.input === r.stderr ? 'stderr' : 'stdout'}: ${JSON.stringify(control.input.slice(Math.max(0, control.index - 60), control.index + 20))}`,
    });
  if (r.polluted.length > 0) v.push({ property: 'prototype-pollution', detail: `Object.prototype gained ${r.polluted.join(', ')}` });
  return v;
}

async function checkSvg(path: string, cwd: string): Promise<Violation[]> {
  const v: Violation[] = [];
  const lint = await tool('xmllint', ['--noout', '--nonet', path], cwd);
  if (lint.status !== 0)
    v.push({
      property: 'malformed-svg',
      detail: `${basename(path)}: xmllint: ${lint.stderr.split('\n').slice(0, 2).join(' | ').slice(0, 300)}`,
    });
  else {
    const active = await tool(
      'xmllint',
      [
        '--nonet',
        '--xpath',
        "count(//*[local-name()='script' or local-name()='foreignObject'] | //@*[starts-with(local-name(),'on')])",
        path,
      ],
      cwd,
    );
    if (active.stdout.trim() !== '0')
      v.push({
        property: 'svg-injection',
        detail: `${basename(path)}: ${active.stdout.trim()} script/foreignObject elements or on* attributes`,
      });
  }
  const text = readFileSync(path, 'utf8');
  if (RAW_MARKUP.test(text))
    v.push({ property: 'svg-injection', detail: `${basename(path)}: user markup unescaped: ${RAW_MARKUP.exec(text)![0].slice(0, 60)}` });
  return v;
}

const DECK_COMMANDS = new Set([
  '.include',
  '.param',
  '.options',
  '.temp',
  '.tran',
  '.meas',
  '.nodeset',
  '.end',
  '.subckt',
  '.ends',
  '.model',
]);

async function checkDeck(path: string, ws: Workspace): Promise<Violation[]> {
  const v: Violation[] = [];
  const text = readFileSync(path, 'utf8');
  const lines = text.split(/\r\n|\n|\r/);
  // src/spice/deck.ts and models.ts write only the commands in DECK_COMMANDS, one .include, and .end last.
  for (const line of lines) {
    const command = /^\s*(\.\w+)/.exec(line)?.[1]?.toLowerCase();
    if (command !== undefined && !DECK_COMMANDS.has(command))
      v.push({ property: 'spice-injection', detail: `deck line ${JSON.stringify(line.slice(0, 80))}` });
  }
  if (lines.filter((l) => /^\s*\.include\b/i.test(l)).length !== 1)
    v.push({ property: 'spice-injection', detail: 'more than one .include line' });
  const last = lines.filter((l) => l.trim() !== '').at(-1) ?? '';
  const ends = lines.filter((l) => /^\s*\.end\s*$/i.test(l)).length;
  if (last.trim().toLowerCase() !== '.end' || ends !== 1)
    v.push({ property: 'spice-injection', detail: `.end is not the single last line (${ends} .end lines)` });
  if (await hasTool('ngspice')) {
    const runDir = mkdtempSync(join(ws.dir, 'ngspice-'));
    const sim = await tool('ngspice', ['-b', path], runDir, 120_000);
    if (sim.status !== 0 || /error/i.test(sim.stderr)) {
      v.push({
        property: 'malformed-spice',
        detail: `ngspice -b exit ${sim.status}: ${sim.stderr
          .split('\n')
          .filter((l) => /error/i.test(l))
          .slice(0, 2)
          .join(' | ')
          .slice(0, 300)}`,
      });
    }
  }
  return v;
}

/** The module name src/cli/commands/verilog.ts derives from the design name (restated: its rule is the expectation). */
function moduleName(designName: string): string {
  const base = designName.replace(/[^A-Za-z0-9_]/g, '_');
  return /^[A-Za-z_]/.test(base) ? base : `m_${base}`;
}

/** The module types iverilog elaborated, read from its vvp output (".scope module, "instance" "type""). */
async function checkVerilog(path: string, c: Case, ws: Workspace, designName: string | undefined): Promise<Violation[]> {
  const v: Violation[] = [];
  const vvp = join(mkdtempSync(join(ws.dir, 'iverilog-')), 'out.vvp');
  const compile = await tool('iverilog', ['-o', vvp, path], ws.dir);
  if (compile.status !== 0 || compile.stderr.trim() !== '') {
    v.push({
      property: 'malformed-verilog',
      detail: `iverilog exit ${compile.status}: ${compile.stderr.split('\n').slice(0, 2).join(' | ').slice(0, 300)}`,
    });
    return v;
  }
  const types = new Set(
    [...readFileSync(vvp, 'utf8').matchAll(/\.scope module, "(?:[^"\\]|\\.)*" "((?:[^"\\]|\\.)*)"/g)].map((m) => m[1]!),
  );
  const got = [...types].sort();
  const name = designName === undefined ? (got[0] ?? '') : moduleName(designName);
  const expected = c.args.includes('--testbench') ? [name, `${name}_tb`] : [name];
  if (JSON.stringify(got) !== JSON.stringify(expected)) {
    v.push({
      property: 'verilog-injection',
      detail: `modules ${JSON.stringify(got).slice(0, 200)}, expected ${JSON.stringify(expected).slice(0, 200)}`,
    });
  }
  return v;
}

async function checkVcd(path: string, cwd: string): Promise<Violation[]> {
  const v: Violation[] = [];
  const reading = readVcdStrict(readFileSync(path, 'latin1'));
  for (const p of reading.problems.slice(0, 3)) v.push({ property: 'malformed-vcd', detail: p });
  const sigrok = await tool('sigrok-cli', ['-I', 'vcd', '-i', path, '-O', 'vcd'], cwd);
  if (sigrok.status !== 0)
    v.push({ property: 'malformed-vcd', detail: `sigrok-cli exit ${sigrok.status}: ${sigrok.stderr.slice(0, 200)}` });
  else if (reading.problems.length === 0) {
    // sigrok flattens scopes into one list of channels; their number must match the declarations.
    const channels = [...sigrok.stdout.matchAll(/^\$var wire 1 \S+ (.+) \$end$/gm)].length;
    if (channels !== reading.vars.length)
      v.push({ property: 'malformed-vcd', detail: `sigrok-cli reads ${channels} channels, the file declares ${reading.vars.length}` });
  }
  return v;
}

function checkHtml(path: string): Violation[] {
  const text = readFileSync(path, 'utf8');
  const v: Violation[] = [];
  if (RAW_MARKUP.test(text))
    v.push({ property: 'html-injection', detail: `user markup unescaped: ${RAW_MARKUP.exec(text)![0].slice(0, 60)}` });
  if (!/^<!doctype html>/i.test(text.trimStart()) || !/<\/html>\s*$/i.test(text))
    v.push({ property: 'malformed-html', detail: 'no doctype or no closing </html>' });
  if ((text.match(/<script\b/gi) ?? []).length !== (text.match(/<\/script>/gi) ?? []).length)
    v.push({ property: 'html-injection', detail: 'unbalanced <script> tags' });
  return v;
}

function checkMarkdown(path: string): Violation[] {
  // Code spans and fenced blocks show their text literally; outside them, raw HTML is live.
  const text = readFileSync(path, 'utf8')
    .replace(/```[\s\S]*?```/g, '')
    .replace(/(`+)[^`]*?\1/g, '');
  return RAW_MARKUP.test(text)
    ? [{ property: 'markdown-html', detail: `user markup outside code: ${RAW_MARKUP.exec(text)![0].slice(0, 60)}` }]
    : [];
}

function checkJson(text: string, where: string): Violation[] {
  try {
    JSON.parse(text);
    return [];
  } catch (error) {
    return [{ property: 'malformed-json', detail: `${where}: ${(error as Error).message.slice(0, 120)}` }];
  }
}

/** RFC 4180 records; every record must have the header's number of fields. */
function checkCsv(path: string): Violation[] {
  const text = readFileSync(path, 'utf8');
  const records: number[] = [];
  let fields = 1;
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i]!;
    if (quoted) {
      if (ch === '"' && text[i + 1] === '"') i++;
      else if (ch === '"') quoted = false;
    } else if (ch === '"') quoted = true;
    else if (ch === ',') fields++;
    else if (ch === '\n') {
      records.push(fields);
      fields = 1;
    }
  }
  if (quoted) return [{ property: 'malformed-csv', detail: 'unterminated quoted field' }];
  const bad = records.findIndex((n) => n !== records[0]);
  return bad >= 0 ? [{ property: 'malformed-csv', detail: `record ${bad + 1} has ${records[bad]} fields, the header ${records[0]}` }] : [];
}

/** Properties of what the run wrote. */
export async function outputProperties(c: Case, ws: Workspace, r: RunResult, designName: string | undefined): Promise<Violation[]> {
  const v: Violation[] = [];
  const written = filesUnder(ws.outDir);
  const leftovers = written.filter((f) => /\.tmp$/.test(f));
  if (leftovers.length > 0)
    v.push({ property: 'partial-write', detail: `temporary files left: ${leftovers.map((f) => basename(f)).join(', ')}` });
  const marker = filesUnder(ws.dir).filter((f) => basename(f) === MARKER);
  if (marker.length > 0) v.push({ property: 'spice-injection', detail: `an injected shell command ran: ${marker.join(', ')}` });
  if (r.code === 2 && written.length > 0)
    v.push({ property: 'partial-write', detail: `exit 2 but wrote ${written.map((f) => basename(f)).join(', ')}` });
  if (r.code !== 0 && r.code !== 1) return v;
  if (writesFile(c) && !existsSync(ws.outPath))
    v.push({ property: 'missing-output', detail: `exit ${r.code} without ${basename(ws.outPath)}` });
  if (c.args.includes('--json') && !writesFile(c)) v.push(...checkJson(r.stdout, 'stdout'));
  for (const file of written) {
    if (!statSync(file).isFile()) continue;
    if (file.endsWith('.svg')) v.push(...(await checkSvg(file, ws.dir)));
    else if (file.endsWith('.cir')) v.push(...(await checkDeck(file, ws)));
    else if (file.endsWith('.v')) v.push(...(await checkVerilog(file, c, ws, designName)));
    else if (file.endsWith('.vcd')) v.push(...(await checkVcd(file, ws.dir)));
    else if (file.endsWith('.html')) v.push(...checkHtml(file));
    else if (file.endsWith('.md')) v.push(...checkMarkdown(file));
    else if (file.endsWith('.json')) v.push(...checkJson(readFileSync(file, 'utf8'), basename(file)));
    else if (file.endsWith('.csv')) v.push(...checkCsv(file));
  }
  return v;
}

export function ensureDir(path: string): string {
  mkdirSync(path, { recursive: true });
  return path;
}
