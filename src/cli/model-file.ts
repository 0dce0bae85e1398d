/** The SPICE device-model file a deck includes, checked against the models the process card names. */
import { resolve } from 'node:path';
import { inputError, type IssuePath } from '../errors.js';
import type { ProcessCard, SpiceSection } from '../schema/process.js';
import { spiceSection } from '../spice/models.js';
import { checkModelFile } from './load.js';

/** The device-model file: `--models FILE`, else the card's spice.models relative to the card. */
export function modelFile(card: ProcessCard, cardDir: string, override?: string): string {
  const path = override === undefined ? resolve(cardDir, spiceSection(card).models) : resolve(override);
  const defined = checkModelFile(path, override === undefined ? ['process', 'spice', 'models'] : ['--models']);
  if (defined) checkModelNames(spiceSection(card), defined, path);
  return path;
}

/** Every device model the card names must be defined in the model file, or ngspice stops on the deck. */
function checkModelNames(spice: SpiceSection, defined: ReadonlySet<string>, path: string): void {
  const named: Array<[IssuePath, string | undefined]> = [
    [['process', 'spice', 'n'], spice.n],
    [['process', 'spice', 'p'], spice.p],
  ];
  for (const [corner, models] of Object.entries(spice.corners))
    named.push([['process', 'spice', 'corners', corner, 'n'], models.n], [['process', 'spice', 'corners', corner, 'p'], models.p]);
  for (const [field, name] of named) {
    if (name !== undefined && !defined.has(name.toLowerCase())) {
      const known = [...defined]
        .filter((n) => /^[a-z0-9_.-]{1,32}$/.test(n))
        .slice(0, 8)
        .join(', ');
      throw inputError('reference.unknown', field, name, `is not a model or subcircuit of ${path} (it defines ${known || 'none'})`);
    }
  }
}
