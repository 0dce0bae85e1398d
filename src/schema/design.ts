/**
 * The design file (docs/contracts.md, "Design file"): the single source of the design's types and of `phasegap schema`.
 */
import * as z from 'zod';
import { quantity, ratio, temperature } from './fields.js';
import { processSchema } from './process.js';
import { constraintsSchema, switchSchema } from './switches.js';
import { MAX_AXIS_VALUES, MAX_CORNERS, MAX_GATES, MAX_SWITCHES } from './limits.js';
import { description, identifier, patterned, title } from './names.js';
import { nodesSchema } from './nodes.js';
import { checkCircuitReferences, circuitSchema } from './circuit.js';

const netName = patterned(/^[A-Za-z_][A-Za-z0-9_.$[\]]*$/, 'must start with a letter or _ and use letters, digits, _ . $ [ ]');
const size = ratio('Drive strength relative to the unit inverter', { above: 0, atMost: 1000 });

export const CELL_KINDS = ['INV', 'NAND2', 'NAND3', 'NOR2', 'NOR3', 'BUF'] as const;

const phaseNames = z
  .tuple([netName, netName])
  .default(['p1', 'p2'])
  .describe('Names of the two phases; the first is active while the input clock is high');

const commonTemplate = {
  phases: phaseNames,
  stages: z.number().int().min(0).max(64).default(4).describe('Inverters in each feedback delay chain; must be even (0, 2, 4, ...)'),
  stageSize: z
    .union([size, z.array(size).min(1).max(64)])
    .default(1)
    .describe('Size of every chain inverter, or one size per stage'),
  stageLoad: quantity('F', 'Extra capacitance on every chain node (delay capacitors)', { atLeast: 0 }).default(0),
  gateSize: size.default(1).describe('Size of the cross-coupled NAND/NOR gates'),
  inputSize: size.default(1).describe('Size of the inverter that makes the complement of the input clock'),
  clockInput: z
    .enum(['outer', 'inner'])
    .default('outer')
    .describe(
      "Where the clock enters each cross-coupled gate's series stack: outer = the device next to the output (pin 0), inner = the device next to the rail (the feedback takes the other)",
    ),
  buffer: z
    .array(size)
    .min(0)
    .max(12)
    .optional()
    .describe(
      'Tapered output buffer from the chain end to each phase, sizes in order; nand needs an odd count, nor an even count (default: nand [2, 6, 18], nor [3, 12])',
    ),
  complementary: z
    .boolean()
    .default(false)
    .describe("Also produce each phase's complement (named <phase>b) through one inverter, for transmission gates"),
  complementSize: size.optional().describe('Size of the complement inverter (default: the last buffer size)'),
  earlyTap: z
    .number()
    .int()
    .min(0)
    .max(64)
    .default(0)
    .describe('Also produce an early phase (named <phase>e) tapped this many stages before the chain end; even, 0 = none'),
  earlyBuffer: z.array(size).max(12).optional().describe('Buffer for the early phase (default: same as buffer)'),
  feedbackTap: z
    .number()
    .int()
    .min(0)
    .max(12)
    .optional()
    .describe(
      "Output-buffer inverters between the chain end and the feedback to the other side's gate: 0 (default) feeds back from the chain end, before the buffers; even, at most the buffer length",
    ),
};

export const templateSchema = z.strictObject({
  template: z.enum(['nand', 'nor']).describe('Cross-coupled NAND or NOR generator'),
  ...commonTemplate,
});

export const gateSchema = z.strictObject({
  name: identifier().describe('Instance name'),
  cell: z.enum(CELL_KINDS).describe('Library cell'),
  size: size.default(1),
  inputs: z.array(netName).min(1).max(3).describe('Input nets in pin order; pin 0 is the device next to the output in a series stack'),
  output: netName.describe('Output net'),
});

export const netlistSchema = z.strictObject({
  template: z.literal('netlist').describe('A free-form netlist of library cells'),
  clock: netName.default('clk').describe('The input clock net'),
  phases: z.tuple([netName, netName]).describe('The two phase nets; the first is active while the clock is high'),
  complements: z.record(netName, netName).default({}).describe('Phase net -> its complement net'),
  early: z.record(netName, netName).default({}).describe('Phase net -> its early phase net'),
  gates: z.array(gateSchema).min(1).max(MAX_GATES),
});

export const generatorSchema = z.discriminatedUnion('template', [templateSchema, netlistSchema]);

const axes = {
  process: z.array(identifier()).min(1).max(MAX_AXIS_VALUES).optional().describe('Process corner names from the process card'),
  vdd: z
    .array(quantity('V', 'Supply', { above: 0 }))
    .min(1)
    .max(MAX_AXIS_VALUES)
    .optional(),
  temperature: z.array(temperature('Junction temperature')).min(1).max(MAX_AXIS_VALUES).optional(),
  duty: z
    .array(ratio('Input clock duty cycle', { above: 0, below: 1 }))
    .min(1)
    .max(MAX_AXIS_VALUES)
    .optional(),
};

export const cornerPointSchema = z.strictObject({
  process: identifier(),
  vdd: quantity('V', 'Supply', { above: 0 }),
  temperature: temperature('Junction temperature'),
  duty: ratio('Input clock duty cycle', { above: 0, below: 1 }).optional(),
});

