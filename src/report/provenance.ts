/**
 * What a reviewer needs to reproduce an output: the tool and its version, the date, the command
 * line, every input file with its SHA-256, the delay model (and its measured error band where
 * known) and the simulator version when one ran. Plain data; the CLI gathers the facts.
 */
import { shellCommand } from './shell-quote.js';

export interface InputFile {
  /** What the file is to the run: design, process card, delay tables, SPICE models. */
  readonly role: 'design' | 'process card' | 'delay tables' | 'SPICE models';
  /** As given on the command line or in the design; "-" for standard input. */
  readonly path: string;
  /** Lower-case hex SHA-256 of the bytes read. */
  readonly sha256: string;
}

/** The model's measured error against the simulator, where a characterization has measured it. */
export interface ErrorBand {
  /** Largest relative error seen, e.g. 0.05 for 5 %. */
  readonly relative: number;
  /** Where it was measured (a file, a command, a run). */
  readonly source: string;
}

export interface Provenance {
  readonly tool: 'phasegap';
  readonly version: string;
  /** ISO 8601, UTC. */
  readonly date: string;
  /** The command's words after the program name. */
  readonly command: readonly string[];
  readonly inputs: readonly InputFile[];
  readonly model: { readonly name: string; readonly errorBand: ErrorBand | null };
  /** The simulator's own version line when one ran (e.g. "ngspice-42"), else null. */
  readonly simulator: string | null;
}

export interface ProvenanceFacts {
  readonly version: string;
  readonly now: Date;
  readonly command: readonly string[];
  readonly inputs: readonly InputFile[];
  readonly model: string;
  readonly errorBand?: ErrorBand | null;
  readonly simulator?: string | null;
}

export function provenance(f: ProvenanceFacts): Provenance {
  return {
    tool: 'phasegap',
    version: f.version,
    date: f.now.toISOString(),
    command: [...f.command],
    inputs: [...f.inputs],
    model: { name: f.model, errorBand: f.errorBand ?? null },
    simulator: f.simulator ?? null,
  };
}

/** The run as a command line a reader can copy. */
export function commandText(p: Provenance): string {
  return shellCommand(['phasegap', ...p.command]);
}

/**
 * The record as lines of plain text, for footers and file-header comments (each format's
 * sanitiser is applied by its writer).
 */
export function provenanceLines(p: Provenance): string[] {
  const band = p.model.errorBand;
  return [
    `${p.tool} ${p.version}, ${p.date}`,
    `command: ${commandText(p)}`,
    ...p.inputs.map((i) => `${i.role}: ${i.path} sha256 ${i.sha256}`),
    `delay model: ${p.model.name}${band ? `, measured error within ${(band.relative * 100).toFixed(1)} % (${band.source})` : ', error band not measured'}`,
    ...(p.simulator === null ? [] : [`simulator: ${p.simulator}`]),
  ];
}
