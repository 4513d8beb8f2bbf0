// The cells the command line's `import --kind merger-table` / `--kind merger-events` writes: a table
// or a list of merger events read from a file (src/statistics/mergerTableImport.ts,
// mergerEventsImport.ts) and stored in the sheet as mergerTable("mt1;...") (mergerTable.ts).
import type { CellSpec } from '../sheet/types';
import { encodeDensityTable } from '../statistics/mergerTableEncoding';
import { importMergerTable } from '../statistics/mergerTableImport';
import { DEFAULT_EVENT_BINNING, importMergerEvents, type EventBinning } from '../statistics/mergerEventsImport';

/** The cell holding the table read from `text` (file `file`); throws ImportError naming file, line and column. */
export function mergerTableCell(name: string, text: string, file: string): CellSpec {
  const t = importMergerTable(text, file);
  const base = file.split(/[\\/]/).pop() ?? file;
  return {
    name,
    formula: `mergerTable("${encodeDensityTable(t)}")`,
    note: `merger densities d^3n/(dz dlog10M dq) read from ${base}: ${t.z.length} z x ${t.log10M.length} mass x ${t.q.length} q nodes`,
    section: 'population',
  };
}

/** The cell holding the histogram of the merger events in `text` (file `file`); throws ImportError naming file, line and column. */
export function mergerEventsCell(name: string, text: string, file: string, binning: EventBinning = DEFAULT_EVENT_BINNING): CellSpec {
  const r = importMergerEvents(text, file, binning);
  const t = r.table;
  const base = file.split(/[\\/]/).pop() ?? file;
  return {
    name,
    formula: `mergerTable("${encodeDensityTable(t)}")`,
    note: `${r.events} merger events read from ${base} (${r.totalWeight.toPrecision(6)} Mpc^-3 in all), binned into ${binning.zBins} z x ${binning.massBins} mass x ${binning.qBins} q bins (z 0 to ${t.z[t.z.length - 1].toPrecision(4)}, log10 M ${t.log10M[0].toFixed(1)} to ${t.log10M[t.log10M.length - 1].toFixed(1)}, q ${t.q[0].toPrecision(3)} to 1)`,
    section: 'population',
  };
}
