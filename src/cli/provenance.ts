/** Gathers what an output records of its run (see report/provenance.ts): version, date, command line, input hashes. */
import { readFileSync } from 'node:fs';
import { dirname, relative, resolve } from 'node:path';
import { provenance, type ErrorBand, type InputFile, type Provenance } from '../report/provenance.js';
import type { Io } from './io.js';
import { sha256, type LoadedDesign } from './load.js';
import { VERSION } from './version.js';
import { errorBand } from '../delay/error-band.js';

export interface ProvenanceRun {
  /** The delay model's name as used. */
  readonly model: string;
  /** `--tables` and `--models` as given. */
  readonly options: { readonly tables?: string; readonly models?: string };
  /** The simulator's version when it ran. */
  readonly simulator?: string | null;
  /** Whether the run wrote or ran SPICE decks (their model file is then an input). */
  readonly spice?: boolean;
  readonly errorBand?: ErrorBand | null;
}

/** A file already read and checked by the loader, hashed again for the record; null when it cannot be read now. */
function hashFile(path: string): string {
  try {
    return sha256(readFileSync(path, 'utf8'));
  } catch (error) {
    return `unreadable (${(error as NodeJS.ErrnoException).code ?? 'error'})`;
  }
}

/** A path as the reader's shell would name it from where the command ran. */
const shown = (path: string): string => relative(process.cwd(), path) || path;

/** The band measured for this model and card (src/delay/error-band.ts), in the record's terms. */
function measuredBand(model: string, card: string): ErrorBand | null {
  const band = errorBand(model, card);
  return band
    ? {
        relative: band.worst,
        source: `dead time against ngspice on ${band.count} dead times of the shipped designs, test/bench/accuracy.bench.ts`,
      }
    : null;
}

export function gatherProvenance(io: Io, loaded: LoadedDesign, run: ProvenanceRun): Provenance {
  const inputs: InputFile[] = [{ role: 'design', path: loaded.designPath, sha256: loaded.hashes.design }];
  if (loaded.hashes.card !== null)
    inputs.push({
      role: 'process card',
      path: shown(resolve(dirname(loaded.designPath), loaded.processSource)),
      sha256: loaded.hashes.card,
    });
  if (run.model === 'table') {
    const tables = run.options.tables ?? (loaded.card.tables === undefined ? undefined : resolve(loaded.cardDir, loaded.card.tables));
    if (tables !== undefined) inputs.push({ role: 'delay tables', path: shown(tables), sha256: hashFile(tables) });
  }
  if (run.spice) {
    const models = run.options.models ?? (loaded.card.spice === undefined ? undefined : resolve(loaded.cardDir, loaded.card.spice.models));
    if (models !== undefined) inputs.push({ role: 'SPICE models', path: shown(models), sha256: hashFile(models) });
  }
  return provenance({
    version: VERSION,
    now: io.now?.() ?? new Date(),
    command: io.argv ?? [],
    inputs,
    model: run.model,
    errorBand: run.errorBand ?? measuredBand(run.model, loaded.card.name),
    simulator: run.simulator ?? null,
  });
}
