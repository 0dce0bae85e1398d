/**
 * The device-model part of a deck: the card's model file, the model names and .param overrides of
 * the process corner, the supply and the temperature.
 */
import { inputError } from '../errors.js';
import type { Corner } from '../process/corner.js';
import type { ProcessCard, SpiceSection } from '../schema/process.js';
import type { DeviceGeometry } from './cells.js';
import { spiceNumber } from './names.js';
import { spiceIdentifier, spiceInclude } from './text.js';

export interface CornerModels {
  readonly geometry: DeviceGeometry;
  /** Lines for the deck header: .include, .param, .temp, .options. */
  readonly header: readonly string[];
}

/** The card's spice section, or an input error saying how to add one. */
export function spiceSection(card: ProcessCard): SpiceSection {
  if (!card.spice) {
    throw inputError(
      'value.invalid',
      ['process', 'spice'],
      undefined,
      `is missing from card "${card.name}"; add a spice section with models (the model file), n and p (model names) to write transistor-level decks`,
    );
  }
  return card.spice;
}

/**
 * Header and geometry for one corner. `modelPath` is the model file as the deck should include
 * it (the caller resolves it relative to the card and to where the deck is written).
 */
export function cornerModels(card: ProcessCard, corner: Pick<Corner, 'process' | 'temperature'>, modelPath: string): CornerModels {
  const spice = spiceSection(card);
  const perCorner = spice.corners[corner.process];
  const params = { ...spice.params, ...(perCorner?.params ?? {}) };
  const header = [
    spiceInclude(modelPath),
    ...Object.entries(params).map(([name, value]) => `.param ${spiceIdentifier(name)}=${spiceNumber(value)}`),
    `.options tnom=${card.t0}`,
    `.temp ${corner.temperature}`,
  ];
  return {
    geometry: {
      l: card.lmin,
      diffusion: spice.diffusion,
      stackJunctions: spice.stackJunctions,
      nModel: spiceIdentifier(perCorner?.n ?? spice.n),
      pModel: spiceIdentifier(perCorner?.p ?? spice.p),
    },
    header,
  };
}
