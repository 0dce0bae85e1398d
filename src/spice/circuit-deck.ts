/**
 * A transient deck of the whole pump at one corner: the generator's deck (cells, level shifters,
 * switches as devices) with the switches on the circuit's nodes, the capacitors with their
 * bottom-plate parasitics, each node's own capacitance, the rails, the piecewise-linear diodes
 * (a B source with the solver's segments, so the diode is the model's) and the load.
 *
 * Periodic steady state: every circuit node starts (.ic) at the solver's steady-state voltage for
 * the deck's time 0, so a long output time constant need not be waited out from discharged
 * capacitors; the deck then runs SETTLE_STARTUPS times the model's start-up periods (within
 * MIN_PERIODS..MAX_PERIODS), which shrinks any difference between the solver's steady state and
 * the simulator's a thousandfold, and measures the output mean of each of the last SETTLE_WINDOW
 * periods, so the reader can check that the simulation has settled (circuit-measures.ts) rather
 * than trust the starting point.
 */
import type { ResolvedDesign } from '../analysis/resolve.js';
import { evaluateCorner } from '../analysis/evaluate.js';
import type { Corner } from '../process/corner.js';
import { buildNetwork } from '../circuit/network.js';
import type { CornerCircuit } from '../circuit/corner-circuit.js';
import { classifyTerminal } from '../schema/circuit.js';
import { levelAt, parseLevel, type Level } from '../schema/level.js';
import { wrapTime } from '../measure/wrap-time.js';
import { inputError } from '../errors.js';
import { generatorDeck, deckWindow, type DeckOptions } from './deck.js';
import { spiceNodeNames, spiceNumber } from './names.js';
import { spiceComment, spiceInlineComment } from './text.js';

/** Periods simulated per start-up period of the model (from discharged to 90 %: 10^-3 of a start error is left after three). */
export const SETTLE_STARTUPS = 3;
export const MIN_PERIODS = 12;
export const MAX_PERIODS = 300;
/** Periods at the end of the run whose output means are measured, vout_1 (oldest) .. vout_SETTLE_WINDOW (last). */
export const SETTLE_WINDOW = 8;
/**
 * Largest internal time step as a fraction of the period: coarser than the generator deck's
 * (deck.ts, generatorMaxStep), since a circuit runs up to MAX_PERIODS periods.
 */
const MAX_STEP = 1 / 1000;

/**
 * The model's figures the simulator is compared with (SI units); null where the solver reached no
 * periodic steady state (method none): its figures are then where it stopped, not the circuit's.
 */
export interface ModelCircuitFigures {
  /** Mean output, V. */
  readonly output: number | null;
  /** Peak-to-peak ripple, V. */
  readonly ripple: number | null;
  readonly efficiency: number | null;
  /** Charge lost per period, C. */
  readonly lostCharge: number | null;
  /** W; null when unsettled. */
  readonly power: { readonly input: number; readonly generator: number; readonly output: number } | null;
}

/** A DC source whose charge per period is measured: its energy is volts times that charge. */
export interface DeckSupply {
  readonly source: string;
  readonly volts: number;
  /** Whether it feeds the circuit (a rail) or the clock generator, its switch bodies and gates. */
  readonly feeds: 'circuit' | 'generator';
}

export interface CircuitDeck {
  readonly text: string;
  readonly corner: Corner;
  readonly vdd: number;
  readonly period: number;
  /** Periods simulated after the deck's first measured period opens. */
  readonly periods: number;
  /** Start and end of the last period, deck time, s. */
  readonly from: number;
  readonly to: number;
  readonly model: ModelCircuitFigures;
  readonly supplies: readonly DeckSupply[];
  /** The load: a current drawn from the output (signed like the output), A, or a resistance, ohm. */
  readonly load: { readonly current: number; readonly resistance: number | null };
  /** Every measurement name the deck writes (lower case). */
  readonly measures: readonly string[];
}

/** The DC sources of a deck that deliver power: `vNAME node 0 DC volts`, any nonzero volts. */
export function deckSupplies(text: string): { source: string; node: string; volts: number }[] {
  const out: { source: string; node: string; volts: number }[] = [];
  for (const line of text.split('\n')) {
    const m = /^(v\S+)\s+(\S+)\s+0\s+DC\s+(\S+)\s*(?:[$;].*)?$/i.exec(line);
    if (m && Number(m[3]) !== 0 && Number.isFinite(Number(m[3])))
      out.push({ source: m[1]!.toLowerCase(), node: m[2]!, volts: Number(m[3]) });
  }
  return out;
}

