/**
 * A voltage level that may follow the corner's supply: "1.8V" or 1.8 (fixed), "vdd", "2vdd",
 * "2*vdd", "vdd+0.5V", "vdd-300mV", and below ground "-vdd", "-0.8vdd" (a negative pump's nodes).
 * Parsed to volts = scale * vdd + offset.
 */
import * as z from 'zod';
import { parseQuantity } from '../units/quantity.js';

export interface Level {
  /** Multiple of the corner's supply. */
  readonly scale: number;
  /** Fixed part, V. */
  readonly offset: number;
}

export function levelAt(level: Level, vdd: number): number {
  return level.scale * vdd + level.offset;
}

const ALLOWED =
  'is not a voltage level; write volts ("1.8V", 0.9) or a multiple of the supply ("vdd", "2vdd", "0.5*vdd", "vdd+1V", "-vdd")';

export function parseLevel(raw: unknown): Level | null {
  if (typeof raw === 'number') return Number.isFinite(raw) ? { scale: 0, offset: raw } : null;
  if (typeof raw !== 'string') return null;
  const text = raw.trim();
  const fixed = parseQuantity(text, 'V');
  if (fixed.ok) return { scale: 0, offset: fixed.value };
  const match = /^(-\s*)?(?:(\d+\.?\d*|\.\d+)\s*\*?\s*)?vdd(?:\s*([+-])\s*(.+))?$/i.exec(text);
  if (!match) return null;
  const scale = (match[1] === undefined ? 1 : -1) * (match[2] === undefined ? 1 : Number(match[2]));
  if (!Number.isFinite(scale)) return null;
  if (match[3] === undefined) return { scale, offset: 0 };
  const tail = parseQuantity(match[4]!, 'V');
  if (!tail.ok) return null;
  return { scale, offset: match[3] === '-' ? -tail.value : tail.value };
}

export function level(description: string) {
  return z
    .union([z.number(), z.string()])
    .transform((raw, ctx) => {
      const parsed = parseLevel(raw);
      if (!parsed) {
        ctx.addIssue({ code: 'custom', message: ALLOWED, input: raw });
        return z.NEVER;
      }
      return parsed;
    })
    .describe(`${description} (volts like "1.8V", or relative to the supply like "vdd", "2vdd", "vdd+1V")`);
}
