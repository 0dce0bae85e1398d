/**
 * Energy the generator's gates draw per period beyond C V^2 of their nets: each gate's
 * short-circuit current while its input ramps and the input-to-output (Miller) overlap of its
 * devices, which sees the input and the output swing in opposite directions (the edge itself:
 * process/gate-edge.ts).
 *
 * Per period, with the input rising then falling: the pull-up's charge while the input rises
 * (all of it crosses to ground), and the pull-up's charge while it falls less the output net's
 * C V (what C V^2 already counts). The overlap C_M also costs the input's driver C_M V more than
 * the pin capacitance counts: the overlap's far side falls by V while that driver holds its net
 * high, so it delivers 2 C_M V a period: C_M V^2.
 */
import { CELLS, cellWidths } from '../cells/library.js';
import type { CycleIndex } from '../measure/phases.js';
import { wrapTime } from '../measure/wrap-time.js';
import type { CompiledNetlist } from '../netlist/netlist.js';
import type { CornerDevices } from '../process/device.js';
import { gateEdge, type GateEdges } from '../process/gate-edge.js';
import { overlapPerWidth } from '../process/gate-edge.js';

/**
 * Input ramps are taken to the picosecond (s): the short-circuit charge grows about linearly with
 * the ramp, so that moves a gate's part by under 1 % of itself, and the Monte Carlo dies of a
 * corner, whose ramps differ by less, share one integration per gate through a cache.
 */
const RAMP_GRID = 1e-12;
/** Entries a cache holds before it starts over. */
const CACHE_LIMIT = 100_000;

/** Each gate's energy by gate, corner, causing pins and ramps. */
export type GateEnergyCache = Map<string, number>;

/**
 * Pin of gate g whose edge causes the output's rising (`rising`) or falling edge: the input whose
 * opposite edge came last before it (every library cell inverts), with that edge's transition;
 * null when no input switches once each way.
 */
function causingPin(
  netlist: CompiledNetlist,
  cycles: CycleIndex,
  g: number,
  time: number,
  rising: boolean,
): { pin: number; transition: number } | null {
  let best = Infinity;
  let found: { pin: number; transition: number } | null = null;
  const start = netlist.gateInputStart[g]!;
  for (let k = start; k < netlist.gateInputStart[g + 1]!; k++) {
    const input = cycles.cycle(netlist.netNames[netlist.gateInputs[k]!]!);
    if (typeof input === 'string') continue;
    const wait = wrapTime(time - (rising ? input.fall : input.rise), cycles.period);
    if (wait < best) {
      best = wait;
      found = { pin: k - start, transition: rising ? input.fallTransition : input.riseTransition };
    }
  }
  return found;
}

/**
 * What every gate of the generator draws per period beyond C V^2 of the nets, J. Each cell is
 * its inverter-equivalent (the library's pull-down and pull-up widths) switched by the input that
 * causes each edge. Input 0 sits at the top of a series stack, next to the output (as the deck
 * builds cells), so only its stacked device overlaps the output; a parallel device always does.
 * The overlaps of the inputs that hold still during an edge load the output like any capacitor
 * to a quiet net; that of the input whose fall raises the output costs its driver C_M V^2 more
 * (see the header).
 */
export function generatorGateEnergy(
  netlist: CompiledNetlist,
  loads: ArrayLike<number>,
  devices: CornerDevices,
  cycles: CycleIndex,
  cache?: GateEnergyCache,
): number {
  const { card, vdd, corner } = devices;
  if (cache && cache.size > CACHE_LIMIT) cache.clear();
  const covN = overlapPerWidth(card.n);
  const covP = overlapPerWidth(card.p);
  let energy = 0;
  for (let g = 0; g < netlist.gateCount; g++) {
    const out = netlist.gateOutput[g]!;
    const cycle = cycles.cycle(netlist.netNames[out]!);
    if (typeof cycle === 'string') continue;
    const kind = netlist.gateCell[g]!;
    const shape = CELLS[kind];
    const w = cellWidths(kind, netlist.gateSize[g]!, card.unit);
    const overlap = (pin: number) =>
      covN * (shape.nSeries === 1 || pin === 0 ? w.wn : 0) + covP * (shape.pSeries === 1 || pin === 0 ? w.wp : 0);
    let overlaps = 0;
    for (let pin = 0; pin < shape.inputs; pin++) overlaps += overlap(pin);
    const fall = causingPin(netlist, cycles, g, cycle.fall, false);
    const rise = causingPin(netlist, cycles, g, cycle.rise, true);
    if (!fall || !rise) continue;
    const inputRise = Math.round(fall.transition / RAMP_GRID) * RAMP_GRID;
    const inputFall = Math.round(rise.transition / RAMP_GRID) * RAMP_GRID;
    const key = `${g}|${corner.process}|${vdd}|${corner.temperature}|${fall.pin}|${rise.pin}|${inputRise}|${inputFall}`;
    const known = cache?.get(key);
    if (known !== undefined) {
      energy += known;
      continue;
    }
    // The net's load counts these drains' overlaps twice (cells/card-widths.ts); the edge takes them apart.
    const others = loads[out]! - 2 * overlaps;
    const edges = (pin: number, inputRise: number, inputFall: number): GateEdges => ({
      pullDown: { device: devices.n, w: w.pullDown, l: card.lmin },
      pullUp: { device: devices.p, w: w.pullUp, l: card.lmin },
      load: others + overlaps - overlap(pin),
      miller: overlap(pin),
      inputRise,
      inputFall,
      vdd,
    });
    const down = gateEdge(edges(fall.pin, inputRise, inputFall), true).charge;
    const up = gateEdge(edges(rise.pin, inputRise, inputFall), false).charge;
    const extra = vdd * (down + up - loads[out]! * vdd) + overlap(rise.pin) * vdd * vdd;
    cache?.set(key, extra);
    energy += extra;
  }
  return energy;
}
