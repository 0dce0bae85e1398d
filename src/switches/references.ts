/** Constraints must name switches that exist, and a settle path needs exactly one error bound. */
import { inputError, type IssuePath } from '../errors.js';
import type { ConstraintsSpec } from '../schema/switches.js';

export function checkConstraintReferences(constraints: ConstraintsSpec, switchNames: readonly string[]): void {
  const known = new Set(switchNames);
  const allowed = switchNames.length > 0 ? `switches are ${switchNames.join(', ')}` : 'the design declares no switches';
  const need = (path: IssuePath, name: string) => {
    if (!known.has(name)) throw inputError('reference.unknown', path, name, `is not a switch of the design; ${allowed}`);
  };
  constraints.breakBeforeMake.forEach((c, i) => {
    c.between.forEach((name, j) => {
      need(['constraints', 'breakBeforeMake', i, 'between', j], name);
    });
    if (c.between[0] === c.between[1])
      throw inputError('value.duplicate', ['constraints', 'breakBeforeMake', i, 'between'], c.between, 'names the same switch twice');
  });
  constraints.order.forEach((c, i) => {
    need(['constraints', 'order', i, 'first', 'switch'], c.first.switch);
    need(['constraints', 'order', i, 'then', 'switch'], c.then.switch);
  });
  constraints.settle.forEach((c, i) => {
    c.switches.forEach((name, j) => {
      need(['constraints', 'settle', i, 'switches', j], name);
    });
    if ((c.error === undefined) === (c.bits === undefined)) {
      throw inputError(
        'field.required',
        ['constraints', 'settle', i],
        undefined,
        'needs exactly one of `error` (a fraction, e.g. 0.001) or `bits` (N bits: half an LSB)',
      );
    }
  });
}
