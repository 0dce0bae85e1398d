/** Corner sets (docs/physics.md, "Variation"): the cartesian product of the design's axes, or an explicit list. */
import { InputError, inputError, type IssuePath } from '../errors.js';
import type { CornersSpec } from '../schema/design.js';
import type { ProcessCard } from '../schema/process.js';
import { cornerName, type Corner } from './corner.js';
import { devicesAtCorner, processCornerOf, thresholdAt } from './device.js';
import { MAX_CORNERS } from '../schema/limits.js';
import { parseQuantity, parseTemperature } from '../units/quantity.js';

/** A corner with the design-file paths of the values that made it, for error messages. */
export interface SourcedCorner {
  readonly corner: Corner;
  readonly paths: { readonly process: IssuePath; readonly vdd: IssuePath; readonly temperature: IssuePath };
}

export function expandCorners(spec: CornersSpec, card: ProcessCard, nominalDuty: number): SourcedCorner[] {
  if (spec.list && (spec.process || spec.vdd || spec.temperature || spec.duty)) {
    throw inputError(
      'value.invalid',
      ['corners'],
      Object.keys(spec).join(', '),
      'mixes an explicit list with axes; give either `list` or the axes process/vdd/temperature/duty',
    );
  }
  const out: SourcedCorner[] = spec.list ? fromList(spec, nominalDuty) : fromAxes(spec, card, nominalDuty);
  checkCorners(out, card);
  return out;
}

function defaultProcess(card: ProcessCard): string {
  return Object.hasOwn(card.corners, 'tt') ? 'tt' : (Object.keys(card.corners)[0] ?? 'tt');
}

function fromAxes(spec: CornersSpec, card: ProcessCard, nominalDuty: number): SourcedCorner[] {
  const processes = spec.process ?? [defaultProcess(card)];
  const vdds = spec.vdd ?? [card.vddNominal];
  const temperatures = spec.temperature ?? [card.t0];
  const duties = spec.duty ?? [nominalDuty];
  const count = processes.length * vdds.length * temperatures.length * duties.length;
  if (count > MAX_CORNERS) {
    throw inputError(
      'value.too-many',
      ['corners'],
      `${processes.length} x ${vdds.length} x ${temperatures.length} x ${duties.length} = ${count} corners`,
      `is more than ${MAX_CORNERS} corners; list fewer values per axis`,
    );
  }
  const showDuty = duties.length > 1;
  const out: SourcedCorner[] = [];
  for (const [pi, process] of processes.entries())
    for (const [vi, vdd] of vdds.entries())
      for (const [ti, temperature] of temperatures.entries())
        for (const duty of duties) {
          out.push({
            corner: { name: cornerName(process, vdd, temperature, showDuty ? duty : undefined), process, vdd, temperature, duty },
            paths: {
              process: spec.process ? ['corners', 'process', pi] : ['corners', 'process'],
              vdd: spec.vdd ? ['corners', 'vdd', vi] : ['process', 'vddNominal'],
              temperature: spec.temperature ? ['corners', 'temperature', ti] : ['process', 't0'],
            },
          });
        }
  return out;
}

function fromList(spec: CornersSpec, nominalDuty: number): SourcedCorner[] {
  const list = spec.list ?? [];
  const showDuty = list.some((c) => c.duty !== undefined && c.duty !== nominalDuty);
  return list.map((c, i) => {
    const duty = c.duty ?? nominalDuty;
    return {
      corner: {
        name: cornerName(c.process, c.vdd, c.temperature, showDuty ? duty : undefined),
        process: c.process,
        vdd: c.vdd,
        temperature: c.temperature,
        duty,
      },
      paths: {
        process: ['corners', 'list', i, 'process'],
        vdd: ['corners', 'list', i, 'vdd'],
        temperature: ['corners', 'list', i, 'temperature'],
      },
    };
  });
}

/** Every corner must name a process corner of the card and let both devices turn on. */
function checkCorners(corners: readonly SourcedCorner[], card: ProcessCard): void {
  const known = Object.keys(card.corners);
  const seen = new Set<string>();
  for (const { corner, paths } of corners) {
    if (processCornerOf(card, corner.process) === undefined) {
      throw inputError(
        'reference.unknown',
        paths.process,
        corner.process,
        `is not a process corner of card "${card.name}"; it defines ${known.join(', ')}`,
      );
    }
    if (seen.has(corner.name))
      throw inputError('value.duplicate', ['corners'], corner.name, 'appears twice; every corner must be distinct');
    seen.add(corner.name);
    try {
      devicesAtCorner(card, corner);
    } catch (error) {
      if (!(error instanceof InputError)) throw error;
      const threshold = Math.max(thresholdOf(card, 'n', corner), thresholdOf(card, 'p', corner));
      throw inputError(
        'physics.device-off',
        paths.vdd,
        `${corner.vdd} V`,
        `is not above the device threshold at ${corner.name} (${threshold.toFixed(3)} V): a device cannot turn on at this corner; raise the supply or drop the corner`,
      );
    }
  }
}

function thresholdOf(card: ProcessCard, type: 'n' | 'p', corner: Corner): number {
  return thresholdAt(card[type], processCornerOf(card, corner.process)?.[type].dvth ?? 0, corner.temperature, card.t0);
}

/**
 * Whether `text` names `corner`: its exact name, or the same corner spelled another way, with the
 * process in any case and the supply, temperature and duty as numbers ("TT/1.80V/27C",
 * "tt/1.8/27", "SS/1620mV/125°C"). A corner whose name carries a duty needs the duty too.
 */
export function namesCorner(text: string, corner: Corner): boolean {
  if (text === corner.name) return true;
  const parts = text.trim().split('/');
  if (parts.length !== 3 && parts.length !== 4) return false;
  const [process, supply, temperature, duty] = parts as [string, string, string, string | undefined];
  if (process.trim().toLowerCase() !== corner.process.toLowerCase()) return false;
  const vdd = parseQuantity(supply.trim(), 'V');
  const celsius = parseTemperature(temperature.trim());
  if (!vdd.ok || !celsius.ok || Math.abs(vdd.value - corner.vdd) > 1e-9 || Math.abs(celsius.value - corner.temperature) > 1e-9)
    return false;
  const namedDuty = corner.name.split('/').length === 4;
  if (duty === undefined) return !namedDuty;
  const d = /^duty\s*([0-9.]+)$/i.exec(duty.trim());
  return namedDuty && d !== null && Math.abs(Number(d[1]) - corner.duty) < 1e-9;
}
