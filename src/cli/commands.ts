// The commands of `strainsheet`, by name. To add one, write it in its own file and add an entry.
import type { CliIO } from './cliIO';
import { evaluateCommand } from './evaluateCommand';
import { scanCommand } from './scanCommand';
import { sampleCommand } from './sampleCommand';
import { plotCommand } from './plotCommand';
import { importCommand } from './importCommand';
import { mergeCommand } from './mergeCommand';
import { inferCommand } from './inferCommand';
import { realiseCommand } from './realiseCommand';

export interface Command {
  /** One line for the command list. */
  summary: string;
  /** Full usage text, printed for `strainsheet COMMAND --help`. */
  usage: string;
  /** Runs with the arguments after the command name; resolves to the exit code. */
  run(args: string[], io: CliIO): Promise<number>;
}

export const commands: Record<string, Command> = {
  evaluate: evaluateCommand,
  scan: scanCommand,
  sample: sampleCommand,
  plot: plotCommand,
  import: importCommand,
  merge: mergeCommand,
  infer: inferCommand,
  realise: realiseCommand,
};
