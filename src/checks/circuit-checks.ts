/**
 * Requirement checks on the circuit's figures at one corner (`circuit.requirements`): mean output
 * at least its minimum and at most its maximum, each at the load end that is harder on it (for a
 * positive output the minimum at the heavier load, for a negative one the maximum),
 * ripple, efficiency and charge lost per period. Margins are positive when met: V for output and
 * ripple, a fraction for efficiency, C for lost charge. A circuit with no steady state fails them
 * all without a margin. Each margin is read at the far end of the model's measured error against
 * ngspice (figure-error.ts) that could hide a failure: the output as much lower (for a minimum) or
 * higher (for a maximum) as the model has been found high or low, the ripple as the model has been
 * found low, the efficiency as it has been found high; a figure that meets its requirement only
 * inside that error fails and says so.
 */
import type { CornerCircuit } from '../circuit/corner-circuit.js';
import type { FigureError } from '../circuit/figure-error.js';
import type { CircuitRequirements } from '../schema/circuit.js';
import { levelAt, type Level } from '../schema/level.js';
import { formatEngineering, formatStated } from '../units/format.js';
import type { Check, CheckKind, CheckSubject } from './check.js';

/** Check names, formatted once per design. */
export interface CircuitCheckNames {
  readonly outputMin?: string;
  readonly outputMax?: string;
  readonly ripple?: string;
  readonly efficiency?: string;
  readonly lostCharge?: string;
}

function levelText(level: Level): string {
  if (level.scale === 0) return formatStated(level.offset, 'V');
  const base = level.scale === 1 ? 'vdd' : `${level.scale} vdd`;
  return level.offset === 0 ? base : `${base} ${level.offset > 0 ? '+' : '-'} ${formatStated(Math.abs(level.offset), 'V')}`;
}

export function circuitCheckNames(req: CircuitRequirements, output: string): CircuitCheckNames {
  return {
    outputMin: req.output?.min ? `V(${output}) >= ${levelText(req.output.min)}` : undefined,
    outputMax: req.output?.max ? `V(${output}) <= ${levelText(req.output.max)}` : undefined,
    ripple: req.ripple ? `ripple(${output}) <= ${formatStated(req.ripple.max, 'V')}` : undefined,
    efficiency: req.efficiency ? `efficiency >= ${(req.efficiency.min * 100).toFixed(1)} %` : undefined,
    lostCharge: req.lostCharge ? `lost charge <= ${formatStated(req.lostCharge.max, 'C')}` : undefined,
  };
}

const SUBJECTS: Readonly<Record<'output' | 'ripple' | 'efficiency' | 'lost-charge', CheckSubject>> = {
  output: { type: 'circuit', figure: 'output' },
  ripple: { type: 'circuit', figure: 'ripple' },
  efficiency: { type: 'circuit', figure: 'efficiency' },
  'lost-charge': { type: 'circuit', figure: 'lost-charge' },
};
/** Appends the circuit checks to `out`, each margin less the model's measured error `error`. */
export function circuitChecks(
  c: CornerCircuit,
  req: CircuitRequirements,
  names: CircuitCheckNames,
  vdd: number,
  error: FigureError,
  out: Check[],
): void {
  const settled = c.method !== 'none';
  const add = (
    kind: CheckKind,
    subject: CheckSubject,
    name: string | undefined,
    raw: number | null,
    margin: number | null,
    unit: 'V' | 'C' | '%',
  ) => {
    if (name === undefined) return;
    if (!settled || raw === null || margin === null || !Number.isFinite(margin)) {
      out.push({
        kind,
        subject,
        name,
        margin: null,
        pass: false,
        detail: settled ? 'the figure could not be computed' : 'the circuit reached no periodic steady state',
      });
      return;
    }
    const check: Check = { kind, subject, name, margin, pass: margin >= 0 };
    if (raw >= 0 && margin < 0) {
      const text = (v: number) => (unit === '%' ? `${(v * 100).toFixed(2)} points` : formatEngineering(v, unit));
      out.push({
        ...check,
        detail: `the model meets it by ${text(raw)}, less than the model's measured circuit error there (${text(raw - margin)}); confirm it with ngspice`,
      });
    } else out.push(check);
  };
  // The heavier load pulls the output towards ground: a positive output's minimum and a negative one's maximum are checked there.
  const [low, high] = c.output < 0 ? [c.lightOutput, c.output] : [c.output, c.lightOutput];
  const readHigh = Math.max(0, error.output[1]) * vdd;
  const readLow = Math.max(0, -error.output[0]) * vdd;
  if (req.output?.min) {
    const raw = low - levelAt(req.output.min, vdd);
    add('output-min', SUBJECTS.output, names.outputMin, raw, raw - readHigh, 'V');
  }
  if (req.output?.max) {
    const raw = levelAt(req.output.max, vdd) - high;
    add('output-max', SUBJECTS.output, names.outputMax, raw, raw - readLow, 'V');
  }
  if (req.ripple) {
    // The model's ripple is (1 + e) times ngspice's, e down to error.ripple[0].
    const ripple = c.ripple / (1 + Math.min(0, error.ripple[0]));
    add('ripple-max', SUBJECTS.ripple, names.ripple, req.ripple.max - c.ripple, req.ripple.max - ripple, 'V');
  }
  if (req.efficiency) {
    const e = c.efficiency;
    add(
      'efficiency-min',
      SUBJECTS.efficiency,
      names.efficiency,
      e === null ? null : e - req.efficiency.min,
      e === null ? null : e / (1 + Math.max(0, error.efficiency[1])) - req.efficiency.min,
      '%',
    );
  }
  if (req.lostCharge) {
    const raw = req.lostCharge.max - c.lostCharge;
    add('lost-charge-max', SUBJECTS['lost-charge'], names.lostCharge, raw, raw, 'C');
  }
}
