/**
 * The model's measured error as the reports print it beside the margins (check, tune, the review
 * page and the margin chart): the dead-time and gap bands, and for a design with handover
 * constraints (break-before-make, order) the switch-instant band those checks take off each
 * handover, so a handover's margin adds up from the figures printed.
 */
import type { ResolvedDesign } from '../analysis/resolve.js';
import { errorBandText } from '../delay/error-band.js';
import { INSTANT_BANDS, instantBand } from '../switches/instant-band.js';

/** Whether the design has handover checks (break-before-make or order pairs). */
export function hasHandovers(resolved: ResolvedDesign): boolean {
  return resolved.switchCheckLabels.subjects.some((s) => s.type === 'switch-events');
}

export function modelErrorText(model: string, card: string, handovers: boolean): string {
  if (!handovers) return errorBandText(model, card);
  const measured = INSTANT_BANDS.some((b) => b.model === model && b.card === card);
  const share = `${(100 * instantBand(model, card)).toFixed(1)} % of each handover's path`;
  const clause = measured
    ? `the handover checks take its measured switch-instant error, ${share}, off the model's handover`
    : `its switch-instant error is not measured: the handover checks take the worst measured, ${share}, off the model's handover`;
  return errorBandText(model, card, clause);
}
