/** Every command, in the order `phasegap --help` lists them. A new command is one file in commands/ and one line here. */
import type { AnyCommand } from './command.js';
import { checkCommand } from './commands/check.js';
import { fmaxCommand } from './commands/fmax.js';
import { tuneCommand } from './commands/tune.js';
import { sweepCommand } from './commands/sweep.js';
import { mcCommand } from './commands/mc.js';
import { drawCommand } from './commands/draw.js';
import { reportCommand } from './commands/report.js';
import { wavesCommand } from './commands/waves.js';
import { diffCommand } from './commands/diff.js';
import { schemaCommand } from './commands/schema.js';
import { initCommand } from './commands/init.js';
import { spiceCommand } from './commands/spice.js';
import { confirmCommand } from './commands/confirm.js';
import { characterizeCommand } from './commands/characterize.js';
import { verilogCommand } from './commands/verilog.js';

export const COMMANDS: readonly AnyCommand[] = [
  checkCommand,
  fmaxCommand,
  tuneCommand,
  sweepCommand,
  mcCommand,
  drawCommand,
  reportCommand,
  wavesCommand,
  diffCommand,
  schemaCommand,
  initCommand,
  spiceCommand,
  confirmCommand,
  characterizeCommand,
  verilogCommand,
];
