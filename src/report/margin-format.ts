/** A check's margin for people, in the unit of its kind: +316 ps for timing, +55.0 mV for the switch bias checks. */
import { marginUnit, type CheckKind } from '../checks/check.js';
import { formatEngineering, formatSignedTime } from '../units/format.js';

export function formatMargin(margin: number | null, kind: CheckKind | string, fallback = 'n/a'): string {
  if (marginUnit(kind) === 's') return formatSignedTime(margin, fallback);
  if (margin === null || !Number.isFinite(margin)) return fallback;
  const unit = marginUnit(kind);
  if (unit === '') return `${margin < 0 ? '-' : '+'}${(Math.abs(margin) * 100).toFixed(1)} %`;
  return `${margin < 0 ? '-' : '+'}${formatEngineering(Math.abs(margin), unit)}`;
}

/** A spread (sigma) in the unit of a check's kind, unsigned. */
export function formatSpread(value: number, kind: CheckKind | string): string {
  const unit = marginUnit(kind);
  return unit === '' ? `${(value * 100).toFixed(1)} %` : formatEngineering(value, unit);
}
