/** Switches and their constraints in the design file (docs/physics.md, "Switches and constraints"). */
import * as z from 'zod';
import { quantity, ratio } from './fields.js';
import { level } from './level.js';
import { MAX_CONSTRAINTS, MAX_SWITCHES } from './limits.js';
import { identifier, patterned } from './names.js';

const name = patterned(/^[A-Za-z_][A-Za-z0-9_.-]*$/, 'must start with a letter or _ and use letters, digits, _ . -');
const netName = identifier();

const driverStage = z.strictObject({
  cell: z.enum(['INV', 'BUF']).describe('Driver cell between the phase net and the switch gate'),
  size: ratio('Drive strength relative to the unit inverter', { above: 0, atMost: 1000 }).default(1),
});

const levelShifter = z.strictObject({
  delay: quantity(
    's',
    "Delay of the level shifter, input 50 % to output 50 %, at the card's nominal corner (other corners scale it as swing / n-device drive)",
    { atLeast: 0 },
  ),
  transition: quantity('s', "Output transition time at the nominal corner, scaled like the delay (default: the input's)", {
    above: 0,
  }).optional(),
  low: level('Low level of the shifted gate swing'),
  high: level('High level of the shifted gate swing'),
  invert: z.boolean().default(false).describe('An inverting level shifter'),
  w: quantity('m', 'Width of its pull-down n devices, for their threshold mismatch in Monte Carlo (default 4 unit n widths)', {
    above: 0,
  }).optional(),
});

const signal = z.union([
  level('Voltage the switch passes'),
  z.strictObject({ min: level('Lowest voltage the switch passes'), max: level('Highest voltage the switch passes') }),
]);

const terminal = z
  .union([z.number(), z.string().min(1)])
  .describe('A node name from `nodes`, or a fixed level (volts like "0V", or relative to the supply like "vdd", "2vdd")');

export const switchSchema = z.strictObject({
  name,
  type: z.enum(['nmos', 'pmos', 'tgate']).describe('Switch device; a tgate is an nmos and a pmos in parallel'),
  w: quantity('m', 'Width (the n device of a tgate)', { above: 0 }),
  l: quantity('m', 'Length', { above: 0 }),
  wp: quantity('m', "Width of the p device of a tgate (default: w scaled by the unit inverter's wp/wn)", { above: 0 }).optional(),
  gate: netName.describe('Net that drives the gate (the n gate of a tgate)'),
  gateBar: netName.optional().describe('Net that drives the p gate of a tgate (usually the phase complement)'),
  driver: z.array(driverStage).max(8).default([]).describe('Cells from the net to the gate, in order (each INV inverts)'),
  levelShifter: levelShifter.optional().describe('A level shifter after the driver, with its own delay and swing'),
  terminals: z
    .tuple([terminal, terminal])
    .optional()
    .describe('The two nodes the switch connects: names from `nodes`, or a fixed rail as a level ("vdd", "0V")'),
  signal: signal
    .optional()
    .describe(
      'Older form instead of terminals: both terminals at this level or range {min, max} in every phase (default 0 V); the off-state check cannot see a boosted node this way',
    ),
  bulk: terminal
    .optional()
    .describe(
      'Body: a level ("vdd", "2vdd") or a node name (default: 0 V for n devices, the highest gate or terminal level for p devices)',
    ),
});

const eventRef = z.strictObject({
  switch: name.describe('Switch name'),
  event: z.enum(['on', 'off']).describe('The instant it starts (on) or stops (off) conducting'),
});

export const constraintsSchema = z.strictObject({
  breakBeforeMake: z
    .array(
      z.strictObject({
        name: identifier().optional(),
        between: z.tuple([name, name]).describe('Two switches that must never conduct together'),
        guard: quantity('s', 'Least time between one stopping and the other starting (default: requirements.guard)', {
          atLeast: 0,
        }).optional(),
      }),
    )
    .max(MAX_CONSTRAINTS)
    .default([]),
  order: z
    .array(
      z.strictObject({
        name: identifier().optional(),
        first: eventRef,
        then: eventRef,
        min: quantity('s', 'Least time from the first event to the second', { atLeast: 0 }).default(0),
      }),
    )
    .max(MAX_CONSTRAINTS)
    .default([])
    .describe('Event ordering, e.g. the bottom-plate switch opens before the top-plate one'),
  settle: z
    .array(
      z.strictObject({
        name: identifier(),
        switches: z.array(name).min(1).max(MAX_SWITCHES).describe('Switches in series in the path'),
        capacitance: quantity('F', 'Capacitance the path charges', { above: 0 }),
        error: ratio('Allowed settling error as a fraction', { above: 0, below: 1 }).optional(),
        bits: z.number().int().min(1).max(24).optional().describe('Allowed error as N bits: half an LSB, 2^-(N+1)'),
      }),
    )
    .max(MAX_CONSTRAINTS)
    .default([]),
});

export type SwitchSpec = z.output<typeof switchSchema>;
export type ConstraintsSpec = z.output<typeof constraintsSchema>;
