/**
 * A switch's level shifter in a deck, at transistor level, so the deck shows how the shifter
 * really moves with the corner (the model times the same sized circuit per edge: shifter-edges.ts).
 *
 * Topology: the cross-coupled (ratioed latch) shifter, common practice for a low-to-high level
 * converter. An ideal voltage-controlled source copies the gate net (or its complement VDD - v for
 * an inverting shifter) into the shifter's input, so the shifter loads its net no more than the
 * model assumes: not at all. From that input, on the core supply: an inverter gives the
 * complement, and a skewed buffer (a weak n first stage with a capacitor, then an inverter)
 * delays only the rising edge of the set side's drive. Two n pull-downs (set side on the buffered
 * input, reset side on the complement) pull the two latch nodes to ground against two p devices
 * cross-coupled to the high level; a capacitor on each latch node sets the delay. The output
 * inverter, between the low and the high level, drives the switch's gate from the set-side latch
 * node. Without the skewed buffer the output would rise on one pull-down edge and fall on the
 * slower p-device edge; the buffer evens the two out, since the model has one delay for both.
 * Sizes come from src/switches/shifter-sizing.ts. The deck checks timing only: the latch swings 0 to the high
 * level, more than a core device may stand, and no device rating is checked here.
 */
import type { DeviceGeometry } from './cells.js';
import { mosfet } from './cells.js';
import { spiceNumber } from './names.js';
import type { ShifterSizing } from '../switches/shifter-sizing.js';
import { spiceComment } from './text.js';

/** Deck node of the shifted gate of device `device` of switch `plan` (indices in the design). */
export function shifterNode(plan: number, device: number): string {
  return `ls${plan}_${device}`;
}

export interface ShifterRails {
  /** Node of the core supply, of the output's low level and of its high level. */
  readonly vdd: string;
  readonly low: string;
  readonly high: string;
}

/** The internal nodes of shifter `id`: input copy, its complement, buffer middle, set drive, the two latch nodes. */
export function shifterNodes(id: string): [string, string, string, string, string, string] {
  return ['in', 'inb', 'mid', 'set', 'x', 'y'].map((suffix) => `${id}_${suffix}`) as [string, string, string, string, string, string];
}

/** A device writer for shifter `id`: `m${id}_${name}` with the card's geometry. */
export function shifterMosfet(id: string, geometry: DeviceGeometry) {
  return (name: string, d: string, g: string, s: string, bulk: string, model: string, w: number) =>
    mosfet(`m${id}_${name}`, d, g, s, bulk, model, w, geometry);
}

/** The comment with what a shifter was sized for, and whether its declared delay (s) is faster than that. */
function sizingComment(
  label: string,
  estimate: { readonly rise: number; readonly fall: number; readonly transition: number },
  declared: number,
): string {
  const ps = (value: number) => `${spiceNumber(value * 1e12)} ps`;
  const slowest = Math.max(estimate.rise, estimate.fall);
  return spiceComment(
    `${label}: sized for ${ps(estimate.rise)} rising, ${ps(estimate.fall)} falling, ${ps(estimate.transition)} transition at the card's nominal corner` +
      (slowest > 1.05 * declared ? `; the declared ${ps(declared)} is faster than it can be sized` : ''),
  );
}

/** The ideal source copying the gate net `input` (or its complement vdd - v) onto the shifter's input node `a`. */
function inputCopy(id: string, a: string, vdd: string, input: string, invert: boolean): string {
  return invert ? `e${id} ${a} ${vdd} 0 ${input} 1` : `e${id} ${a} 0 ${input} 0 1`;
}

/**
 * The lines both shifters share, on the core supply node `vdd`: what the shifter was sized for, the
 * input copy, its complement inverter and the skewed buffer driving the set side.
 */
export function shifterFrontLines(
  id: string,
  label: string,
  input: string,
  shifter: { invert: boolean; delay: number },
  vdd: string,
  size: Pick<ShifterSizing, 'inverterN' | 'bufferN' | 'bufferP' | 'bufferCap' | 'estimate'>,
  geometry: DeviceGeometry,
): string[] {
  const { nModel: n, pModel: p } = geometry;
  const [a, b, mid, set] = shifterNodes(id);
  const m = shifterMosfet(id, geometry);
  return [
    sizingComment(label, size.estimate, shifter.delay),
    inputCopy(id, a, vdd, input, shifter.invert),
    m('i1', b, a, '0', '0', n, size.inverterN),
    m('i2', b, a, vdd, vdd, p, 2 * size.inverterN),
    m('b1', mid, a, '0', '0', n, size.bufferN),
    m('b2', mid, a, vdd, vdd, p, size.bufferP),
    ...(size.bufferCap > 0 ? [`c${id}_mid ${mid} 0 ${spiceNumber(size.bufferCap)}`] : []),
    m('b3', set, mid, '0', '0', n, size.inverterN),
    m('b4', set, mid, vdd, vdd, p, 2 * size.inverterN),
  ];
}

/** The capacitors on shifter `id`'s two latch nodes, none when `latchCap` is 0. */
export function latchCapLines(id: string, latchCap: number): string[] {
  const [, , , , x, y] = shifterNodes(id);
  return latchCap > 0 ? [`c${id}_x ${x} 0 ${spiceNumber(latchCap)}`, `c${id}_y ${y} 0 ${spiceNumber(latchCap)}`] : [];
}

/**
 * The lines of one shifter named `id` from deck node `input` to `output`: `shifter` is the design's
 * (inverting or not, its declared delay at the nominal corner, s), `label` names it in the comments.
 */
export function shifterLines(
  id: string,
  label: string,
  input: string,
  output: string,
  shifter: { invert: boolean; delay: number },
  rails: ShifterRails,
  size: ShifterSizing,
  geometry: DeviceGeometry,
): string[] {
  const { nModel: n, pModel: p } = geometry;
  const [, b, , set, x, y] = shifterNodes(id);
  const m = shifterMosfet(id, geometry);
  return [
    spiceComment(
      `${label}: cross-coupled level shifter${shifter.invert ? ', inverting' : ''} (input copied by an ideal source, complement inverter,` +
        ' skewed buffer on the set side, n pull-downs against a cross-coupled p latch on the high level, output inverter from the low to the high level)',
    ),
    ...shifterFrontLines(id, label, input, shifter, rails.vdd, size, geometry),
    m('n1', x, set, '0', '0', n, size.pullDown),
    m('n2', y, b, '0', '0', n, size.pullDown),
    m('p1', x, y, rails.high, rails.high, p, size.latchP),
    m('p2', y, x, rails.high, rails.high, p, size.latchP),
    ...latchCapLines(id, size.latchCap),
    m('o1', output, x, rails.low, '0', n, size.outputN),
    m('o2', output, x, rails.high, rails.high, p, size.outputP),
  ];
}
