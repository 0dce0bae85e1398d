/**
 * Runs the hand-written reference decks of this folder in ngspice (Debian package ngspice) at
 * every corner of their designs and puts the model's numbers beside the simulator's. The decks
 * are plain text written by hand; this file only sets their corner line and reads their
 * .meas results, so nothing here shares code with the product's deck writer.
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import { loadDesign } from '../../src/cli/load.js';
import { resolveDesign, type ResolvedDesign } from '../../src/analysis/resolve.js';
import { evaluateAll } from '../../src/analysis/evaluate.js';
import { CycleIndex } from '../../src/measure/phases.js';
import { wrapTime } from '../../src/measure/wrap-time.js';
import { sampleRankCorrelation } from 'simple-statistics';
import type { Corner } from '../../src/process/corner.js';

const run = promisify(execFile);
export const HERE = fileURLToPath(new URL('.', import.meta.url));

/** The decks' process corners, written by hand from devices.lib's parameters (same as ref18.yaml). */
const DECK_CORNERS: Readonly<Record<string, string>> = {
  tt: 'dvthn=0 kn=1 dvthp=0 kp=1',
  ss: 'dvthn=0.05 kn=0.85 dvthp=0.05 kp=0.85',
  ff: 'dvthn=-0.05 kn=1.15 dvthp=-0.05 kp=1.15',
  fs: 'dvthn=-0.05 kn=1.15 dvthp=0.05 kp=0.85',
  sf: 'dvthn=0.05 kn=0.85 dvthp=-0.05 kp=1.15',
};

/** The deck with its corner line set and its includes made absolute. */
export function deckAt(deck: string, corner: Corner): string {
  const text = readFileSync(join(HERE, deck), 'utf8');
  const shift = DECK_CORNERS[corner.process];
  if (!shift) throw new Error(`no deck corner ${corner.process}`);
  return text
    .replace(/^\.param vdd=.*$/m, `.param vdd=${corner.vdd} tc=${corner.temperature} ${shift}`)
    .replace(/^\.include (\S+)$/gm, (_, file: string) => `.include ${join(HERE, file)}`);
}

/** .meas results by name, s. */
export function parseMeasures(output: string): Record<string, number> {
  const out: Record<string, number> = {};
  for (const m of output.matchAll(/^(\w+)\s+=\s+([-+0-9.eE]+)/gm)) out[m[1]!] = Number(m[2]);
  return out;
}

