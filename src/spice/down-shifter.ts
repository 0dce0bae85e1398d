/**
 * A switch's level shifter to a low level below ground, at transistor level: the mirror of the
 * cross-coupled shifter up from the core (level-shifter.ts), common practice for a negative level
 * converter.
 *
 * An ideal voltage-controlled source copies the gate net (or VDD - v for an inverting shifter) into
 * the shifter's input, on the core supply. An inverter gives the complement, and a skewed buffer (a
 * weak p first stage with a capacitor, then an inverter) delays only the falling edge of the set
 * side's drive. Two p pull-ups from the core supply (set side on the buffered input, reset side on
 * the complement) pull the two latch nodes up to VDD against two n devices cross-coupled to the low
 * level; a capacitor on each latch node sets the delay. The output inverter, between the low and the
 * high level, drives the switch's gate from the set-side latch node: the output falls when that
 * node is pulled up, and rises when the latch pulls it down.
 *
 * Bodies: the deck's ground is the p substrate, so the core's n devices keep their bulk at 0. The
 * shifter's n devices on the low level (latch and output) sit in p-wells isolated by a deep n-well
 * (a triple-well process, as a switch with its body below ground needs too), tied to the shifter's
 * low level, the most negative voltage any of their terminals sees; the deep n-well's own bias and
 * junction capacitance are not in the deck. p devices sit in n-wells in the substrate, which cannot
 * go below ground: the output p device's n-well is at the high level, or at ground when the high
 * level is below it (its threshold then carries the body effect). The latch swings from the low
 * level to VDD, so the high level must not be above VDD (the deck refuses it). Timing only: the
 * latch and the output n device see more than a core device may stand, and no rating is checked.
 */
import type { DeviceGeometry } from './cells.js';
import type { DownShifterSizing } from '../switches/down-shifter-sizing.js';
import { latchCapLines, shifterFrontLines, shifterMosfet, shifterNodes, type ShifterRails } from './level-shifter.js';
import { spiceComment } from './text.js';

/** The lines of one shifter named `id` from deck node `input` to `output` (see shifterLines). */
export function downShifterLines(
  id: string,
  label: string,
  input: string,
  output: string,
  shifter: { invert: boolean; delay: number },
  rails: ShifterRails & { readonly outputWell: string },
  size: DownShifterSizing,
  geometry: DeviceGeometry,
): string[] {
  const { nModel: n, pModel: p } = geometry;
  const [, b, , set, x, y] = shifterNodes(id);
  const m = shifterMosfet(id, geometry);
  const { vdd, low, high } = rails;
  return [
    spiceComment(
      `${label}: cross-coupled level shifter down to a low level below ground${shifter.invert ? ', inverting' : ''} (input copied by an ideal source,` +
        ' complement inverter, skewed buffer on the set side, p pull-ups against a cross-coupled n latch on the low level,' +
        ' output inverter from the low to the high level; n devices on the low level in a deep-n-well p-well at the low level)',
    ),
    ...shifterFrontLines(id, label, input, shifter, vdd, size, geometry),
    m('p1', x, set, vdd, vdd, p, size.pullUp),
    m('p2', y, b, vdd, vdd, p, size.pullUp),
    m('n1', x, y, low, low, n, size.latchN),
    m('n2', y, x, low, low, n, size.latchN),
    ...latchCapLines(id, size.latchCap),
    m('o1', output, x, low, low, n, size.outputN),
    m('o2', output, x, high, rails.outputWell, p, size.outputP),
  ];
}
