// `strainsheet evaluate FILE`: evaluates every cell and prints a table (or JSON).
import type { Command } from './commands';
import { parseOptions } from './optionParsing';
import { applySetOptions, loadSheet } from './sheetLoading';
import { formatValue, formatValueParts, valueToJSON } from '../sheet/formatValue';
import { EXIT_BAD_INPUT, EXIT_CELL_ERROR, EXIT_OK } from './exitCodes';
import type { Sheet } from '../sheet/sheet';

const USAGE = `strainsheet evaluate FILE [--json] [--set name=formula]...

Evaluates every cell of the sheet FILE and prints name, value and unit.
  --json               print {"cells":[{"name","value","unit","text","error"}]} instead
                       (value in SI: quantities as {"value","unit"}, text as shown in the table)
  --set name=formula   replace a cell's formula, or add the cell (repeatable);
                       --set 'f(x)=body' defines a function cell f
Exit status: 0 all cells evaluate, 1 some cell has an error (each listed on stderr as
"name: message"), 2 the file cannot be read or is invalid, or the command line is wrong.`;

/** Widest value text that sets the width of the value column. */
const MAX_VALUE_WIDTH = 48;

function pad(text: string, width: number): string {
  return text + ' '.repeat(Math.max(0, width - text.length));
}

function table(sheet: Sheet): string {
  const rows: Array<[string, string, string]> = [['name', 'value', 'unit']];
  for (const c of sheet.cells()) {
    const st = sheet.state(c.name);
    if (st.status === 'value') {
      const shown = formatValueParts(st.value, c.unit);
      rows.push([c.name, shown.number + (shown.note ? ` (${shown.note})` : ''), shown.unit]);
    } else rows.push([c.name, st.status === 'error' ? `error (${st.error.kind})` : 'pending', '']);
  }
  const w0 = Math.max(...rows.map((r) => r[0].length));
  // Long descriptions (sheet objects) do not widen the column for everyone else.
  const w1 = Math.max(...rows.map((r) => (r[1].length <= MAX_VALUE_WIDTH ? r[1].length : 0)));
  return rows.map((r) => `${pad(r[0], w0)}  ${pad(r[1], w1)}  ${r[2]}`.trimEnd()).join('\n') + '\n';
}

export const evaluateCommand: Command = {
  summary: 'evaluate a sheet file and print every cell',
  usage: USAGE,
  async run(args, io) {
    const opts = parseOptions(args, { flags: ['json', 'help'], values: ['set'] });
    if (opts.flags.has('help')) {
      io.out(USAGE + '\n');
      return EXIT_OK;
    }
    if (opts.positional.length !== 1) {
      io.err(`strainsheet evaluate: expected one sheet file, got ${opts.positional.length}\n\n${USAGE}\n`);
      return EXIT_BAD_INPUT;
    }
    const sheet = loadSheet(opts.positional[0]);
    applySetOptions(sheet, opts.values.get('set') ?? []);
    const failed: Array<[string, string]> = [];
    for (const c of sheet.cells()) {
      const st = sheet.state(c.name);
      if (st.status === 'error') failed.push([c.name, st.error.message]);
      else if (st.status === 'pending') failed.push([c.name, `${c.name}: no value`]);
    }
    if (opts.flags.has('json')) {
      const cells = sheet.cells().map((c) => {
        const st = sheet.state(c.name);
        const ok = st.status === 'value';
        return {
          name: c.name,
          value: ok ? valueToJSON(st.value) : null,
          unit: c.unit ?? null,
          text: ok ? formatValue(st.value, c.unit) : '',
          error: st.status === 'error' ? st.error.message : ok ? null : 'no value',
        };
      });
      io.out(JSON.stringify({ cells }, null, 2) + '\n');
    } else {
      io.out(table(sheet));
    }
    // Messages begin with the cell's name ("name: message").
    for (const [name, message] of failed) io.err(message.startsWith(`${name}: `) ? `${message}\n` : `${name}: ${message}\n`);
    return failed.length > 0 ? EXIT_CELL_ERROR : EXIT_OK;
  },
};
