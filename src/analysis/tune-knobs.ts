/**
 * The knobs tune turns on a nand or nor template: chain length, stage size and delay capacitor,
 * and where the template allows them, the output buffer's taper (its last, switch-driving size
 * kept) and the feedback tap (before the buffers, or an even number of buffer inverters after the
 * chain end so the feedback keeps its sense; see src/netlist/template.ts).
 */
import { inputError } from '../errors.js';
import type { Design } from '../schema/design.js';
import { DEFAULT_BUFFERS } from '../netlist/template.js';

export type TemplateGenerator = Extract<Design['generator'], { template: 'nand' | 'nor' }>;

export interface ChainKnobs {
  /** Inverters per feedback chain (even). */
  readonly stages: number;
  /** Size of every chain inverter, or one size per stage when the design lists them (kept as given). */
  readonly stageSize: number | readonly number[];
  /** Extra capacitance on every chain node, F. */
  readonly stageLoad: number;
  /** Output buffer sizes from the chain end to the phase. */
  readonly buffer: readonly number[];
  /** Buffer inverters between the chain end and the feedback (0: the chain end). */
  readonly feedbackTap: number;
}

export function templateOf(design: Design): TemplateGenerator {
  const gen = design.generator;
  if (gen.template === 'netlist') {
    throw inputError(
      'value.invalid',
      ['generator', 'template'],
      'netlist',
      'is a free-form netlist; tune adjusts the delay chains of the nand or nor template',
    );
  }
  return gen;
}

export function ownBuffer(gen: TemplateGenerator): readonly number[] {
  return gen.buffer ?? DEFAULT_BUFFERS[gen.template];
}

export function ownKnobs(gen: TemplateGenerator): ChainKnobs {
  return {
    stages: gen.stages,
    stageSize: gen.stageSize,
    stageLoad: gen.stageLoad,
    buffer: ownBuffer(gen),
    feedbackTap: gen.feedbackTap ?? 0,
  };
}

/** The design with these knobs on its generator. */
export function withKnobs(design: Design, knobs: ChainKnobs): Design {
  const gen = templateOf(design);
  return {
    ...design,
    generator: {
      ...gen,
      stages: knobs.stages,
      stageSize: knobs.stageSize as TemplateGenerator['stageSize'],
      stageLoad: knobs.stageLoad,
      buffer: [...knobs.buffer],
      ...(knobs.feedbackTap > 0 || gen.feedbackTap !== undefined ? { feedbackTap: knobs.feedbackTap } : {}),
    },
  };
}

/** Three significant figures: a size the design file reads back exactly. */
const sig3 = (x: number) => Number(x.toPrecision(3));

/** A geometric taper of `length` inverters ending at `last`, each `ratio` times the one before (at least size 1). */
export function taperedBuffer(last: number, length: number, ratio: number): number[] {
  return Array.from({ length }, (_, k) => Math.max(1, sig3(last / ratio ** (length - 1 - k))));
}

/** Taper ratios tune tries (common practice: a fanout of about 3 to 4 per stage is near the fastest). */
export const TAPERS = [2, 3, 4];

/** Taper ratios searched: none when the buffer has fewer than two inverters (nothing to taper). */
export function searchableTapers(gen: TemplateGenerator): number[] {
  return ownBuffer(gen).length >= 2 ? TAPERS : [];
}

/** Feedback taps the template allows: even counts of buffer inverters, up to the whole buffer. */
export function searchableTaps(gen: TemplateGenerator): number[] {
  const taps: number[] = [];
  for (let k = 0; k <= ownBuffer(gen).length; k += 2) taps.push(k);
  return taps;
}

/** Everything but the load, as a cache key and a combination to search. */
export function comboKey(k: Omit<ChainKnobs, 'stageLoad'>): string {
  return `${k.stages}/${String(k.stageSize)}/${k.buffer.join(',')}/${k.feedbackTap}`;
}

const sameList = (a: readonly number[], b: readonly number[]) => a.length === b.length && a.every((x, i) => x === b[i]);

/** The `--set` overrides that apply a proposal to the design file (buffer and tap only when they change). */
export function proposalOverrides(knobs: ChainKnobs, formatLoad: (farads: number) => string, own?: ChainKnobs): string[] {
  const size = typeof knobs.stageSize === 'number' ? String(knobs.stageSize) : `[${knobs.stageSize.join(',')}]`;
  const out = [`generator.stages=${knobs.stages}`, `generator.stageSize=${size}`, `generator.stageLoad=${formatLoad(knobs.stageLoad)}`];
  if (own && !sameList(own.buffer, knobs.buffer)) out.push(`generator.buffer=[${knobs.buffer.join(',')}]`);
  if (own && own.feedbackTap !== knobs.feedbackTap) out.push(`generator.feedbackTap=${knobs.feedbackTap}`);
  return out;
}
