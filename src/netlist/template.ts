/**
 * Expands the cross-coupled generator templates into netlists (docs/physics.md, "Generator simulation").
 *
 * Both styles: a cross-coupled pair of two-input gates, each fed by the clock (or its complement)
 * and by the far end of the other side's inverter delay chain, with a tapered buffer from each
 * chain end to its phase. Dead time is roughly one gate plus one chain; the buffers add delay to
 * both phases alike (common practice).
 * - nand: x1 = NAND(clk, f2), x2 = NAND(clkb, f1); chain ends are active low, buffers are odd.
 * - nor:  x1 = NOR(clkb, f2),  x2 = NOR(clk, f1);  chain ends are active high, buffers are even.
 * The first phase is active while the clock is high. The feedback to the other side's gate comes
 * from the chain end, or `feedbackTap` buffer inverters later (even, so it keeps its sense), which
 * puts those buffer inverters inside the dead time. The clock takes pin 0 of each gate (the device
 * next to the output) unless clockInput is inner.
 */
import { inputError, type IssuePath } from '../errors.js';
import type { TemplateSpec, NetlistSpec } from '../schema/design.js';
import type { GateSpec, Netlist } from './netlist.js';

/** Default tapered buffers, one per style, each of the count the style needs. */
export const DEFAULT_BUFFERS = { nand: [2, 6, 18], nor: [3, 12] } as const;

export function expandTemplate(input: TemplateSpec): Netlist {
  const spec = { ...input, buffer: input.buffer ?? [...DEFAULT_BUFFERS[input.template]] };
  const stages = spec.stages;
  if (stages % 2 !== 0) {
    throw inputError(
      'netlist.invalid',
      ['generator', 'stages'],
      stages,
      `is odd; the ${spec.template} template needs an even number of inverters per chain (0, 2, 4, ...) so the feedback keeps its sense`,
    );
  }
  const stageSizes = Array.isArray(spec.stageSize) ? spec.stageSize : Array.from({ length: stages }, () => spec.stageSize as number);
  if (stageSizes.length !== stages) {
    throw inputError(
      'netlist.invalid',
      ['generator', 'stageSize'],
      spec.stageSize,
      `lists ${stageSizes.length} sizes; give one per stage (${stages}) or a single number`,
    );
  }
  const bufferParity = spec.template === 'nand' ? 1 : 0;
  checkBuffer(['generator', 'buffer'], spec.buffer, bufferParity, spec.template);
  const earlyBuffer = spec.earlyBuffer ?? spec.buffer;
  if (spec.earlyTap > 0) {
    if (spec.earlyTap % 2 !== 0 || spec.earlyTap > stages) {
      throw inputError(
        'netlist.invalid',
        ['generator', 'earlyTap'],
        spec.earlyTap,
        `must be even and at most the chain length (${stages}); it counts stages back from the chain end`,
      );
    }
    checkBuffer(['generator', 'earlyBuffer'], earlyBuffer, bufferParity, spec.template);
  }
  const feedbackTap = spec.feedbackTap ?? 0;
  if (feedbackTap % 2 !== 0 || feedbackTap > spec.buffer.length) {
    throw inputError(
      'netlist.invalid',
      ['generator', 'feedbackTap'],
      feedbackTap,
      `must be even and at most the buffer length (${spec.buffer.length}); the feedback keeps its sense only after an even number of buffer inverters`,
    );
  }
  const [phase1, phase2] = spec.phases;
  if (phase1 === phase2)
    throw inputError(
      'value.duplicate',
      ['generator', 'phases'],
      spec.phases,
      'names the same net twice; the two phases need distinct names',
    );
  const gates: GateSpec[] = [];
  gates.push({ name: 'u_clkinv', cell: 'INV', size: spec.inputSize, inputs: ['clk'], output: 'clkb' });
  const cell = spec.template === 'nand' ? 'NAND2' : 'NOR2';
  const ownClock = spec.template === 'nand' ? ['clk', 'clkb'] : ['clkb', 'clk'];
  const complements: Record<string, string> = {};
  const early: Record<string, string> = {};
  const chainNets = (side: number): string[] => [`x${side}`, ...stageSizes.map((_, k) => `d${side}_${k + 1}`)];
  for (const side of [1, 2]) {
    const other = 3 - side;
    const phase = side === 1 ? phase1 : phase2;
    const nets = chainNets(side);
    const otherEnd = feedbackNet(chainNets(other), spec.buffer.length, other === 1 ? phase1 : phase2, `b${other}`, feedbackTap);
    const ownEnd = chainEnd(nets, spec.buffer.length, phase);
    const gateOutput = stages === 0 ? ownEnd : nets[0]!;
    const clock = ownClock[side - 1]!;
    gates.push({
      name: `u_gate${side}`,
      cell,
      size: spec.gateSize,
      inputs: spec.clockInput === 'inner' ? [otherEnd, clock] : [clock, otherEnd],
      output: gateOutput,
    });
    stageSizes.forEach((size, k) => {
      const output = k === stages - 1 ? ownEnd : nets[k + 1]!;
      gates.push({ name: `u_chain${side}_${k + 1}`, cell: 'INV', size, inputs: [nets[k]!], output });
    });
    pushBuffer(gates, `u_buf${side}`, `b${side}`, ownEnd, spec.buffer, phase);
    if (spec.complementary) {
      const complement = `${phase}b`;
      complements[phase] = complement;
      const size = spec.complementSize ?? spec.buffer[spec.buffer.length - 1] ?? spec.gateSize;
      gates.push({ name: `u_comp${side}`, cell: 'INV', size, inputs: [phase], output: complement });
    }
    if (spec.earlyTap > 0) {
      const tapIndex = stages - spec.earlyTap;
      const tap = tapIndex === stages ? ownEnd : nets[tapIndex]!;
      const earlyNet = `${phase}e`;
      early[phase] = earlyNet;
      pushBuffer(gates, `u_early${side}`, `e${side}`, tap, earlyBuffer, earlyNet);
    }
  }
  const loads: Record<string, number> = {};
  if (spec.stageLoad > 0) {
    for (const gate of gates) if (gate.name.startsWith('u_chain')) loads[gate.output] = spec.stageLoad;
  }
  return { clock: 'clk', phases: [phase1, phase2], complements, early, gates, loads };
}

