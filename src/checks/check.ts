/** A verdict on one requirement at one corner; margins are seconds, positive when met. */
export type CheckKind =
  | 'steady-state'
  | 'non-overlap'
  | 'dead-time-min'
  | 'dead-time-max'
  | 'gap-min'
  | 'width-min'
  | 'break-before-make'
  | 'order'
  | 'settle';

export interface Check {
  readonly kind: CheckKind;
  /** What is checked, e.g. `p1->p2 >= 300 ps`. */
  readonly name: string;
  /** Margin, s; null when the quantity could not be measured (the run did not settle). */
  readonly margin: number | null;
  readonly pass: boolean;
  /** Words for a failure that has no margin. */
  readonly detail?: string;
}

export function marginCheck(kind: CheckKind, name: string, margin: number): Check {
  return { kind, name, margin, pass: margin >= 0 };
}
