/** `phasegap init`: writes a commented starter design. */
import { inputError } from '../../errors.js';
import { starterDesign, type StarterTemplate } from '../starter.js';
import type { Io } from '../io.js';
import { emit } from '../output.js';
import { shellCommand } from '../../report/shell-quote.js';
import { noteTo } from '../warn.js';
import { defineCommand, flagOption, textOption, type CommandOptions } from '../command.js';

const OPTIONS = {
  template: textOption('--template <STYLE>', 'generator style', { default: 'nand', choices: ['nand', 'nor'] }),
  out: textOption('-o, --out <FILE>', "write the design to FILE atomically ('-' for stdout)", { default: 'design.yaml' }),
  force: flagOption('--force', 'overwrite an existing file', false),
} as const;

export const initCommand = defineCommand({
  name: 'init',
  description: 'write a commented starter design that passes check',
  arguments: [],
  options: OPTIONS,
  run: (io, _args, options) => runInit(io, options),
});

export function runInit(io: Io, options: CommandOptions<typeof OPTIONS>): number {
  // commander's choices have refused any other template.
  if (options.out !== '-' && io.exists(options.out) && !options.force) {
    throw inputError('option.invalid', ['--out'], options.out, 'already exists; pick another name or pass --force to overwrite');
  }
  emit(io, starterDesign(options.template as StarterTemplate), options.out, []);
  if (options.out !== '-') noteTo(io, `wrote ${options.out}; next: ${shellCommand(['phasegap', 'check', options.out])}`);
  return 0;
}