export const cornersSchema = z
  .strictObject({
    ...axes,
    list: z
      .array(cornerPointSchema)
      .min(1)
      .max(MAX_CORNERS)
      .optional()
      .describe('An explicit list of corners instead of the cartesian product of the axes'),
  })
  .describe('Cartesian product of the listed axes (missing axes take the nominal value), or an explicit list');

export const requirementsSchema = z.strictObject({
  deadTime: z
    .strictObject({
      min: quantity('s', 'Smallest allowed dead time at the 50 % points').optional(),
      max: quantity('s', 'Largest allowed dead time at the 50 % points', { above: 0 }).optional(),
    })
    .optional(),
  gap: z
    .strictObject({
      min: quantity('s', 'Smallest allowed clean gap (neither phase above the gap level)').optional(),
      level: ratio('Fraction of the swing below which a phase counts as off, for the clean gap and the overlap check (default 0.1)', {
        above: 0,
        below: 0.5,
      }).optional(),
    })
    .optional(),
  width: z
    .strictObject({
      min: quantity('s', 'Shortest allowed active width of each phase, at the worst duty within tolerance', { above: 0 }).optional(),
    })
    .optional(),
  guard: quantity('s', 'Default break-before-make guard time', { atLeast: 0 }).default(0),
  minYield: ratio('Smallest acceptable Monte Carlo yield', { above: 0, atMost: 1 }).optional(),
  offDecades: ratio(
    'Decades of sub-threshold current below the threshold current an off switch must keep (default 2): off-state margin = offDecades * n * kT/q * ln 10',
    { atLeast: 0, atMost: 10 },
  ).optional(),
  offMargin: quantity('V', 'Off-state margin below the threshold, instead of the offDecades rule', { atLeast: 0 }).optional(),
  confirmTolerance: ratio('Largest relative difference between the model and ngspice that confirm accepts (default 0.1)', {
    above: 0,
    below: 10,
  }).optional(),
});

/** Monte Carlo dies per corner and seed when neither the design's montecarlo section nor an option sets them. */
export const MONTECARLO_DEFAULTS = { samples: 1000, seed: 1 } as const;

export const designSchema = z
  .strictObject({
    name: title().describe('Design name, shown in every report'),
    description: description().optional(),
    process: z
      .union([z.string().min(1), processSchema])
      .describe('Path to a process card (relative to the design file) or the card inline'),
    clock: z.strictObject({
      frequency: quantity('Hz', 'Input clock frequency', { atLeast: 1, atMost: 100e9 }),
      duty: ratio('Nominal duty cycle of the input clock (fraction high)', { above: 0, below: 1 }).default(0.5),
      dutyTolerance: ratio('Allowed duty error of the input clock, +/- fraction of the period', { atLeast: 0, below: 0.5 }).default(0),
      transition: quantity('s', 'Full-swing transition time of the input clock edges', { above: 0 }).default(100e-12),
    }),
    generator: generatorSchema,
    loads: z
      .record(netName, quantity('F', 'Extra capacitance on the net (wire and devices not modelled)', { atLeast: 0 }))
      .default({})
      .describe('Extra capacitance on named nets'),
    nodes: nodesSchema.default({}),
    switches: z.array(switchSchema).max(MAX_SWITCHES).default([]).describe('Switches driven by the phases'),
    constraints: constraintsSchema.default({ breakBeforeMake: [], order: [], settle: [] }),
    corners: cornersSchema.default({}),
    montecarlo: z
      .strictObject({
        samples: z.number().int().positive().max(10_000_000).default(MONTECARLO_DEFAULTS.samples),
        seed: z.number().int().nonnegative().default(MONTECARLO_DEFAULTS.seed),
      })
      .optional(),
    requirements: requirementsSchema.prefault({}),
    tune: z
      .strictObject({
        objective: z
          .enum(['conduction', 'dead-time', 'weighted'])
          .default('conduction')
          .describe(
            'What tune ranks by: the least useful conduction time over the corners (default), the least largest dead time, or the weighted sum below',
          ),
        weights: z
          .strictObject({
            conduction: ratio('Weight of the least useful conduction time', { atLeast: 0, atMost: 1e6 }).default(1),
            margin: ratio('Weight of the least margin (fast-corner headroom)', { atLeast: 0, atMost: 1e6 }).default(0),
            deadTime: ratio('Weight of the largest dead time (slow-corner waste), subtracted', { atLeast: 0, atMost: 1e6 }).default(0),
          })
          .prefault({})
          .describe(
            'Score of the weighted objective: conduction x least conduction time + margin x least margin - deadTime x largest dead time',
          ),
      })
      .optional()
      .describe('How phasegap tune ranks its proposals'),
    circuit: circuitSchema
      .optional()
      .describe('The circuit the switches serve (capacitors, diodes, load), solved for its periodic steady state at every corner'),
  })
  .superRefine(checkCircuitReferences);

export type Design = z.output<typeof designSchema>;

/** The design's Monte Carlo settings, the defaults when it has no montecarlo section. */
export function montecarloSettings(design: Design): { readonly samples: number; readonly seed: number } {
  return design.montecarlo ?? MONTECARLO_DEFAULTS;
}
export type GeneratorSpec = z.output<typeof generatorSchema>;
export type TemplateSpec = z.output<typeof templateSchema>;
export type NetlistSpec = z.output<typeof netlistSchema>;
export type CellKind = (typeof CELL_KINDS)[number];
export type Requirements = z.output<typeof requirementsSchema>;
export type CornersSpec = z.output<typeof cornersSchema>;
