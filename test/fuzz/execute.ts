/**
 * Runs a case: lays out its files in a fresh folder (designs/, processes/, a link to the shipped
 * models, an empty out/), then runs the command in a reusable case process (in-process speed) or
 * a fresh `phasegap` process, each cut off after a time limit and held to a memory limit.
 */
import { fork, spawn, type ChildProcess } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parse } from 'yaml';
import { argv, outExtension, type Case } from './cases.js';
import { applyPlan, oneCorner } from './mutations.js';
import type { WorkerReply, WorkerRequest } from './case-worker.js';

/** The repository root, from test/fuzz or dist/test/fuzz. */
export const ROOT = fileURLToPath(new URL(import.meta.url.includes('/dist/') ? '../../../' : '../../', import.meta.url));
const DIST = join(ROOT, 'dist');
export const MEMORY_MB = 512;

export interface Workspace {
  readonly dir: string;
  readonly designPath: string;
  readonly outDir: string;
  readonly outPath: string;
  readonly designBytes: Buffer;
  readonly cardBytes: Buffer | undefined;
}

export function cardOf(designText: string): string {
  const process = (parse(designText) as { process?: unknown }).process;
  return typeof process === 'string' ? process.replace(/^.*\//, '').replace(/\.yaml$/, '') : 'generic180';
}

export function layOut(c: Case, parent = tmpdir()): Workspace {
  const dir = mkdtempSync(join(parent, 'pgfuzz-'));
  for (const sub of ['designs', 'processes', 'out', 'tmp']) mkdirSync(join(dir, sub));
  symlinkSync(join(ROOT, 'fixtures', 'models'), join(dir, 'models'));
  const base = readFileSync(join(ROOT, 'fixtures', 'designs', `${c.design}.yaml`), 'utf8');
  const designBytes = applyPlan(base, c.designPlan, c.oneCorner ? oneCorner : undefined);
  const designPath = join(dir, 'designs', 'case.yaml');
  writeFileSync(designPath, designBytes);
  // Every shipped card is present, so a design whose process path was renamed may still find one.
  let cardBytes: Buffer | undefined;
  for (const card of ['generic180', 'generic-lp']) {
    const text = readFileSync(join(ROOT, 'fixtures', 'processes', `${card}.yaml`), 'utf8');
    const mutate = c.cardPlan !== undefined && card === cardOf(base);
    const bytes = mutate ? applyPlan(text, c.cardPlan!) : Buffer.from(text);
    if (mutate) cardBytes = bytes;
    writeFileSync(join(dir, 'processes', `${card}.yaml`), bytes);
  }
  const outDir = join(dir, 'out');
  return { dir, designPath, outDir, outPath: join(outDir, `result.${outExtension(c)}`), designBytes, cardBytes };
}

export interface RunResult {
  /** Exit code; undefined when the run was cut off or died. */
  readonly code: number | undefined;
  readonly stdout: string;
  readonly stderr: string;
  readonly thrown: string | undefined;
  readonly timedOut: boolean;
  /** The run died of its memory limit. */
  readonly outOfMemory: boolean;
  /** Died otherwise (a signal, the worker's own error). */
  readonly died: string | undefined;
  readonly polluted: readonly string[];
  readonly ms: number;
}

/** A forked case process reused across cases; replaced after a time-out, a death or a polluted prototype. */
export class WorkerRunner {
  private worker: ChildProcess | undefined;
  private stderr = '';
  private next = 0;

  private spawn(): ChildProcess {
    const worker = fork(join(DIST, 'test', 'fuzz', 'case-worker.js'), [], {
      execArgv: [`--max-old-space-size=${MEMORY_MB}`],
      stdio: ['ignore', 'ignore', 'pipe', 'ipc'],
      env: { ...process.env, CI: '1' },
    });
    this.stderr = '';
    worker.stderr!.setEncoding('utf8').on('data', (d: string) => {
      this.stderr = (this.stderr + d).slice(-20_000);
    });
    return worker;
  }

  run(args: readonly string[], timeoutMs: number): Promise<RunResult> {
    this.worker ??= this.spawn();
    const worker = this.worker;
    const id = ++this.next;
    const start = Date.now();
    return new Promise((resolve) => {
      const finish = (r: Omit<RunResult, 'ms'>, keep: boolean) => {
        clearTimeout(timer);
        worker.off('message', onMessage);
        worker.off('exit', onExit);
        if (!keep) {
          worker.kill('SIGKILL');
          this.worker = undefined;
        }
        resolve({ ...r, ms: Date.now() - start });
      };
      const blank = { code: undefined, stdout: '', stderr: '', thrown: undefined, polluted: [] as string[] };
      const timer = setTimeout(() => finish({ ...blank, timedOut: true, outOfMemory: false, died: undefined }, false), timeoutMs);
      const onMessage = (reply: WorkerReply) => {
        if (reply.id !== id) return;
        finish({ ...reply, timedOut: false, outOfMemory: false, died: undefined }, reply.polluted.length === 0);
      };
      const onExit = (code: number | null, signal: string | null) => {
        // Let the last of its stderr arrive before judging why it died.
        setTimeout(() => {
          const oom = /heap out of memory|Allocation failed/i.test(this.stderr);
          finish(
            {
              ...blank,
              stderr: this.stderr,
              timedOut: false,
              outOfMemory: oom,
              died: oom ? undefined : `case process exited (${signal ?? code}): ${this.stderr.slice(-300)}`,
            },
            false,
          );
        }, 50);
      };
      worker.on('message', onMessage);
      worker.on('exit', onExit);
      const request: WorkerRequest = { id, argv: args };
      worker.send(request);
    });
  }

  async close(): Promise<void> {
    this.worker?.kill('SIGKILL');
    this.worker = undefined;
  }
}

/** `node --max-old-space-size=512 dist/src/cli/main.js ...` in the case folder, SIGKILLed on time-out. */
export function runChild(args: readonly string[], cwd: string, timeoutMs: number): Promise<RunResult> {
  const start = Date.now();
  // A process's arguments cannot hold a NUL byte (a shell cannot pass one either): drop it here;
  // in-process cases still receive it.
  const argv = args.map((a) => a.replaceAll('\u0000', ''));
  return new Promise((resolve) => {
    const child = spawn(process.execPath, [`--max-old-space-size=${MEMORY_MB}`, join(DIST, 'src', 'cli', 'main.js'), ...argv], {
      cwd,
      env: { ...process.env, TMPDIR: join(cwd, 'tmp'), CI: '1' },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let stdout = '';
    let stderr = '';
    child.stdout.setEncoding('utf8').on('data', (d: string) => {
      if (stdout.length < 4_000_000) stdout += d;
    });
    child.stderr.setEncoding('utf8').on('data', (d: string) => {
      if (stderr.length < 4_000_000) stderr += d;
    });
    let timedOut = false;
    const timer = setTimeout(() => {
      timedOut = true;
      child.kill('SIGKILL');
    }, timeoutMs);
    child.on('error', (error) => {
      clearTimeout(timer);
      resolve({
        code: undefined,
        stdout,
        stderr,
        thrown: undefined,
        timedOut: false,
        outOfMemory: false,
        died: `could not start: ${error.message}`,
        polluted: [],
        ms: Date.now() - start,
      });
    });
    child.on('close', (code, signal) => {
      clearTimeout(timer);
      const outOfMemory = /heap out of memory|Allocation failed/i.test(stderr);
      resolve({
        code: code ?? undefined,
        stdout,
        stderr,
        thrown: undefined,
        timedOut,
        outOfMemory,
        died: signal !== null && !timedOut && !outOfMemory ? `killed by ${signal}` : undefined,
        polluted: [],
        ms: Date.now() - start,
      });
    });
  });
}

export function runCase(c: Case, ws: Workspace, runner: WorkerRunner, timeoutMs: number): Promise<RunResult> {
  const args = argv(c, ws.designPath, ws.outPath);
  return c.child ? runChild(args, ws.dir, timeoutMs) : runner.run(args, timeoutMs);
}
