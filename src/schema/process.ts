/** The process card: device parameters per type and named process corners (docs/physics.md, "Device at a corner"). */
import * as z from 'zod';
import { quantity, ratio, temperature } from './fields.js';
import { description, identifier, patterned } from './names.js';

export const deviceSchema = z.strictObject({
  vth0: quantity('V', 'Threshold magnitude at the card temperature t0', { above: 0 }),
  alpha: ratio('Velocity-saturation index of the alpha-power law (2 = square law)', { above: 1, atMost: 2 }),
  drive: z
    .number()
    .positive()
    .describe('Saturation current per metre of width at 1 V of gate overdrive, A/m/V^alpha (I_D0 = W * drive * (V_DD - Vth)^alpha)'),
  vthTempco: quantity('V', 'Threshold fall per kelvin (V/K), positive: Vth(T) = vth0 - vthTempco * (T - t0)', { atLeast: 0 }),
  mobilityExponent: ratio('Mobility temperature exponent m: drive scales as (T/T0)^-m', { atLeast: 0, atMost: 4 }),
  vdsatRatio: ratio(
    'Drain saturation voltage at full drive over the gate overdrive, V_D0/(V_DD - Vth), of the n-th power law (default alpha - 1: velocity saturation)',
    { above: 0, atMost: 1.5 },
  ).optional(),
  gamma: z.number().nonnegative().describe('Body-effect coefficient, V^0.5'),
  phi2f: quantity('V', 'Surface potential 2*phiF at the card temperature t0 (it moves with temperature as SPICE moves PHI)', { above: 0 }),
  cgate: z.number().positive().describe('Gate capacitance per metre of width at minimum length, F/m'),
  cdrain: z.number().nonnegative().describe('Drain diffusion capacitance per metre of width, F/m'),
  cox: z
    .number()
    .positive()
    .optional()
    .describe('Gate-oxide capacitance per area eps_ox/t_ox, F/m^2, for a switch channel charge (default: cgate / lmin, erring high)'),
  cov: z
    .number()
    .nonnegative()
    .optional()
    .describe(
      'Gate-overlap capacitance per metre of width on each side (SPICE CGSO/CGDO), F/m, for clock feedthrough (default: cgate / 8)',
    ),
  avt: z.number().nonnegative().describe('Pelgrom mismatch coefficient A_VT, V*m (5 mV*um = 5e-9)'),
  kprime: z.number().positive().describe('Triode transconductance parameter mu*Cox, A/V^2, for switch on-resistance'),
  theta: z
    .number()
    .nonnegative()
    .optional()
    .describe(
      'Mobility degradation, 1/V: mu_eff = mu0 / (1 + theta * (V_GS - Vth)) (SPICE level 3 THETA). Default: derived from drive and kprime at the nominal supply, which folds velocity saturation in and so errs high in R_on',
    ),
  triode: z
    .strictObject({
      vthTempco: z
        .union([
          z
            .literal('spice')
            .describe(
              "SPICE level 1-3's own law: the threshold moves with 2 phi_F and the band gap (src/process/spice-temperature.ts), from gamma and phi2f",
            ),
          quantity('V', 'Threshold fall per kelvin in deep triode, V/K', { atLeast: 0 }),
        ])
        .optional()
        .describe("Threshold temperature law in deep triode: a fall per kelvin, or 'spice' (default: vthTempco)"),
      mobilityExponent: ratio('Mobility temperature exponent in deep triode (default: mobilityExponent)', {
        atLeast: 0,
        atMost: 4,
      }).optional(),
    })
    .optional()
    .describe('Temperature laws of the switch on-resistance where the transistor models differ from the alpha-power fit'),
  subthresholdN: ratio('Sub-threshold slope factor n: S = n * kT/q * ln 10 per decade of current (default 1.5)', {
    atLeast: 1,
    atMost: 3,
  }).default(1.5),
  ratings: z
    .strictObject({
      vgs: quantity('V', 'Largest |V_GS| and |V_GD| the device may see', { above: 0 }),
      vds: quantity('V', 'Largest |V_DS|', { above: 0 }),
      vgb: quantity('V', 'Largest |V_GB|', { above: 0 }),
    })
    .optional()
    .describe('Voltage ratings of the switch devices, checked by the stress check'),
});

