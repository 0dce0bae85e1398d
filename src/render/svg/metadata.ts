/**
 * The run behind a drawing, written into it: an SVG `<metadata>` element (SVG 1.1 section 21.2)
 * with the combined verdict, each part's verdict and the provenance, so a drawing that travels
 * alone still says what made it; and the title box headline taken from the combined verdict.
 */
import { provenanceLines, type Provenance } from '../../report/provenance.js';
import type { RunVerdict } from '../../report/verdict.js';
import { verdictBlock } from '../../report/verdict-text.js';
import type { TitleInfo } from './title.js';
import { xmlText } from './xml-text.js';

const escapeXml = (text: string) => xmlText(text).replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');

/** How a drawing of the run is placed in its page and headed. */
export interface RunDrawingOptions {
  /** Prefix of element ids, unique per drawing when several share one page. */
  readonly idPrefix?: string;
  /** Width of the drawing, px. */
  readonly width?: number;
  /** The run's combined verdict, for the title box (the drawing's own checks otherwise). */
  readonly run?: RunVerdict;
}

/** Inserts the metadata element as the first child of the root `<svg>`. */
export function withRunMetadata(svg: string, verdict: RunVerdict, p: Provenance): string {
  const lines = [...verdictBlock(verdict), ...provenanceLines(p)].map(escapeXml);
  const element = `<metadata data-verdict="${verdict.verdict}" data-sha256="${escapeXml(p.inputs[0]?.sha256 ?? '')}">\n${lines.join('\n')}\n</metadata>`;
  return svg.replace(/<svg\b[^>]*>/, (open) => `${open}${element}`);
}

/** The title box reads the combined verdict: a drawing whose own checks hold still heads FAIL when another part of the run fails. */
export function runTitle(title: TitleInfo, verdict: RunVerdict | undefined): TitleInfo {
  if (verdict === undefined) return title;
  const others = verdict.parts.filter((p) => p.verdict === 'fail' && p.key !== 'corners').map((p) => p.name);
  if (verdict.verdict === 'pass' || others.length === 0) return { ...title, pass: verdict.verdict === 'pass' && title.pass };
  return { ...title, pass: false, detail: title.pass ? `${others.join(', ')} fails` : `${title.detail}; ${others.join(', ')} fails` };
}
