/** `phasegap init`: writes a commented starter design. */
import { inputError } from '../../errors.js';
import { starterDesign, type StarterTemplate } from '../starter.js';
import type { Io } from '../io.js';
import { emit } from '../output.js';
import { shellCommand } from '../../report/shell-quote.js';
import { noteTo } from '../warn.js';

export function runInit(io: Io, options: { readonly template: string; readonly out: string; readonly force: boolean }): number {
  if (options.template !== 'nand' && options.template !== 'nor') {
    throw inputError('option.invalid', '--template', options.template, 'is not a template; allowed: nand, nor');
  }
  if (options.out !== '-' && io.exists(options.out) && !options.force) {
    throw inputError('option.invalid', '--out', options.out, 'already exists; pick another name or pass --force to overwrite');
  }
  emit(io, starterDesign(options.template as StarterTemplate), options.out, []);
  if (options.out !== '-') noteTo(io, `wrote ${options.out}; next: ${shellCommand(['phasegap', 'check', options.out])}`);
  return 0;
}
