/** Volt ticks for a linear scale: one unit (V, or mV when every tick is below 1 V), the decimals the step needs. */
import type { ScaleLinear } from 'd3-scale';

export interface VoltTick {
  /** V */
  readonly value: number;
  readonly label: string;
}

export function voltTicks(scale: ScaleLinear<number, number>, count: number): VoltTick[] {
  const values = scale.ticks(count);
  const [d0, d1] = scale.domain() as [number, number];
  const milli = Math.max(Math.abs(d0), Math.abs(d1)) < 1;
  const unit = milli ? 1e-3 : 1;
  const step = values.length > 1 ? values[1]! - values[0]! : Math.abs(d1 - d0) || 1;
  const decimals = Math.max(0, Math.min(6, Math.ceil(-Math.log10(step / unit) - 1e-9)));
  const zero = (0).toFixed(decimals);
  return values.map((value) => {
    const text = (value / unit).toFixed(decimals);
    return { value, label: `${text === `-${zero}` ? zero : text} ${milli ? 'mV' : 'V'}` };
  });
}

/** A domain around [min, max] with a tenth of the span spare each side (at least 1 mV in all). */
export function paddedDomain(min: number, max: number): [number, number] {
  const span = Math.max(max - min, 1e-3);
  const mid = (min + max) / 2;
  return [mid - span * 0.6, mid + span * 0.6];
}
