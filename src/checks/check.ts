/**
 * A verdict on one requirement at one corner; margins are positive when met, in seconds for the
 * timing checks and in volts for the switch bias checks (off-state, on-state, stress).
 */
export type CheckKind =
  | 'steady-state'
  | 'non-overlap'
  | 'dead-time-min'
  | 'dead-time-max'
  | 'gap-min'
  | 'width-min'
  | 'break-before-make'
  | 'order'
  | 'settle'
  | 'off-state'
  | 'on-state'
  | 'stress'
  | 'output-min'
  | 'output-max'
  | 'ripple-max'
  | 'efficiency-min'
  | 'lost-charge-max';

/** Checks whose margin is a voltage: no delay chain changes them, only the switch's drive, terminals or body. */
export const VOLTAGE_KINDS: ReadonlySet<CheckKind> = new Set<CheckKind>(['off-state', 'on-state', 'stress']);

/** Checks on the circuit the switches serve: margins in V (output, ripple), a fraction (efficiency) or C (lost charge). */
export const CIRCUIT_KINDS: ReadonlySet<CheckKind> = new Set<CheckKind>(['output-min', 'output-max', 'ripple-max', 'efficiency-min', 'lost-charge-max']);

/** Unit of a check's margin ('' for a fraction). */
export function marginUnit(kind: CheckKind | string): 's' | 'V' | 'C' | '' {
  if (kind === 'efficiency-min') return '';
  if (kind === 'lost-charge-max') return 'C';
  return VOLTAGE_KINDS.has(kind as CheckKind) || CIRCUIT_KINDS.has(kind as CheckKind) ? 'V' : 's';
}

export interface Check {
  readonly kind: CheckKind;
  /** What is checked, e.g. `p1->p2 >= 300 ps`. */
  readonly name: string;
  /** Margin, s; null when the quantity could not be measured (the run did not settle). */
  readonly margin: number | null;
  readonly pass: boolean;
  /** Words for a failure that has no margin, or what a failing bias check found. */
  readonly detail?: string;
  /** The switch a bias check is about. */
  readonly switch?: string;
  /** The phase state of a bias check's worst case: a phase name or `dead time`. */
  readonly phase?: string;
}

export function marginCheck(kind: CheckKind, name: string, margin: number): Check {
  return { kind, name, margin, pass: margin >= 0 };
}

/**
 * Orders checks worst first across units: an unmeasurable check, then a failing voltage or circuit
 * check (its margin is not in seconds), then timing margins, then passing voltage margins; within one
 * tier the smaller margin. Negative when a is worse than b.
 */
export function compareChecks(a: Pick<Check, 'kind' | 'margin' | 'pass'>, b: Pick<Check, 'kind' | 'margin' | 'pass'>): number {
  const tier = (c: Pick<Check, 'kind' | 'margin' | 'pass'>) =>
    (c.margin === null ? 0 : VOLTAGE_KINDS.has(c.kind) || CIRCUIT_KINDS.has(c.kind) ? (c.pass ? 3 : 1) : 2);
  return tier(a) - tier(b) || (a.margin ?? 0) - (b.margin ?? 0);
}
