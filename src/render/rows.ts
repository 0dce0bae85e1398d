/**
 * Which signals a diagram shows, in order: the input clock (and its complement when the generator
 * makes one), each phase, the complements, the early phases, then with `all` every other net.
 */
import type { CompiledNetlist } from '../netlist/netlist.js';

export type RowRole = 'clock' | 'clock-complement' | 'phase' | 'complement' | 'early' | 'internal';

export interface SignalRow {
  readonly net: string;
  readonly role: RowRole;
  /** 0 or 1 for rows that belong to a phase (the phase, its complement, its early phase). */
  readonly phase: 0 | 1 | null;
}

export const NET_CHOICES = ['phases', 'all'] as const;
export type NetChoice = (typeof NET_CHOICES)[number];

export function signalRows(netlist: CompiledNetlist, nets: NetChoice): SignalRow[] {
  const src = netlist.source;
  const rows: SignalRow[] = [{ net: src.clock, role: 'clock', phase: null }];
  const clockBar = netlist.gateOutput.length > 0 ? complementOfClock(netlist) : null;
  if (clockBar !== null) rows.push({ net: clockBar, role: 'clock-complement', phase: null });
  src.phases.forEach((p, i) => {
    rows.push({ net: p, role: 'phase', phase: i as 0 | 1 });
  });
  src.phases.forEach((p, i) => {
    const c = src.complements[p];
    if (c !== undefined) rows.push({ net: c, role: 'complement', phase: i as 0 | 1 });
  });
  src.phases.forEach((p, i) => {
    const e = src.early[p];
    if (e !== undefined) rows.push({ net: e, role: 'early', phase: i as 0 | 1 });
  });
  if (nets === 'all') {
    const shown = new Set(rows.map((r) => r.net));
    for (const net of netlist.netNames) if (!shown.has(net)) rows.push({ net, role: 'internal', phase: null });
  }
  return rows;
}

/** The output of a single inverter driven by the clock, if the generator has one. */
function complementOfClock(netlist: CompiledNetlist): string | null {
  for (let g = 0; g < netlist.gateCount; g++) {
    if (netlist.gateCell[g] !== 'INV') continue;
    if (netlist.gateInputs[netlist.gateInputStart[g]!] !== netlist.clock) continue;
    const out = netlist.netNames[netlist.gateOutput[g]!]!;
    const src = netlist.source;
    const special = new Set<string>([...src.phases, ...Object.values(src.complements), ...Object.values(src.early)]);
    if (!special.has(out)) return out;
  }
  return null;
}
