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

/** Checks on a handover between two switch instants: the kinds of the `switch-events` subjects (switch-checks.ts). */
export const HANDOVER_KINDS: ReadonlySet<CheckKind> = new Set<CheckKind>(['break-before-make', 'order']);

/** Checks on the circuit the switches serve: margins in V (output, ripple), a fraction (efficiency) or C (lost charge). */
export const CIRCUIT_KINDS: ReadonlySet<CheckKind> = new Set<CheckKind>([
  'output-min',
  'output-max',
  'ripple-max',
  'efficiency-min',
  'lost-charge-max',
]);

/** Unit of a check's margin ('' for a fraction). */
export function marginUnit(kind: CheckKind | string): 's' | 'V' | 'C' | '' {
  if (kind === 'efficiency-min') return '';
  if (kind === 'lost-charge-max') return 'C';
  return VOLTAGE_KINDS.has(kind as CheckKind) || CIRCUIT_KINDS.has(kind as CheckKind) ? 'V' : 's';
}

/** Which of the generator's two dead times: 0 from the first phase to the second, 1 back. */
export type DeadTimeIndex = 0 | 1;

/** A switch turning on or off. */
export interface SwitchEvent {
  readonly switch: string;
  readonly event: 'on' | 'off';
}

/**
 * What a check is about, made once per design and shared by every corner's check (the evaluator
 * runs per corner and per Monte Carlo die), so an output finds a check by its subject and draws it
 * without knowing the rule behind it.
 */
export type CheckSubject =
  /** The generator's periodic steady state. */
  | { readonly type: 'generator' }
  /**
   * Dead times, by index into the measurement's `deadTimes`: at the 50 % points (`t50`) or between
   * the gap-level crossings (`gap`). `limit` is the requirement, s (null for non-overlap, whose limit is 0).
   */
  | {
      readonly type: 'dead-time';
      readonly deadTimes: readonly DeadTimeIndex[];
      readonly level: 't50' | 'gap';
      readonly limit: number | null;
    }
  /** A phase's (or early phase's) active width at the worst duty; `limit` s. */
  | { readonly type: 'width'; readonly net: string; readonly limit: number }
  /**
   * Switch events that must follow each other by at least `min` s: a break-before-make pair has two
   * handovers (each switch's turn-off, then the other's turn-on), an order one. `label` is the short
   * name drawings use; `requirement` the rule in words; `named` whether the user named the constraint.
   */
  | {
      readonly type: 'switch-events';
      readonly constraint: 'break-before-make' | 'order';
      readonly handovers: ReadonlyArray<{ readonly first: SwitchEvent; readonly then: SwitchEvent }>;
      readonly min: number;
      readonly label: string;
      readonly requirement: string;
      readonly named: boolean;
    }
  /** A series path that must conduct long enough to settle; `derating` s is taken off its window for the input duty error. */
  | { readonly type: 'settle'; readonly path: string; readonly switches: readonly string[]; readonly derating: number }
  /**
   * One switch's bias (off-state, on-state, stress); `offIn` lists the phase states in which its
   * gate must hold it off (0, 1: a phase active; 2: the dead time), where the off-state check looks.
   */
  | { readonly type: 'switch'; readonly switch: string; readonly offIn: ReadonlyArray<0 | 1 | 2> }
  /** A figure of the circuit the switches serve (output, ripple, efficiency, lost charge). */
  | { readonly type: 'circuit'; readonly figure: 'output' | 'ripple' | 'efficiency' | 'lost-charge' };

/**
 * One of the things a check covers (a dead time, a handover, a settle window), in the order of its
 * subject's list, with its own margin; the check's margin is the least. When the part is a time
 * between two instants: `start` is the first (s, simulation time), `span` the time measured from
 * it (s) and `need` the least the rule allows there (s).
 */
export interface CheckPart {
  readonly margin: number;
  readonly start?: number;
  readonly span?: number;
  readonly need?: number;
}

export interface Check {
  readonly kind: CheckKind;
  /** What the check is about; shared by every corner's check of one requirement. */
  readonly subject: CheckSubject;
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
  /** Per dead time or handover of the subject, when it has several or when an output draws its instants. */
  readonly parts?: readonly CheckPart[];
}

export function marginCheck(kind: CheckKind, subject: CheckSubject, name: string, margin: number): Check {
  return { kind, subject, name, margin, pass: margin >= 0 };
}

/** A check as reports carry it (and JSON shows it): without the subject and parts, which drawings use. */
export type CheckData = Omit<Check, 'subject' | 'parts'>;

export function checkData(check: Check): CheckData {
  const { subject: _subject, parts: _parts, ...data } = check;
  return data;
}

/**
 * Orders checks worst first across units: an unmeasurable check, then a failing voltage or circuit
 * check (its margin is not in seconds), then timing margins, then passing voltage margins; within one
 * tier the smaller margin. Negative when a is worse than b.
 */
export function compareChecks(a: Pick<Check, 'kind' | 'margin' | 'pass'>, b: Pick<Check, 'kind' | 'margin' | 'pass'>): number {
  const tier = (c: Pick<Check, 'kind' | 'margin' | 'pass'>) =>
    c.margin === null ? 0 : VOLTAGE_KINDS.has(c.kind) || CIRCUIT_KINDS.has(c.kind) ? (c.pass ? 3 : 1) : 2;
  return tier(a) - tier(b) || (a.margin ?? 0) - (b.margin ?? 0);
}
