/** Reading design files and process cards from disk, with `--set` overrides applied before validation. */
import { closeSync, constants, fstatSync, openSync, readSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { dirname, extname, resolve } from 'node:path';
import { InputError, inFile, inputError, type IssuePath } from '../errors.js';
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
import { StdinError, type Io } from './io.js';

/** The design argument that means standard input. */
export const STDIN = '-';
/** How standard input is named in errors. */
const STDIN_NAME = '<stdin>';

export const sha256 = (text: string): string => createHash('sha256').update(text, 'utf8').digest('hex');

/** What a file is read as: its size limits, and whether errors may quote its text. */
export type DataKind = 'design' | 'card' | 'tables' | 'report';

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
  tables: {
    bytes: MAX_TABLE_BYTES,
    quote: false,
    expect: { what: 'a delay-table file (phasegap characterize output)', keys: Object.keys(tablesSchema.shape) },
  },
  // A report given to diff may be any file; it is quoted only once it looks like a check report.
  report: {
    bytes: MAX_TABLE_BYTES,
    quote: false,
    expect: {
      what: 'a phasegap check report (the output of check --json)',
      keys: ['tool', 'design', 'process', 'model', 'clock', 'phases', 'verdict', 'limiting', 'corners', 'warnings', 'cautions'],
    },
  },
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
export function readDataFile(path: string, label: IssuePath, kind: DataKind = 'design'): unknown {
  return readDataFileText(path, label, kind).data;
}

function formatOf(path: string): 'json' | 'yaml' {
  return extname(path).toLowerCase() === '.json' ? 'json' : 'yaml';
}

function limitText(kind: DataKind, format: 'json' | 'yaml'): string {
  const bytes = KINDS[kind].bytes;
  const what = `${format.toUpperCase()} ${kind === 'tables' ? 'delay-table file' : kind === 'report' ? 'report' : 'design or process card'}`;
  return format === 'yaml' ? `${what} (a JSON one may have ${mebibytes(bytes.json)})` : what;
}

/** Like readDataFile, with the text read (for its hash). */
export function readDataFileText(path: string, label: IssuePath, kind: DataKind = 'design'): { data: unknown; text: string } {
  const format = formatOf(path);
  const text = readBoundedText(path, label, KINDS[kind].bytes[format], limitText(kind, format));
  return { data: parseDataText(text, path, format, kind), text };
}

/** A design's text and what to call it: a file path, or "-" for standard input. */
export interface DesignSource {
  readonly path: string;
  readonly text: string;
}

/**
 * The design's text from its file, or from standard input for "-" (JSON when it starts with "{",
 * else YAML), within the same byte limits.
 */
export function readDesignSource(path: string, stdin?: Io['readStdin']): DesignSource {
  if (path !== STDIN)
    return { path, text: readBoundedText(path, ['DESIGN'], KINDS.design.bytes[formatOf(path)], limitText('design', formatOf(path))) };
  if (stdin === undefined)
    throw inputError('file.no-stdin', ['DESIGN'], path, 'means standard input, which this run does not have; name a design file');
  const limit = Math.max(KINDS.design.bytes.json, KINDS.design.bytes.yaml);
  let text: string;
  try {
    text = stdin(limit);
  } catch (error) {
    if (error instanceof StdinError) throw inputError('file.unreadable', ['DESIGN'], path, `${error.reason}`);
    throw error;
  }
  const format = stdinFormat(text);
  if (Buffer.byteLength(text, 'utf8') > KINDS.design.bytes[format]) {
    throw inputError(
      'file.too-large',
      ['DESIGN'],
      path,
      `(standard input) is larger than ${mebibytes(KINDS.design.bytes[format])}, the limit for a ${limitText('design', format)}`,
    );
  }
  return { path, text };
}

function stdinFormat(text: string): 'json' | 'yaml' {
  return /^\uFEFF?\s*\{/.test(text) ? 'json' : 'yaml';
}

/** A design source's data, bounded in shape. */
export function designData(source: DesignSource): unknown {
  if (source.path === STDIN) return parseDataText(source.text, STDIN_NAME, stdinFormat(source.text), 'design');
  return parseDataText(source.text, source.path, formatOf(source.path), 'design');
}

function parseDataText(text: string, path: string, format: 'json' | 'yaml', kind: DataKind): unknown {
  const source = { name: path, quote: KINDS[kind].quote };
  const data = format === 'json' ? parseJsonText(text, source) : parseYamlText(text, source);
  const expected = KINDS[kind].expect;
  const mapping = data !== null && typeof data === 'object' && !Array.isArray(data);
  if (expected && !(mapping && looksLike(data, expected.keys))) {
    throw inFile(
      inputError(
        'file.wrong-kind',
        [],
        undefined,
        `is not ${expected.what} (expected a mapping with keys ${expected.keys.join(', ')}); its content is not shown`,
      ),
      path,
    );
  }
  if (!mapping)
    throw inFile(inputError('file.wrong-kind', [], undefined, 'must hold a mapping of keys (a YAML/JSON object) at its top level'), path);
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
export function checkModelFile(path: string, label: IssuePath): ReadonlySet<string> | null {
  const text = readBoundedText(path, label, MAX_MODEL_BYTES, 'SPICE model file');
  if (!/^[ \t]*\.(model|subckt|lib)\b/im.test(text)) {
    throw inputError(
      'file.wrong-kind',
      label,
      path,
      'is not a SPICE model file (it has no .model, .subckt or .lib line); its content is not shown',
    );
  }
  if (/^[ \t]*\.(lib|include|inc)\b/im.test(text)) return null;
  return new Set([...text.matchAll(/^[ \t]*\.(?:model|subckt)[ \t]+(\S+)/gim)].map((m) => m[1]!.toLowerCase()));
}

/** The file's text, from a regular file only, refused before reading when it is larger than `limit` bytes. */
function readBoundedText(path: string, label: IssuePath, limit: number, what: string): string {
  let fd: number;
  try {
    // Non-blocking, so that opening a FIFO does not wait for a writer; fstat then refuses it.
    fd = openSync(path, constants.O_RDONLY | (constants.O_NONBLOCK ?? 0));
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    throw inputError(
      code === 'ENOENT' ? 'file.not-found' : 'file.unreadable',
      label,
      path,
      code === 'ENOENT' ? 'does not exist' : code === 'EISDIR' ? 'is a directory, not a file' : `cannot be read (${code ?? 'error'})`,
    );
  }
  try {
    const stat = fstatSync(fd);
    if (stat.isDirectory()) throw inputError('file.unreadable', label, path, 'is a directory, not a file');
    if (!stat.isFile())
      throw inputError(
        'file.unreadable',
        label,
        path,
        'is not a regular file (it is a device, pipe or socket); phasegap reads only regular files',
      );
    const tooBig = (): never => {
      throw inputError('file.too-large', label, path, `is larger than ${mebibytes(limit)}, the limit for a ${what}`);
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
    throw inputError('file.unreadable', label, path, `cannot be read (${code ?? 'error'})`);
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
  /** The design file as given, or "-" for standard input. */
  readonly designPath: string;
  /** SHA-256 of the design text read, and of the process card file (null when inline). */
  readonly hashes: { readonly design: string; readonly card: string | null };
  /** The design text read (workers load it again from this, not from the path). */
  readonly designText: string;
  /** Folder that paths inside the card (models, tables) are relative to. */
  readonly cardDir: string;
}

/** Loads a design from its path ("-": standard input through `stdin`) or from text already read. */
export function loadDesign(from: string | DesignSource, overrides: readonly string[] = [], stdin?: Io['readStdin']): LoadedDesign {
  const source = typeof from === 'string' ? readDesignSource(from, stdin) : from;
  const path = source.path;
  const raw = designData(source);
  const edited = applyOverrides(raw, overrides);
  const design = parseWith(designSchema, edited);
  const base = { design, designPath: path, designText: source.text };
  if (typeof design.process === 'string') {
    const cardPath = resolve(dirname(path), design.process);
    const { card, text } = loadProcessText(cardPath, ['process']);
    return {
      ...base,
      card,
      processSource: design.process,
      cardDir: dirname(cardPath),
      hashes: { design: sha256(source.text), card: sha256(text) },
    };
  }
  return {
    ...base,
    card: design.process,
    processSource: 'inline',
    cardDir: dirname(resolve(path)),
    hashes: { design: sha256(source.text), card: null },
  };
}

export function loadProcess(path: string, label: IssuePath = ['PROCESS']): ProcessCard {
  return loadProcessText(path, label).card;
}

function loadProcessText(path: string, label: IssuePath): { card: ProcessCard; text: string } {
  const { data: raw, text } = readDataFileText(path, label, 'card');
  try {
    return { card: parseWith(processSchema, raw), text };
  } catch (error) {
    if (error instanceof InputError) {
      throw inFile(error, path);
    }
    throw error;
  }
}

/** Reads and checks a delay-table file (phasegap characterize output). */
export function loadTables(path: string, label: IssuePath = ['tables']): DelayTables {
  const raw = readDataFile(path, label, 'tables');
  try {
    const tables = parseWith(tablesSchema, raw);
    checkTables(tables);
    return tables;
  } catch (error) {
    if (error instanceof InputError) throw inFile(error, path);
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
  return selectModel(
    choice,
    path === undefined ? undefined : loadTables(path, options.tables ? ['--tables'] : ['process', 'tables']),
    warn,
  );
}

/** A design loaded, its delay model chosen from the global options, and resolved once. */
export function loadResolved(
  designPath: string | DesignSource,
  overrides: readonly string[],
  options: ModelOptions,
  warn: (message: string) => void,
  stdin?: Io['readStdin'],
): LoadedDesign & { readonly resolved: ResolvedDesign } {
  const loaded = loadDesign(designPath, overrides, stdin);
  const resolved = resolveDesign(loaded.design, loaded.card, loadModel(loaded.card, loaded.cardDir, options, warn));
  return { ...loaded, resolved };
}
