/**
 * A corner's steady-state waveforms as VCD signals: each shown net changes at its 50 % crossings,
 * each switch is a wire that is 1 while it conducts (its widest window over the signal range).
 * Time 0 is the clock's rising 50 % point; the period is repeated `periods` times.
 */
import type { CornerResult } from '../../analysis/evaluate.js';
import type { CompiledNetlist } from '../../netlist/netlist.js';
import { signalRows, type NetChoice } from '../rows.js';
import { netWave } from '../waveform.js';
import { wrapTime } from '../../measure/wrap-time.js';
import type { VcdChange, VcdSignal } from './vcd.js';

/**
 * Changes of a periodic 0/1 signal over (0, periods*T): instants within one period, repeated. An
 * instant at 0 is the dump's initial value in the first period and a change at every later start.
 */
function repeat(instants: ReadonlyArray<{ t: number; value: 0 | 1 }>, period: number, periods: number): VcdChange[] {
  const out: VcdChange[] = [];
  for (let k = 0; k < periods; k++) for (const e of instants) if (k > 0 || e.t > 0) out.push({ time: e.t + k * period, value: e.value });
  return out.sort((a, b) => a.time - b.time);
}

/** Instants are placed in [0, T); one within `tol` of T counts as 0 (rounding of the period start). */
function inPeriod(t: number, period: number): number {
  const w = wrapTime(t, period);
  return w > period * (1 - 1e-9) ? 0 : w;
}

export function vcdSignals(result: CornerResult, netlist: CompiledNetlist, nets: NetChoice, periods: number): VcdSignal[] {
  const T = result.simulation.period;
  const signals: VcdSignal[] = [];
  for (const row of signalRows(netlist, nets)) {
    const wave = netWave(result, netlist, row.net);
    const instants = wave.ramps.map((r) => ({ t: inPeriod(r.t50, T), value: (r.rising ? 1 : 0) as 0 | 1 })).sort((a, b) => a.t - b.t);
    // The value at time 0 is the one after any change at 0 itself.
    const atZero = instants.filter((e) => e.t === 0);
    const initial = atZero.length > 0 ? atZero[atZero.length - 1]!.value : wave.initial;
    signals.push({
      scope: row.role === 'internal' ? ['internal'] : [],
      name: row.net,
      initial,
      changes: repeat(instants, T, periods),
    });
  }
  for (const s of result.switches) {
    if (s.status !== 'switching') continue;
    const on = inPeriod(s.on - result.simulation.windowStart, T);
    const off = inPeriod(s.off - result.simulation.windowStart, T);
    const conducting = on < off ? on === 0 : true;
    const instants = [
      { t: on, value: 1 as const },
      { t: off, value: 0 as const },
    ];
    signals.push({ scope: ['switches'], name: s.name, initial: conducting && off !== 0 ? 1 : 0, changes: repeat(instants, T, periods) });
  }
  return signals;
}