/** The state at a time into a traced period, by linear interpolation between substep boundaries. */
export function stateAt(times: ArrayLike<number>, voltages: ArrayLike<number>, n: number, t: number): number[] {
  let k = 0;
  while (k + 2 < times.length && times[k + 1]! <= t) k++;
  const t0 = times[k]!;
  const t1 = times[k + 1] ?? t0;
  const w = t1 > t0 ? Math.min(1, Math.max(0, (t - t0) / (t1 - t0))) : 0;
  return Array.from({ length: n }, (_, i) => voltages[k * n + i]! * (1 - w) + voltages[(k + 1) * n + i]! * w);
}

/** Periods to simulate for a model start-up of `startup` periods (null: not reached). */
export function settlePeriods(startup: number | null): number {
  if (startup === null) return MAX_PERIODS;
  return Math.min(MAX_PERIODS, Math.max(MIN_PERIODS, Math.ceil(SETTLE_STARTUPS * startup)));
}

function modelFigures(c: CornerCircuit): ModelCircuitFigures {
  if (c.method === 'none') return { output: null, ripple: null, efficiency: null, lostCharge: null, power: null };
  return {
    output: c.output,
    ripple: c.ripple,
    efficiency: c.efficiency,
    lostCharge: c.lostCharge,
    power: { input: c.inputPower, generator: c.generatorPower, output: c.outputPower },
  };
}

