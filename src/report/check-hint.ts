/**
 * What to do next after a failing check, following the cause: a switch that does not hold off,
 * does not turn on or is overstressed is a fault of its drive, terminals or body, which no delay
 * chain can fix; a timing failure of a template generator is what tune is for.
 */
import { switchFaultAdvice, switchFaults } from '../checks/bias-checks.js';
import type { CheckReport } from './check-report.js';
import { shellCommand } from './shell-quote.js';

/** The hint `phasegap check` prints after a failing report (null when it passes or there is none). */
export function checkHint(report: CheckReport, designPath: string, template: boolean): string | null {
  if (report.verdict === 'pass') return null;
  const advice = switchFaultAdvice(switchFaults(report.corners));
  if (advice) return advice;
  return template ? `${shellCommand(['phasegap', 'tune', designPath])} proposes delay chains that pass every corner` : null;
}