/** With no buffer (nor only), the chain end is the phase net itself. */
function chainEnd(nets: readonly string[], bufferLength: number, phase: string): string {
  return bufferLength === 0 ? phase : nets[nets.length - 1]!;
}

/** The net the other side's gate reads: the chain end, or `tap` buffer inverters after it (the phase after the whole buffer). */
function feedbackNet(nets: readonly string[], bufferLength: number, phase: string, netPrefix: string, tap: number): string {
  if (tap === 0) return chainEnd(nets, bufferLength, phase);
  return tap === bufferLength ? phase : `${netPrefix}_${tap}`;
}

function pushBuffer(gates: GateSpec[], prefix: string, netPrefix: string, from: string, sizes: readonly number[], to: string): void {
  let input = from;
  sizes.forEach((size, k) => {
    const output = k === sizes.length - 1 ? to : `${netPrefix}_${k + 1}`;
    gates.push({ name: `${prefix}_${k + 1}`, cell: 'INV', size, inputs: [input], output });
    input = output;
  });
}

function checkBuffer(path: IssuePath, sizes: readonly number[], parity: number, style: string): void {
  if (sizes.length % 2 !== parity) {
    throw inputError(
      'netlist.invalid',
      path,
      sizes,
      `has ${sizes.length} inverters; the ${style} template needs an ${parity === 1 ? 'odd' : 'even'} count so each phase is active high`,
    );
  }
}

/** The two inverter sizes of a BUF of size s: a quarter-size first stage (at least min(1, s)), then s. */
export function bufferStages(size: number): [number, number] {
  return [Math.max(Math.min(1, size), size / 4), size];
}

/**
 * A free-form netlist from the design file; each BUF becomes two inverters (bufferStages)
 * through an internal net `<name>.mid`.
 */
export function expandNetlist(spec: NetlistSpec): Netlist {
  const gates: GateSpec[] = [];
  const origins: number[] = [];
  for (const [g, gate] of spec.gates.entries()) {
    if (gate.cell === 'BUF') {
      if (gate.inputs.length !== 1)
        throw inputError(
          'netlist.invalid',
          ['generator', 'gates', g, 'inputs'],
          gate.inputs,
          `has ${gate.inputs.length} nets; cell BUF takes exactly 1`,
        );
      const mid = `${gate.name}.mid`;
      const [first, second] = bufferStages(gate.size);
      gates.push({ name: `${gate.name}.1`, cell: 'INV', size: first, inputs: gate.inputs.slice(0, 1), output: mid });
      gates.push({ name: `${gate.name}.2`, cell: 'INV', size: second, inputs: [mid], output: gate.output });
      origins.push(g, g);
    } else {
      gates.push({ name: gate.name, cell: gate.cell, size: gate.size, inputs: gate.inputs, output: gate.output });
      origins.push(g);
    }
  }
  return { clock: spec.clock, phases: spec.phases, complements: spec.complements, early: spec.early, gates, loads: {}, origins };
}
