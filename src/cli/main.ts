// Entry of the `strainsheet` command line (bin/strainsheet.mjs calls main).
import { commands } from './commands';
import { processIO, type CliIO } from './cliIO';
import { EXIT_BAD_INPUT, EXIT_OK } from './exitCodes';
import { UsageError } from './optionParsing';
import { SheetLoadError } from './sheetLoading';
import { applyBudgetOptions, BUDGET_HELP } from './budgetOptions';

function overview(): string {
  const names = Object.keys(commands).sort();
  const width = Math.max(...names.map((n) => n.length));
  const lines = names.map((n) => `  ${n.padEnd(width)}  ${commands[n].summary}`);
  return `Strainsheet: unit-aware sheets from black-hole binary populations to the gravitational-wave background.

Usage: strainsheet COMMAND [options]

Commands:
${lines.join('\n')}

Run "strainsheet COMMAND --help" for a command's options.

Options of every command:
${BUDGET_HELP}
`;
}

export async function main(argv: string[], io: CliIO = processIO): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    const topic = name === 'help' ? rest[0] : undefined;
    if (topic && Object.hasOwn(commands, topic)) io.out(commands[topic].usage + '\n');
    else io.out(overview());
    return name === undefined ? EXIT_BAD_INPUT : EXIT_OK;
  }
  if (!Object.hasOwn(commands, name)) {
    io.err(`strainsheet: unknown command "${name}"\n\n${overview()}`);
    return EXIT_BAD_INPUT;
  }
  const command = commands[name];
  let budget: ReturnType<typeof applyBudgetOptions> | undefined;
  try {
    budget = applyBudgetOptions(rest);
    return await command.run(budget.args, io);
  } catch (e) {
    if (e instanceof UsageError) {
      io.err(`strainsheet ${name}: ${e.message}\n\n${command.usage}\n`);
      return EXIT_BAD_INPUT;
    }
    if (e instanceof SheetLoadError) {
      io.err(`strainsheet ${name}: ${e.message}\n`);
      return EXIT_BAD_INPUT;
    }
    io.err(`strainsheet ${name}: unexpected failure: ${(e as Error)?.stack ?? String(e)}\n`);
    return EXIT_BAD_INPUT;
  } finally {
    budget?.done();
  }
}
