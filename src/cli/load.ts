/** Reading design files and process cards from disk, with `--set` overrides applied before validation. */
import { closeSync, constants, fstatSync, openSync, readSync } from 'node:fs';
import { dirname, extname, resolve } from 'node:path';
import { InputError, inputError } from '../errors.js';
import { designSchema, type Design } from '../schema/design.js';
import { processSchema, type ProcessCard } from '../schema/process.js';
import { parseWith } from '../schema/validate.js';
import { tablesSchema, type DelayTables } from '../schema/tables.js';
import type { DelayModel } from '../delay/model.js';
import { checkTables } from '../delay/table.js';
import { parseModelChoice, selectModel } from '../delay/select.js';
import { applyOverrides } from './overrides.js';
import { parseJsonText } from './json-text.js';
import { parseYamlText } from './yaml-text.js';
import { checkDataShape } from '../schema/data-shape.js';
import { MAX_DESIGN_BYTES, MAX_MODEL_BYTES, MAX_TABLE_BYTES } from '../schema/limits.js';
import { resolveDesign, type ResolvedDesign } from '../analysis/resolve.js';

/** What a file is read as: its size limits, and whether errors may quote its text. */
export type DataKind = 'design' | 'card' | 'tables';

interface KindRules {
  readonly bytes: { readonly yaml: number; readonly json: number };
  /** Whether errors may quote the file's text and keys. */
  readonly quote: boolean;
  /** What the file must look like before anything in it is named in an error. */
  readonly expect?: { readonly what: string; readonly keys: readonly string[] };
}

const KINDS: Readonly<Record<DataKind, KindRules>> = {
  design: { bytes: MAX_DESIGN_BYTES, quote: true },
  // A card or table file is named by a design, so it may be any file on disk.
  card: { bytes: MAX_DESIGN_BYTES, quote: false, expect: { what: 'a process card', keys: Object.keys(processSchema.shape) } },
  tables: { bytes: MAX_TABLE_BYTES, quote: false, expect: { what: 'a delay-table file (phasegap characterize output)', keys: Object.keys(tablesSchema.shape) } },
};

/**
 * A file looks like its kind when at least two of its top-level keys are the kind's own keys
 * (name and description are too common to count) and no more than half are foreign. Otherwise it is some other file, and nothing of it is repeated.
 */
function looksLike(data: object, keys: readonly string[]): boolean {
  const own = Object.keys(data);
  const known = own.filter((key) => keys.includes(key) && key !== 'name' && key !== 'description').length;
  return known >= 2 && own.length - known <= known;
}

/**
 * Reads a YAML or JSON file (JSON when the name ends in .json) into plain data of bounded size
 * and shape; `label` names the file's role in errors (DESIGN, process, --tables).
 */
export function readDataFile(path: string, label: string, kind: DataKind = 'design'): unknown {
  const format = extname(path).toLowerCase() === '.json' ? 'json' : 'yaml';
  const bytes = KINDS[kind].bytes;
  const what = `${format.toUpperCase()} ${kind === 'tables' ? 'delay-table file' : 'design or process card'}`;
  const text = readBoundedText(path, label, bytes[format], format === 'yaml' ? `${what} (a JSON one may have ${mebibytes(bytes.json)})` : what);
  const source = { name: path, quote: KINDS[kind].quote };
  const data = format === 'json' ? parseJsonText(text, source) : parseYamlText(text, source);
  const expected = KINDS[kind].expect;
  const mapping = data !== null && typeof data === 'object' && !Array.isArray(data);
  if (expected && !(mapping && looksLike(data, expected.keys))) {
    throw inputError(path, undefined, `is not ${expected.what} (expected a mapping with keys ${expected.keys.join(', ')}); its content is not shown`);
  }
  if (!mapping) throw inputError(path, undefined, 'must hold a mapping of keys (a YAML/JSON object) at its top level');
  checkDataShape(data);
  return data;
}

/**
 * Checks that a file a deck will `.include` is a SPICE model file: a regular file within the size
 * limit holding at least one .model, .subckt or .lib line. Anything else (a system file named by a
 * stranger's card) is refused without showing its content, since ngspice would echo its lines.
 * Returns the model and subcircuit names it defines (lower case, as SPICE reads them), or null
 * when it pulls in other files (.lib or .include), whose names cannot be known here.
 */
export function checkModelFile(path: string, label: string): ReadonlySet<string> | null {
  const text = readBoundedText(path, label, MAX_MODEL_BYTES, 'SPICE model file');
  if (!/^[ \t]*\.(model|subckt|lib)\b/im.test(text)) {
    throw inputError(label, path, 'is not a SPICE model file (it has no .model, .subckt or .lib line); its content is not shown');
  }
  if (/^[ \t]*\.(lib|include|inc)\b/im.test(text)) return null;
  return new Set([...text.matchAll(/^[ \t]*\.(?:model|subckt)[ \t]+(\S+)/gim)].map((m) => m[1]!.toLowerCase()));
}

