/** Reading design files and process cards from disk, with `--set` overrides applied before validation. */
import { readFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { parseDocument } from 'yaml';
import { InputError, inputError } from '../errors.js';
import { designSchema, type Design } from '../schema/design.js';
import { processSchema, type ProcessCard } from '../schema/process.js';
import { parseWith } from '../schema/validate.js';
import { tablesSchema, type DelayTables } from '../schema/tables.js';
import type { DelayModel } from '../delay/model.js';
import { checkTables } from '../delay/table.js';
import { parseModelChoice, selectModel } from '../delay/select.js';
import { applyOverrides } from './overrides.js';
import { resolveDesign, type ResolvedDesign } from '../analysis/resolve.js';

/** Reads a YAML or JSON file into plain data; the path names the file in errors. */
export function readDataFile(path: string, label: string): unknown {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    throw inputError(label, path, code === 'ENOENT' ? 'does not exist' : code === 'EISDIR' ? 'is a directory, not a file' : `cannot be read (${code ?? 'error'})`);
  }
  const doc = parseDocument(text, { prettyErrors: true, uniqueKeys: true });
  if (doc.errors.length > 0) {
    const first = doc.errors[0]!;
    const where = first.linePos?.[0] ? ` at line ${first.linePos[0].line}, column ${first.linePos[0].col}` : '';
    throw inputError(path, undefined, `is not valid YAML or JSON${where}: ${first.message.split('\n')[0]}`);
  }
  const data: unknown = doc.toJS();
  if (data === null || typeof data !== 'object' || Array.isArray(data)) {
    throw inputError(path, undefined, 'must hold a mapping of keys (a YAML/JSON object) at its top level');
  }
  return data;
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
  const raw = readDataFile(path, label);
  try {
    return parseWith(processSchema, raw);
  } catch (error) {
    if (error instanceof InputError) {
      throw new InputError(error.issues.map((i) => ({ ...i, path: `${path}: ${i.path}` })));
    }
    throw error;
  }
}

/** Reads and checks a delay-table file (phasegap characterize output). */
export function loadTables(path: string, label = 'tables'): DelayTables {
  const raw = readDataFile(path, label);
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
