/**
 * Requirement checks on the circuit's figures at one corner (`circuit.requirements`): mean output
 * at least its minimum and at most its maximum, each at the load end that is harder on it (for a
 * positive output the minimum at the heavier load, for a negative one the maximum),
 * ripple, efficiency and charge lost per period. Margins are positive when met: V for output and
 * ripple, a fraction for efficiency, C for lost charge. A circuit with no steady state fails them
 * all without a margin.
 */
import type { CornerCircuit } from '../circuit/corner-circuit.js';
import type { CircuitRequirements } from '../schema/circuit.js';
import { levelAt, type Level } from '../schema/level.js';
import { formatEngineering } from '../units/format.js';
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
  if (level.scale === 0) return formatEngineering(level.offset, 'V');
  const base = level.scale === 1 ? 'vdd' : `${level.scale} vdd`;
  return level.offset === 0 ? base : `${base} ${level.offset > 0 ? '+' : '-'} ${formatEngineering(Math.abs(level.offset), 'V')}`;
}

export function circuitCheckNames(req: CircuitRequirements, output: string): CircuitCheckNames {
  return {
    outputMin: req.output?.min ? `V(${output}) >= ${levelText(req.output.min)}` : undefined,
    outputMax: req.output?.max ? `V(${output}) <= ${levelText(req.output.max)}` : undefined,
    ripple: req.ripple ? `ripple(${output}) <= ${formatEngineering(req.ripple.max, 'V')}` : undefined,
    efficiency: req.efficiency ? `efficiency >= ${(req.efficiency.min * 100).toFixed(1)} %` : undefined,
    lostCharge: req.lostCharge ? `lost charge <= ${formatEngineering(req.lostCharge.max, 'C')}` : undefined,
  };
}

const SUBJECTS: Readonly<Record<'output' | 'ripple' | 'efficiency' | 'lost-charge', CheckSubject>> = {
  output: { type: 'circuit', figure: 'output' },
  ripple: { type: 'circuit', figure: 'ripple' },
  efficiency: { type: 'circuit', figure: 'efficiency' },
  'lost-charge': { type: 'circuit', figure: 'lost-charge' },
};
/** Appends the circuit checks to `out`. */
export function circuitChecks(c: CornerCircuit, req: CircuitRequirements, names: CircuitCheckNames, vdd: number, out: Check[]): void {
  const settled = c.method !== 'none';
  const add = (kind: CheckKind, subject: CheckSubject, name: string | undefined, margin: number | null) => {
    if (name === undefined) return;
    if (!settled || margin === null || !Number.isFinite(margin)) {
      out.push({
        kind,
        subject,
        name,
        margin: null,
        pass: false,
        detail: settled ? 'the figure could not be computed' : 'the circuit reached no periodic steady state',
      });
    } else out.push({ kind, subject, name, margin, pass: margin >= 0 });
  };
  // The heavier load pulls the output towards ground: a positive output's minimum and a negative one's maximum are checked there.
  const [low, high] = c.output < 0 ? [c.lightOutput, c.output] : [c.output, c.lightOutput];
  if (req.output?.min) add('output-min', SUBJECTS.output, names.outputMin, low - levelAt(req.output.min, vdd));
  if (req.output?.max) add('output-max', SUBJECTS.output, names.outputMax, levelAt(req.output.max, vdd) - high);
  if (req.ripple) add('ripple-max', SUBJECTS.ripple, names.ripple, req.ripple.max - c.ripple);
  if (req.efficiency)
    add('efficiency-min', SUBJECTS.efficiency, names.efficiency, c.efficiency === null ? null : c.efficiency - req.efficiency.min);
  if (req.lostCharge) add('lost-charge-max', SUBJECTS['lost-charge'], names.lostCharge, req.lostCharge.max - c.lostCharge);
}
