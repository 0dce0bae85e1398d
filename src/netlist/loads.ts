/** Net loads: fanout pin capacitance + declared extra capacitance + the driver's own parasitic (docs/physics.md, "Gate delay"). */
import { inputError, type IssuePath } from '../errors.js';
import { parasiticCapacitance } from '../cells/library.js';
import { capacitancePerWidth, gatePinCapacitance, unitWidths } from '../cells/card-widths.js';
import type { ProcessCard } from '../schema/process.js';
import type { CompiledNetlist } from './netlist.js';

/** Extra capacitance on named nets, F, and the design-file path that declared it. */
export interface ExtraLoads {
  readonly path: IssuePath;
  readonly caps: Readonly<Record<string, number>>;
}

/**
 * Total capacitance on every net, F: the netlist's own delay capacitors plus each set of extra
 * loads. A name that is not a net is an input error at that set's path.
 */
export function netLoads(net: CompiledNetlist, card: ProcessCard, ...extras: readonly ExtraLoads[]): Float64Array {
  const unit = unitWidths(card);
  const c = capacitancePerWidth(card);
  const pins = gatePinCapacitance(net, card);
  const load = new Float64Array(net.netNames.length);
  for (let n = 0; n < net.netNames.length; n++) {
    for (let i = net.fanoutStart[n]!; i < net.fanoutStart[n + 1]!; i++) load[n]! += pins[net.fanoutGate[i]!]!;
    const d = net.driver[n]!;
    if (d >= 0) load[n]! += parasiticCapacitance(net.gateCell[d]!, net.gateSize[d]!, unit, c);
  }
  for (const { path, caps } of [{ path: ['generator'], caps: net.source.loads }, ...extras]) {
    for (const [name, cap] of Object.entries(caps)) {
      const id = net.netIndex.get(name);
      if (id === undefined)
        throw inputError('reference.unknown', [...path, name], name, `is not a net of the generator; nets are ${net.netNames.join(', ')}`);
      load[id]! += cap;
    }
  }
  return load;
}
