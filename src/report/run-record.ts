/**
 * What every report of a run carries around its own body: the combined verdict at the head (each
 * part beneath it) and the provenance at the foot, in text; beside the report's data in JSON.
 */
import { provenanceLines, type Provenance } from './provenance.js';
import type { RunVerdict } from './verdict.js';
import { verdictBlock } from './verdict-text.js';

export function withRunText(body: string, verdict: RunVerdict, p: Provenance): string {
  return `${verdictBlock(verdict).join('\n')}\n\n${body.replace(/\n*$/, '\n')}\n${provenanceLines(p)
    .map((l) => `provenance: ${l}`)
    .join('\n')}\n`;
}

/** The report's data with the combined verdict (`run`) right after `tool`, and the provenance last. */
export function withRunJson<T extends object>(
  report: T,
  verdict: RunVerdict,
  p: Provenance,
): { tool: 'phasegap'; run: RunVerdict } & T & { provenance: Provenance } {
  return { tool: 'phasegap', run: verdict, ...report, provenance: p };
}
