/** The run's verdict as plain text: a headline, then each part that ran, then those that did not. */
import type { RunVerdict, VerdictPart } from './verdict.js';

const WORD = { pass: 'pass', fail: 'FAIL', 'not-run': 'not run' } as const;

/** "verdict: FAIL (fails: Monte Carlo yield)" or "verdict: PASS". */
export function verdictHeadline(v: RunVerdict): string {
  const failing = v.parts.filter((p) => p.verdict === 'fail').map((p) => p.name);
  return `verdict: ${v.verdict === 'pass' ? 'PASS' : 'FAIL'}${failing.length > 0 ? ` (fails: ${failing.join(', ')})` : ''}`;
}

export function verdictPartLine(p: VerdictPart): string {
  return `${p.name}: ${WORD[p.verdict]}: ${p.reason}`;
}

/** The headline and, indented beneath it, every part that ran and one line naming those that did not. */
export function verdictBlock(v: RunVerdict): string[] {
  const ran = v.parts.filter((p) => p.verdict !== 'not-run');
  const skipped = v.parts.filter((p) => p.verdict === 'not-run');
  return [
    verdictHeadline(v),
    ...ran.map((p) => `  ${verdictPartLine(p)}`),
    ...(skipped.length > 0 ? [`  not run here: ${skipped.map((p) => p.name).join(', ')}`] : []),
  ];
}
