/**
 * Circuit nodes the switches connect (the `nodes:` section): each node's voltage while phase 1 is
 * active, while phase 2 is active and in the dead times (both phases low), as a level or a range.
 * A node written as one level or range holds it in every phase (a rail, a storage capacitor).
 */
import * as z from 'zod';
import { level } from './level.js';

const nodeName = z.string().regex(/^[A-Za-z_][A-Za-z0-9_.-]*$/, 'must start with a letter or _ and use letters, digits, _ . -');

const RANGE_WORDS = 'a level ("vdd", "2vdd", "0V", 1.2) or a range {min: LEVEL, max: LEVEL}';

export const levelRangeSchema = z
  .union([level('Node voltage'), z.strictObject({ min: level('Lowest node voltage'), max: level('Highest node voltage') })], {
    error: `must be ${RANGE_WORDS}`,
  })
  .describe('One level ("vdd", "2vdd", "0V") or a range {min, max} (e.g. {min: 1.6vdd, max: 2vdd})');

export const nodeSchema = z
  .union(
    [
      levelRangeSchema,
      z.strictObject({
        phase1: levelRangeSchema.describe('While the first phase is active'),
        phase2: levelRangeSchema.describe('While the second phase is active'),
        dead: levelRangeSchema
          .optional()
          .describe(
            'In the dead times, both phases low (default: from the lowest to the highest of phase1 and phase2, as a floating node holds either)',
          ),
      }),
    ],
    { error: `must be ${RANGE_WORDS} in every phase, or one per phase {phase1, phase2, dead}, each ${RANGE_WORDS}` },
  )
  .describe('A node voltage that holds in every phase, or one per phase {phase1, phase2, dead}');

export const nodesSchema = z
  .record(nodeName, nodeSchema)
  .describe('Circuit nodes the switch terminals connect to, with their voltage in each phase');

export type LevelRangeSpec = z.output<typeof levelRangeSchema>;
export type NodeSpec = z.output<typeof nodeSchema>;
export type NodesSpec = z.output<typeof nodesSchema>;