/** The file's text, from a regular file only, refused before reading when it is larger than `limit` bytes. */
function readBoundedText(path: string, label: string, limit: number, what: string): string {
  let fd: number;
  try {
    // Non-blocking, so that opening a FIFO does not wait for a writer; fstat then refuses it.
    fd = openSync(path, constants.O_RDONLY | (constants.O_NONBLOCK ?? 0));
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    throw inputError(label, path, code === 'ENOENT' ? 'does not exist' : code === 'EISDIR' ? 'is a directory, not a file' : `cannot be read (${code ?? 'error'})`);
  }
  try {
    const stat = fstatSync(fd);
    if (stat.isDirectory()) throw inputError(label, path, 'is a directory, not a file');
    if (!stat.isFile()) throw inputError(label, path, 'is not a regular file (it is a device, pipe or socket); phasegap reads only regular files');
    const tooBig = (): never => {
      throw inputError(label, path, `is larger than ${mebibytes(limit)}, the limit for a ${what}`);
    };
    if (stat.size > limit) tooBig();
    // Read to the end, not to stat.size: some files (under /proc) report size 0 or grow.
    const chunks: Buffer[] = [];
    let total = 0;
    for (;;) {
      const chunk = Buffer.allocUnsafe(Math.min(Math.max(stat.size + 1 - total, 1 << 16), limit + 1 - total));
      const n = readSync(fd, chunk, 0, chunk.length, null);
      if (n === 0) break;
      total += n;
      if (total > limit) tooBig();
      chunks.push(n === chunk.length ? chunk : chunk.subarray(0, n));
    }
    return Buffer.concat(chunks, total).toString('utf8');
  } catch (error) {
    if (error instanceof InputError) throw error;
    const code = (error as NodeJS.ErrnoException).code;
    throw inputError(label, path, `cannot be read (${code ?? 'error'})`);
  } finally {
    closeSync(fd);
  }
}

function mebibytes(bytes: number): string {
  return `${bytes / (1 << 20)} MiB`;
}

export interface LoadedDesign {
  readonly design: Design;
  readonly card: ProcessCard;
  /** Where the process card came from (a path, or "inline"). */
  readonly processSource: string;
  readonly designPath: string;
  /** Folder that paths inside the card (models, tables) are relative to. */
  readonly cardDir: string;
}

export function loadDesign(path: string, overrides: readonly string[] = []): LoadedDesign {
  const raw = readDataFile(path, 'DESIGN');
  const edited = applyOverrides(raw, overrides);
  const design = parseWith(designSchema, edited);
  if (typeof design.process === 'string') {
    const cardPath = resolve(dirname(path), design.process);
    const card = loadProcess(cardPath, 'process');
    return { design, card, processSource: design.process, designPath: path, cardDir: dirname(cardPath) };
  }
  return { design, card: design.process, processSource: 'inline', designPath: path, cardDir: dirname(resolve(path)) };
}

export function loadProcess(path: string, label = 'PROCESS'): ProcessCard {
  const raw = readDataFile(path, label, 'card');
  try {
    return parseWith(processSchema, raw);
  } catch (error) {
    if (error instanceof InputError) {
      throw new InputError(error.issues.map((i) => ({ ...i, path: i.path === '' ? path : `${path}: ${i.path}` })));
    }
    throw error;
  }
}

/** Reads and checks a delay-table file (phasegap characterize output). */
export function loadTables(path: string, label = 'tables'): DelayTables {
  const raw = readDataFile(path, label, 'tables');
  try {
    const tables = parseWith(tablesSchema, raw);
    checkTables(tables, path);
    return tables;
  } catch (error) {
    if (error instanceof InputError) throw new InputError(error.issues.map((i) => ({ ...i, path: i.path.startsWith(path) ? i.path : `${path}: ${i.path}` })));
    throw error;
  }
}

export interface ModelOptions {
  /** `--model analytic|table`. */
  readonly model?: string;
  /** `--tables FILE`: tables to use instead of the card's. */
  readonly tables?: string;
}

/** The delay model a command uses: the global options, else the card's tables, else analytic. */
export function loadModel(card: ProcessCard, cardDir: string, options: ModelOptions, warn: (message: string) => void): DelayModel {
  const choice = parseModelChoice(options.model);
  if (choice === 'analytic') return selectModel(choice, undefined, warn);
  const path = options.tables ?? (card.tables === undefined ? undefined : resolve(cardDir, card.tables));
  return selectModel(choice, path === undefined ? undefined : loadTables(path, options.tables ? '--tables' : 'process.tables'), warn);
}

/** A design loaded, its delay model chosen from the global options, and resolved once. */
export function loadResolved(designPath: string, overrides: readonly string[], options: ModelOptions, warn: (message: string) => void): LoadedDesign & { readonly resolved: ResolvedDesign } {
  const loaded = loadDesign(designPath, overrides);
  const resolved = resolveDesign(loaded.design, loaded.card, loadModel(loaded.card, loaded.cardDir, options, warn));
  return { ...loaded, resolved };
}