/** Runs decks, `parallel` at a time; returns their .meas results in order. */
export async function simulate(decks: readonly string[], parallel = 2): Promise<Record<string, number>[]> {
  const folder = mkdtempSync(join(tmpdir(), 'phasegap-reference-'));
  try {
    const results: Record<string, number>[] = new Array(decks.length);
    let next = 0;
    const worker = async (): Promise<void> => {
      while (next < decks.length) {
        const i = next++;
        const file = join(folder, `deck${i}.cir`);
        writeFileSync(file, decks[i]!);
        const { stdout, stderr } = await run('ngspice', ['-b', file], { maxBuffer: 16 * 1024 * 1024 });
        results[i] = parseMeasures(`${stdout}\n${stderr}`);
      }
    };
    await Promise.all(Array.from({ length: parallel }, worker));
    return results;
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}

export function resolveReference(name: string): ResolvedDesign {
  const loaded = loadDesign(join(HERE, name));
  return resolveDesign(loaded.design, loaded.card);
}

/** One phase edge: 50 % time and 10-90 % time, s (absolute for the model, in-period for ngspice). */
export interface Edge {
  readonly t50: number;
  readonly t10: number;
  readonly t90: number;
}

/** Dead times, clean gaps and 10-90 % times of the phases at one corner, s. */
export interface PhaseFigures {
  readonly corner: string;
  /** p1 -> p2 and p2 -> p1 at 50 %. */
  readonly dead: readonly [number, number];
  /** p1 -> p2 and p2 -> p1 at 10 % of the supply. */
  readonly gap: readonly [number, number];
  /** The model's gap less its stated error band, what its checks read (ngspice: the gap itself). */
  readonly bound: readonly [number, number];
  /** 10-90 % time of p1 rise, p1 fall, p2 rise, p2 fall. */
  readonly edges: readonly [number, number, number, number];
}

export function spicePhases(corner: string, m: Record<string, number>): PhaseFigures {
  const need = (k: string): number => {
    const v = m[k];
    if (v === undefined || !Number.isFinite(v)) throw new Error(`${corner}: ngspice gave no ${k}`);
    return v;
  };
  return {
    corner,
    dead: [need('p2r50') - need('p1f50'), need('p1r50') - need('p2f50')],
    gap: [need('p2r10') - need('p1f10'), need('p1r10') - need('p2f10')],
    bound: [need('p2r10') - need('p1f10'), need('p1r10') - need('p2f10')],
    edges: [need('p1r90') - need('p1r10'), need('p1f10') - need('p1f90'), need('p2r90') - need('p2r10'), need('p2f10') - need('p2f90')],
  };
}

/** The model's figures for every corner of a generator design, in corner order. */
export function modelPhases(resolved: ResolvedDesign): PhaseFigures[] {
  return evaluateAll(resolved).map((r) => {
    const m = r.measurement;
    if (!m.ok) throw new Error(`${r.corner.name}: ${m.reason}`);
    const c1 = m.cycles.p1!;
    const c2 = m.cycles.p2!;
    const e = (t: number): number => 0.8 * t;
    return {
      corner: r.corner.name,
      dead: [m.deadTimes[0].t50, m.deadTimes[1].t50],
      gap: [m.deadTimes[0].gap, m.deadTimes[1].gap],
      bound: [m.deadTimes[0].gapBound, m.deadTimes[1].gapBound],
      edges: [e(c1.riseTransition), e(c1.fallTransition), e(c2.riseTransition), e(c2.fallTransition)],
    };
  });
}

/** Four-stage delay n3 -> n7 of the inverter chain, rising and falling edge, s. */
export function modelChain(resolved: ResolvedDesign): Array<{ corner: Corner; rise: number; fall: number }> {
  return evaluateAll(resolved).map((r) => {
    const index = new CycleIndex(r.simulation, resolved.netlist);
    const a = index.cycle('n3');
    const b = index.cycle('n7');
    if (typeof a === 'string' || typeof b === 'string') throw new Error(`${r.corner.name}: chain did not settle`);
    const T = index.period;
    return { corner: r.corner, rise: wrapTime(b.rise - a.rise, T), fall: wrapTime(b.fall - a.fall, T) };
  });
}

export function spiceChain(m: Record<string, number>): { rise: number; fall: number } {
  return { rise: m.n7r50! - m.n3r50!, fall: m.n7f50! - m.n3f50! };
}

/** Model against ngspice on one generator at every corner. */
export interface GeneratorComparison {
  readonly model: PhaseFigures[];
  readonly spice: PhaseFigures[];
  /** (model - ngspice) / ngspice of every dead time. */
  readonly deadErrors: number[];
  /** model - ngspice of every clean gap, s (positive: the model is optimistic). */
  readonly gapErrors: number[];
  /** The same for the gap the checks read (less the model's error band), s. */
  readonly boundErrors: number[];
  /** (model - ngspice) / ngspice of every phase edge's 10-90 % time. */
  readonly edgeErrors: number[];
  /** Spearman rank correlation of the p1 -> p2 dead times over the corners. */
  readonly rank: number;
}

export async function compareGenerator(design: string, deck: string): Promise<GeneratorComparison> {
  const resolved = resolveReference(design);
  const model = modelPhases(resolved);
  const runs = await simulate(resolved.corners.map(({ corner }) => deckAt(deck, corner)));
  const spice = runs.map((m, i) => spicePhases(resolved.corners[i]!.corner.name, m));
  const deadErrors: number[] = [];
  const gapErrors: number[] = [];
  const boundErrors: number[] = [];
  const edgeErrors: number[] = [];
  model.forEach((m, i) => {
    const s = spice[i]!;
    for (let k = 0; k < 2; k++) {
      deadErrors.push((m.dead[k]! - s.dead[k]!) / s.dead[k]!);
      gapErrors.push(m.gap[k]! - s.gap[k]!);
      boundErrors.push(m.bound[k]! - s.gap[k]!);
    }
    for (let k = 0; k < 4; k++) edgeErrors.push((m.edges[k]! - s.edges[k]!) / s.edges[k]!);
  });
  const rank = sampleRankCorrelation(
    model.map((m) => m.dead[0]),
    spice.map((s) => s.dead[0]),
  );
  return { model, spice, deadErrors, gapErrors, boundErrors, edgeErrors, rank };
}

export function median(values: readonly number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const h = s.length >> 1;
  return s.length % 2 ? s[h]! : (s[h - 1]! + s[h]!) / 2;
}

export const maxAbs = (values: readonly number[]): number => Math.max(...values.map(Math.abs));
