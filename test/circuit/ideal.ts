/** Small circuit models with ideal timing, built by hand for the solver's reference tests. */
import { capacitanceMatrix, invertCapacitance, type Capacitor } from '../../src/circuit/capacitance.js';
import type { CircuitModel, ModelDiode, ModelSwitch } from '../../src/circuit/model.js';

export interface IdealOptions {
  readonly vdd: number;
  readonly frequency: number;
  /** Flying (pumping) capacitance, F. */
  readonly c: number;
  /** Output capacitance, F. */
  readonly cout: number;
  /** Switch on-resistance, ohm. */
  readonly ron: number;
  /** Dead time after each phase, s. */
  readonly dead?: number;
  /** Capacitance from each pumped node to ground (Dickson's C_s), F. */
  readonly cs?: number;
}

const NODE_C = 1e-15;
const LEAK = 1e-12;

function model(
  nodes: string[],
  rails: number[],
  caps: Capacitor[],
  switches: ModelSwitch[],
  diodes: ModelDiode[],
  phases: [number[], number[]],
  o: IdealOptions,
  output: number,
): CircuitModel {
  const n = nodes.length;
  const all = [...caps, ...nodes.map((_, i) => ({ a: i, b: n, value: NODE_C }))];
  const period = 1 / o.frequency;
  const dead = o.dead ?? 0;
  const state = (on: number[]) => Uint8Array.from(switches.map((_, i) => (on.includes(i) ? 1 : 0)));
  const intervals = [
    { duration: period / 2 - dead, on: state(phases[0]) },
    { duration: dead, on: state([]) },
    { duration: period / 2 - dead, on: state(phases[1]) },
    { duration: dead, on: state([]) },
  ].filter((i) => i.duration > 0);
  return {
    nodes,
    rails: Float64Array.from(rails),
    inverseCapacitance: invertCapacitance(capacitanceMatrix(n, all), n)!,
    intervals,
    start: 0,
    switches,
    channels: [],
    diodes,
    pairs: [],
    output,
    loadCurrent: 0,
    loadConductance: 0,
  };
}

const sw = (name: string, a: number, b: number, ron: number): ModelSwitch => ({ name, a, b, gOn: 1 / ron, gOff: LEAK });

/** Voltage doubler: top 0, bottom 1, out 2; ground 3, vdd 4. Phase 1 charges C to VDD, phase 2 stacks it on VDD. */
export function idealDoubler(o: IdealOptions): CircuitModel {
  const switches = [sw('s_gnd', 1, 3, o.ron), sw('s_chg', 4, 0, o.ron), sw('s_vdd', 4, 1, o.ron), sw('s_out', 0, 2, o.ron)];
  const caps = [
    { a: 0, b: 1, value: o.c },
    { a: 2, b: 3, value: o.cout },
  ];
  return {
    ...model(
      ['top', 'bottom', 'out'],
      [0, o.vdd],
      caps,
      switches,
      [],
      [
        [0, 1],
        [2, 3],
      ],
      o,
      2,
    ),
    pairs: [
      [0, 2],
      [1, 3],
    ],
  };
}

/** Negative pump: top 0, bottom 1, out 2. Phase 1 charges C to VDD, phase 2 grounds the top and hands the bottom (-VDD) to the output. */
export function idealNegativePump(o: IdealOptions): CircuitModel {
  const switches = [sw('s_chg', 4, 0, o.ron), sw('s_gnd', 1, 3, o.ron), sw('s_top', 0, 3, o.ron), sw('s_out', 1, 2, o.ron)];
  const caps = [
    { a: 0, b: 1, value: o.c },
    { a: 2, b: 3, value: o.cout },
  ];
  return model(
    ['top', 'bottom', 'out'],
    [0, o.vdd],
    caps,
    switches,
    [],
    [
      [0, 1],
      [2, 3],
    ],
    o,
    2,
  );
}

/**
 * N-stage Dickson pump with diodes of the given drop: pumped nodes 0..N-1, out N, clock plates
 * N+1 (odd stages) and N+2 (even stages), each driven to ground or VDD by a pair of switches.
 */
export function idealDickson(o: IdealOptions, stages: number, drop: number, rdiode: number): CircuitModel {
  const out = stages;
  const pa = stages + 1;
  const pb = stages + 2;
  const ground = stages + 3;
  const vdd = ground + 1;
  const nodes = [...Array.from({ length: stages }, (_, i) => `n${i + 1}`), 'out', 'clk_a', 'clk_b'];
  const caps: Capacitor[] = [{ a: out, b: ground, value: o.cout }];
  for (let i = 0; i < stages; i++) {
    caps.push({ a: i, b: i % 2 === 0 ? pa : pb, value: o.c });
    if (o.cs) caps.push({ a: i, b: ground, value: o.cs });
  }
  const diodes: ModelDiode[] = [];
  for (let i = 0; i <= stages; i++) {
    diodes.push({ name: `d${i + 1}`, a: i === 0 ? vdd : i - 1, b: i === stages ? out : i, drop, gOn: 1 / rdiode, gOff: LEAK });
  }
  const switches = [
    sw('a_low', pa, ground, o.ron),
    sw('a_high', vdd, pa, o.ron),
    sw('b_high', vdd, pb, o.ron),
    sw('b_low', pb, ground, o.ron),
  ];
  return model(
    nodes,
    [0, o.vdd],
    caps,
    switches,
    diodes,
    [
      [0, 2],
      [1, 3],
    ],
    o,
    out,
  );
}