export function circuitDeck(resolved: ResolvedDesign, corner: Corner, options: Pick<DeckOptions, 'modelPath'>): CircuitDeck {
  const { design } = resolved;
  const spec = design.circuit;
  if (!spec)
    throw inputError('field.required', ['circuit'], undefined, 'is missing: only a design with a circuit section has a circuit deck');
  const result = evaluateCorner(resolved, corner);
  const circuit = result.circuit;
  if (!result.measurement.ok || !circuit) {
    throw inputError(
      'physics.no-steady-state',
      ['corners'],
      corner.name,
      'cannot be written as a circuit deck: the model finds no steady state there',
    );
  }
  const vdd = corner.vdd;
  const T = 1 / design.clock.frequency;
  const window = deckWindow(T, corner.duty);
  const periods = settlePeriods(circuit.startupCycles);
  const stop = window.start + periods * T;
  const from = stop - T;
  const network = buildNetwork(design, resolved.switches);
  const declared = design.nodes as Readonly<Record<string, unknown>>;
  const taken = new Set(spiceNodeNames(resolved.netlist.netNames).values());
  const nodeName = new Map<string, string>();
  for (const [net, name] of spiceNodeNames(network.nodes.map((n) => `cn_${n}`))) {
    let unique = name;
    for (let k = 2; taken.has(unique); k++) unique = `${name}_${k}`;
    taken.add(unique);
    nodeName.set(net.slice(3), unique);
  }
  const lines: string[] = ['', '* the circuit the switches serve'];
  const rails = new Map<string, string>();
  const railNode = (volts: number): string => {
    if (volts === 0) return '0';
    const key = String(Number(volts.toPrecision(9)));
    let name = rails.get(key);
    if (name === undefined) {
      name = `cr${rails.size + 1}`;
      rails.set(key, name);
      lines.push(`v${name} ${name} 0 DC ${spiceNumber(volts)}`);
    }
    return name;
  };
  const node = (raw: string | number): string => {
    const ref = classifyTerminal(raw, declared, spec.rails);
    if (ref.kind === 'node') return nodeName.get(ref.name)!;
    const name = ref.kind === 'rail' ? ref.name : String(raw);
    const level = Object.hasOwn(spec.rails, name)
      ? spec.rails[name]!
      : Object.hasOwn(declared, name)
        ? (declared[name] as Level)
        : parseLevel(raw)!;
    return railNode(levelAt(level, vdd));
  };
  for (const [net, name] of nodeName)
    lines.push(`cn_${name} ${name} 0 ${spiceNumber(spec.nodeCapacitance)}${spiceInlineComment(`${net}: node capacitance`)}`);
  for (const c of spec.capacitors) {
    const [a, b] = [node(c.between[0]), node(c.between[1])];
    lines.push(`c_${c.name.replace(/[^A-Za-z0-9_]/g, '_')} ${a} ${b} ${spiceNumber(c.value)}${spiceInlineComment(c.name)}`);
    if (c.bottomPlate > 0)
      lines.push(
        `c_${c.name.replace(/[^A-Za-z0-9_]/g, '_')}_bp ${b} 0 ${spiceNumber(c.value * c.bottomPlate)}${spiceInlineComment(`${c.name}: bottom plate`)}`,
      );
  }
  const switchNodes = design.switches.map((s, i): readonly [string, string] => {
    lines.push(`vqs${i} ${node(s.terminals![0])} qs${i} DC 0${spiceInlineComment(`${s.name}: current sense`)}`);
    return [`qs${i}`, node(s.terminals![1])];
  });
  spec.diodes.forEach((d, i) => {
    const v = `v(qd${i},${node(d.cathode)})`;
    lines.push(
      `vqd${i} ${node(d.anode)} qd${i} DC 0${spiceInlineComment(`${d.name}: current sense`)}`,
      `bd${i} qd${i} ${node(d.cathode)} I=${spiceNumber(d.leakage)}*${v}+${spiceNumber(1 / d.resistance)}*max(${v}-${spiceNumber(d.drop)},0)${spiceInlineComment(`${d.name}: piecewise linear`)}`,
    );
  });
  const out = nodeName.get(spec.output)!;
  const sign = circuit.output < 0 ? -1 : 1;
  const load =
    network.load.conductance > 0
      ? { current: 0, resistance: 1 / network.load.conductance }
      : { current: sign * network.load.current, resistance: null };
  if (load.resistance !== null) lines.push(`rload ${out} 0 ${spiceNumber(load.resistance)}`);
  else if (load.current !== 0) lines.push(`iload ${out} 0 DC ${spiceNumber(load.current)}`);
  // The deck's time 0 is the model's time window.start earlier than its period start, modulo T.
  const t0 = wrapTime(result.simulation.windowStart - window.start - circuit.start, T);
  const x0 = stateAt(circuit.trace.times, circuit.trace.voltages, network.nodes.length, t0);
  lines.push("* start at the solver's periodic steady state");
  network.nodes.forEach((n, i) => {
    lines.push(`.ic v(${nodeName.get(n)!})=${spiceNumber(x0[i]!)}`);
  });

  const window3 = (k: number) => `FROM=${spiceNumber(stop - k * T)} TO=${spiceNumber(stop - (k - 1) * T)}`;
  const measures: string[] = [spiceComment(`circuit measurements over the last period(s) of ${periods}`)];
  const names: string[] = [];
  const meas = (name: string, what: string) => {
    names.push(name);
    measures.push(`.meas tran ${name} ${what}`);
  };
  for (let k = SETTLE_WINDOW; k >= 1; k--) meas(`vout_${SETTLE_WINDOW + 1 - k}`, `AVG v(${out}) ${window3(k)}`);
  meas('vout_pp', `PP v(${out}) ${window3(1)}`);
  if (load.resistance !== null) meas('vout_rms', `RMS v(${out}) ${window3(1)}`);
  const clock = `vclock`;
  const clockNode = spiceNodeNames(resolved.netlist.netNames).get(resolved.netlist.netNames[resolved.netlist.clock]!)!;
  meas('e_clock', `INTEG par('-v(${clockNode})*i(${clock})') ${window3(1)}`);
  design.switches.forEach((_, i) => {
    const c = result.switches[i];
    if (c?.status !== 'switching') return;
    const dur = wrapTime(c.on - c.off, T);
    let a = from + wrapTime(c.off - result.simulation.windowStart, T);
    if (a + dur > stop) a -= T;
    meas(`qoff_${i}`, `INTEG i(vqs${i}) FROM=${spiceNumber(a)} TO=${spiceNumber(a + dur)}`);
  });
  spec.diodes.forEach((_, i) => {
    meas(`qrev_${i}`, `INTEG par('min(i(vqd${i}),0)') ${window3(1)}`);
  });

  // Every DC source of the deck delivers power (the supply, switch bodies, rails); the first pass finds them.
  const write = () =>
    generatorDeck(resolved, corner, {
      modelPath: options.modelPath,
      maxStep: MAX_STEP * T,
      circuit: { switchNodes, lines, stop, measures },
    });
  const supplies = deckSupplies(write().text).map(
    (s): DeckSupply => ({ source: s.source, volts: s.volts, feeds: /^vcr\d+$/.test(s.source) ? 'circuit' : 'generator' }),
  );
  for (const s of supplies) meas(`q_${s.source}`, `INTEG i(${s.source}) ${window3(1)}`);
  return {
    text: write().text,
    corner,
    vdd,
    period: T,
    periods,
    from,
    to: stop,
    model: modelFigures(circuit),
    supplies,
    load,
    measures: names,
  };
}
