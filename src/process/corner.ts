/** One PVT corner: a named process corner, a supply and a temperature, plus the clock duty. */
import { formatCelsius, formatVolts } from '../units/format.js';

export interface Corner {
  /** Name like `ss/1.62V/125C`, with `/duty0.47` when the duty axis varies. */
  readonly name: string;
  /** Process corner name from the card (tt, ss, ff, fs, sf, ...). */
  readonly process: string;
  /** Supply, V. */
  readonly vdd: number;
  /** Junction temperature, °C. */
  readonly temperature: number;
  /** Input clock duty cycle, fraction high. */
  readonly duty: number;
}

export function cornerName(process: string, vdd: number, temperature: number, duty?: number): string {
  const base = `${process}/${formatVolts(vdd)}/${formatCelsius(temperature)}`;
  return duty === undefined ? base : `${base}/duty${Number(duty.toFixed(4))}`;
}
