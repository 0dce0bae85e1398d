/**
 * The circuit the switches serve (the optional `circuit:` section): capacitors, diodes, named
 * rails, the load and the requirements on the output. Terminals name a node from `nodes`, a rail
 * from `circuit.rails`, or a fixed level ("vdd", "0V"). A declared node written as one level is a
 * rail too; a node with a range or a per-phase voltage is a circuit node the solver finds.
 */
import * as z from 'zod';
import { quantity, ratio } from './fields.js';
import { level, parseLevel } from './level.js';
import { patterned } from './names.js';

const name = patterned(/^[A-Za-z_][A-Za-z0-9_.-]*$/, 'must start with a letter or _ and use letters, digits, _ . -');

const terminal = z
  .union([z.number(), z.string().min(1).max(64)])
  .describe('A node from `nodes`, a rail from `circuit.rails`, or a fixed level ("vdd", "2vdd", "0V")');

/** Most capacitors or diodes in one circuit: the state matrix grows with the square of the nodes. */
export const MAX_CIRCUIT_PARTS = 64;

const CHARGE = /^(\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?\s*([fpnum]?)C$/;
const CHARGE_PREFIX: Readonly<Record<string, number>> = { f: 1e-15, p: 1e-12, n: 1e-9, u: 1e-6, m: 1e-3, '': 1 };
const CHARGE_ALLOWED =
  'is not a charge; write a number of coulombs (at least 0, at most 1) or a number with an optional prefix (f p n u m) and C, e.g. "20pC"';

/** A charge in coulombs, as a number or "20pC". */
function charge(description: string) {
  return z
    .union([z.number(), z.string()])
    .transform((raw, ctx) => {
      const text = typeof raw === 'string' ? raw.trim() : '';
      const match = typeof raw === 'string' ? CHARGE.exec(text) : null;
      const bare = typeof raw === 'string' && /^(\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?$/.test(text) ? Number(text) : NaN;
      const value =
        typeof raw === 'number'
          ? raw
          : match
            ? Number(text.slice(0, text.length - 1 - match[2]!.length)) * CHARGE_PREFIX[match[2]!]!
            : bare;
      if (!Number.isFinite(value) || value < 0 || value > 1) {
        ctx.addIssue({ code: 'custom', message: CHARGE_ALLOWED, input: raw });
        return z.NEVER;
      }
      return value;
    })
    .describe(`${description} (C; a number in SI units or a string like "20pC"); at least 0 and at most 1 C`);
}

const range = <T extends z.ZodType>(one: T, words: string) =>
  z
    .union([one, z.strictObject({ min: one, max: one })])
    .describe(`${words}, or a range {min, max} (the figures use the heavier end, output max the lighter)`);

export const capacitorSchema = z.strictObject({
  name,
  between: z.tuple([terminal, terminal]).describe('Top plate, bottom plate'),
  value: quantity('F', 'Capacitance', { above: 0 }),
  bottomPlate: ratio('Bottom-plate parasitic to ground as a fraction of the value, at the second terminal', {
    atLeast: 0,
    atMost: 1,
  }).default(0),
});

export const diodeSchema = z.strictObject({
  name,
  anode: terminal,
  cathode: terminal,
  drop: quantity('V', 'Forward drop of the piecewise-linear model', { atLeast: 0, atMost: 10 }),
  resistance: quantity('ohm', 'On-resistance above the forward drop', { above: 0 }),
  leakage: quantity('A', 'Reverse current at 1 V reverse bias (an off conductance of leakage / 1 V)', { atLeast: 0, atMost: 1 }).default(
    1e-12,
  ),
});

export const loadSchema = z.union(
  [
    z.strictObject({
      current: range(
        quantity('A', 'Load current drawn from the output (its magnitude; it flows towards ground)', { atLeast: 0, atMost: 10 }),
        'Load current',
      ),
    }),
    z.strictObject({ resistance: range(quantity('ohm', 'Load resistance from the output to ground', { above: 0 }), 'Load resistance') }),
  ],
  { error: 'must be {current: AMPS} or {resistance: OHMS}, each a value or a range {min, max}' },
);

export const circuitRequirementsSchema = z.strictObject({
  output: z
    .strictObject({
      min: level(
        'Lowest allowed mean output (for a negative pump, "-vdd" and the like: its largest magnitude, checked at the lighter load)',
      ).optional(),
      max: level(
        'Highest allowed mean output (for a negative pump, e.g. "-0.85vdd": its least magnitude, checked at the heavier load)',
      ).optional(),
    })
    .optional(),
  ripple: z.strictObject({ max: quantity('V', 'Largest allowed peak-to-peak output ripple', { above: 0 }) }).optional(),
  efficiency: z
    .strictObject({ min: ratio('Smallest allowed efficiency, output power over input power', { above: 0, atMost: 1 }) })
    .optional(),
  lostCharge: z.strictObject({ max: charge('Largest allowed charge lost per period to shoot-through and reverse conduction') }).optional(),
});

export const circuitSchema = z.strictObject({
  output: name.describe('The output node (a node from `nodes`)'),
  capacitors: z.array(capacitorSchema).min(1).max(MAX_CIRCUIT_PARTS),
  diodes: z.array(diodeSchema).max(MAX_CIRCUIT_PARTS).default([]),
  rails: z.record(name, level('Rail voltage')).default({}).describe('Named fixed voltages the parts may connect to'),
  load: loadSchema.optional().describe('What the output drives (default: nothing)'),
  nodeCapacitance: quantity('F', 'Wiring and junction capacitance from every circuit node to ground', { above: 0 }).default(10e-15),
  switchLeakage: quantity('A', 'Current through an off switch at 1 V across it (an off conductance)', { atLeast: 0, atMost: 1 }).default(
    1e-9,
  ),
  startupCycles: z
    .number()
    .int()
    .min(1)
    .max(1_000_000)
    .default(20_000)
    .describe('Most periods simulated from all capacitors discharged to find the start-up time'),
  requirements: circuitRequirementsSchema.default({}),
});

export type CircuitSpec = z.output<typeof circuitSchema>;
export type CapacitorSpec = z.output<typeof capacitorSchema>;
export type DiodeSpec = z.output<typeof diodeSchema>;
export type LoadSpec = z.output<typeof loadSchema>;
export type CircuitRequirements = z.output<typeof circuitRequirementsSchema>;

/** What a terminal names: a circuit node (found by the solver), a rail, or nothing known. */
export type TerminalRef =
  | { readonly kind: 'node'; readonly name: string }
  | { readonly kind: 'rail'; readonly name: string }
  | { readonly kind: 'unknown' };

/** A declared node written as one fixed level holds it in every phase: a rail, not a circuit node. */
function isFixedNode(spec: unknown): boolean {
  return (
    typeof spec === 'number' ||
    typeof spec === 'string' ||
    (typeof spec === 'object' && spec !== null && 'offset' in spec && 'scale' in spec)
  );
}

export function classifyTerminal(
  raw: string | number,
  nodes: Readonly<Record<string, unknown>>,
  rails: Readonly<Record<string, unknown>>,
): TerminalRef {
  const key = typeof raw === 'string' ? raw.trim() : '';
  if (key !== '' && Object.hasOwn(rails, key)) return { kind: 'rail', name: key };
  if (key !== '' && Object.hasOwn(nodes, key)) return isFixedNode(nodes[key]) ? { kind: 'rail', name: key } : { kind: 'node', name: key };
  if (parseLevel(raw) !== null) return { kind: 'rail', name: String(raw).trim() };
  return { kind: 'unknown' };
}

interface DesignView {
  readonly nodes: Readonly<Record<string, unknown>>;
  readonly switches: readonly { readonly name: string; readonly terminals?: readonly [string | number, string | number] | undefined }[];
  readonly circuit?: CircuitSpec | undefined;
}

/** Cross-references of the circuit section against `nodes` and `switches`, as zod issues on the design. */
export function checkCircuitReferences(design: DesignView, ctx: z.RefinementCtx): void {
  const circuit = design.circuit;
  if (!circuit) return;
  const known = `a node from \`nodes\` (${Object.keys(design.nodes).join(', ') || 'none declared'}), a rail from \`circuit.rails\` or a level ("vdd", "0V")`;
  const at = (path: (string | number)[], value: unknown, where: string[] = ['circuit']) => {
    if (typeof value !== 'string' && typeof value !== 'number') return;
    if (classifyTerminal(value, design.nodes, circuit.rails).kind === 'unknown') {
      ctx.addIssue({
        code: 'custom',
        path: [...where, ...path],
        input: value,
        message: `is not ${known}`,
        params: { code: 'reference.unknown' },
      });
    }
  };
  const out = classifyTerminal(circuit.output, design.nodes, circuit.rails);
  if (out.kind !== 'node') {
    ctx.addIssue({
      code: 'custom',
      path: ['circuit', 'output'],
      input: circuit.output,
      message: 'must name a node from `nodes` whose voltage is a range or per phase (a node at one fixed level is a rail)',
    });
  }
  const seen = new Set<string>();
  const unique = (path: (string | number)[], part: string) => {
    if (seen.has(part))
      ctx.addIssue({
        code: 'custom',
        path: ['circuit', ...path],
        input: part,
        message: 'is used twice; every capacitor and diode needs its own name',
        params: { code: 'value.duplicate' },
      });
    seen.add(part);
  };
  circuit.capacitors.forEach((c, i) => {
    unique(['capacitors', i, 'name'], c.name);
    c.between.forEach((t, k) => {
      at(['capacitors', i, 'between', k], t);
    });
  });
  circuit.diodes.forEach((d, i) => {
    unique(['diodes', i, 'name'], d.name);
    at(['diodes', i, 'anode'], d.anode);
    at(['diodes', i, 'cathode'], d.cathode);
  });
  design.switches.forEach((s, i) => {
    if (!s.terminals) {
      ctx.addIssue({
        code: 'custom',
        path: ['switches', i, 'terminals'],
        message: 'is required when the design has a `circuit` section: the solver needs the two nodes each switch connects',
        params: { code: 'field.required' },
      });
      return;
    }
    s.terminals.forEach((t, k) => {
      at(['switches', i, 'terminals', k], t, []);
    });
  });
}