const cornerShiftSchema = z.strictObject({
  dvth: quantity('V', 'Threshold shift at this corner, added to the magnitude').default(0),
  drive: ratio('Drive multiplier at this corner', { above: 0 }).default(1),
});

const spiceParams = z
  .record(z.string().regex(/^[A-Za-z_][A-Za-z0-9_]*$/), z.number())
  .describe('SPICE .param values written after the model file, overriding its defaults');

const spiceModelName = z.string().regex(/^[A-Za-z_][A-Za-z0-9_.]*$/, 'must be a SPICE model name (letters, digits, _ .)');

/** How to simulate this card's devices in ngspice (optional). */
export const spiceSchema = z
  .strictObject({
    models: z.string().min(1).describe('SPICE model file (.include), relative to the process card'),
    n: spiceModelName.describe('Model name of the n device'),
    p: spiceModelName.describe('Model name of the p device'),
    diffusion: quantity(
      'm',
      'Drain/source diffusion length Ldiff beside the gate: AD = AS = W * Ldiff, PD = PS = 2 * (W + Ldiff); 0 (the default) writes no junctions',
      { atLeast: 0 },
    ).default(0),
    stackJunctions: z
      .boolean()
      .default(false)
      .describe(
        'Whether the internal nodes of series stacks carry junctions (half a shared diffusion per side); by default they have none',
      ),
    params: spiceParams.default({}),
    corners: z
      .record(
        identifier(),
        z.strictObject({
          n: spiceModelName.optional().describe('Model name of the n device at this corner'),
          p: spiceModelName.optional().describe('Model name of the p device at this corner'),
          params: spiceParams.default({}),
        }),
      )
      .default({})
      .describe('Per process corner: other model names and/or .param overrides'),
  })
  .describe('Device models for transistor-level decks (phasegap spice, confirm, characterize)');

export const processSchema = z.strictObject({
  name: identifier().describe('Name of the process card'),
  description: description().optional().describe('Free text; say here if the card is invented'),
  t0: temperature('Temperature at which vth0 and drive are given').default(27),
  lmin: quantity('m', 'Minimum drawn channel length', { above: 0 }),
  vddNominal: quantity('V', 'Nominal supply', { above: 0 }),
  unit: z
    .strictObject({
      wn: quantity('m', 'N width of the unit (size 1) inverter', { above: 0 }),
      wp: quantity('m', 'P width of the unit (size 1) inverter', { above: 0 }),
    })
    .describe('The unit inverter: size s of any cell drives like an inverter s times this one'),
  n: deviceSchema.describe('N-channel device'),
  p: deviceSchema.describe('P-channel device'),
  avtConvention: z
    .enum(['pair', 'device'])
    .default('pair')
    .describe(
      'What avt is the coefficient of: "pair" (Pelgrom 1989: sigma of the difference of a matched pair, so one device gets avt/sqrt(2WL)) or "device" (one device, avt/sqrt(WL))',
    ),
  corners: z
    .record(
      patterned(/^[A-Za-z0-9_-]+$/, 'must use letters, digits, _ and -'),
      z.strictObject({
        n: cornerShiftSchema.default({ dvth: 0, drive: 1 }),
        p: cornerShiftSchema.default({ dvth: 0, drive: 1 }),
      }),
    )
    .describe('Named process corners, each shifting Vth and scaling drive for n and p separately'),
  spice: spiceSchema.optional(),
  tables: z
    .string()
    .min(1)
    .optional()
    .describe('Characterized delay tables (JSON from phasegap characterize), relative to the card; selects the table model'),
});

export type ProcessCard = z.output<typeof processSchema>;
export type DeviceParams = z.output<typeof deviceSchema>;
export type DeviceType = 'n' | 'p';
export type SpiceSection = z.output<typeof spiceSchema>;
