// `strainsheet import SHEET DATA --as NAME --kind free-spectrum|amplitude-gamma|merger-table`: reads a
// measurement file (CSV or JSON) or a table of merger densities (CSV) and stores it in the sheet as the cell NAME (added, or replaced keeping its note
// and section). On any error the sheet file is left exactly as it was.
import { readFileSync, renameSync, writeFileSync } from 'node:fs';
import type { Command } from './commands';
import { parseOptions, UsageError } from './optionParsing';
import { EXIT_BAD_INPUT, EXIT_CELL_ERROR, EXIT_OK } from './exitCodes';
import { SheetLoadError } from './sheetLoading';
import { parseSheetFile, serializeSheetFile, SheetFileError } from '../sheet/sheetFile';
import { Sheet } from '../sheet/sheet';
import { measurementCell, type MeasurementKind } from '../builtins/measurementCells';
import { mergerEventsCell, mergerTableCell } from '../builtins/mergerTableCells';
import { DEFAULT_EVENT_BINNING, type EventBinning } from '../statistics/mergerEventsImport';
import { ImportError } from '../statistics/importText';
import type { ImportedQuantity } from '../statistics/freeSpectrumImport';
import { math } from '../sheet/mathInstance';

const USAGE = `strainsheet import SHEET DATA --as NAME --kind free-spectrum|amplitude-gamma|merger-table|merger-events [options]

Reads measured posterior samples from DATA (CSV or JSON) and stores them inside SHEET as the cell
NAME (added, or its formula replaced). Layouts are described in docs/freeSpectrum.md.
  --kind free-spectrum     per-bin samples: wide CSV (header "2.26 nHz,4.53 nHz,..."), long CSV
                           (header "f_nHz,value") or JSON
  --kind amplitude-gamma   CSV with columns log10_A (or A) and gamma
  --kind merger-table      CSV z,log10_M_Msun,q,density_Mpc^-3 (d^3n/(dz dlog10M dq) on a grid, z slowest,
                           q fastest; docs/mergerTables.md), stored as a population cell
  --kind merger-events     CSV z,log10_M_Msun,q,weight_Mpc^-3 (one merger per row), binned into a population
  --bins Z,M,Q             bins in z, log10 M and q for merger-events (default 16,24,8)
  --quantity Q             free spectrum values: log10_rho (default), log10_hc, rho or hc
  --prior LO:HI            uniform prior of the analysis on the sampled quantity, divided out
  --span T                 span of the data with a unit (default 1/f_1), e.g. 14yr
  --fref F                 reference frequency of A with a unit (default 1/yr), e.g. 31.7nHz
  --thin                   thin samples beyond the stored limit (the factor is stated in the note)
  --output FILE            write the result to FILE instead of SHEET
Exit status: 0 stored, 1 stored but the new cell has an error, 2 bad command line, sheet or data
(nothing written).`;

function quantityOf(v: string | undefined): ImportedQuantity | undefined {
  if (v === undefined) return undefined;
  if (!['log10_rho', 'log10_hc', 'rho', 'hc'].includes(v)) throw new UsageError(`--quantity must be log10_rho, log10_hc, rho or hc, got "${v}"`);
  return v as ImportedQuantity;
}

function binningOf(v: string | undefined): EventBinning {
  if (v === undefined) return DEFAULT_EVENT_BINNING;
  const parts = v.split(',').map((p) => Number(p.trim()));
  if (parts.length !== 3 || !parts.every((n) => Number.isInteger(n) && n >= 1 && n <= 1000)) throw new UsageError(`--bins needs three whole numbers Z,M,Q (bins in z, log10 M, q), e.g. 16,24,8; got "${v}"`);
  return { zBins: parts[0], massBins: parts[1], qBins: parts[2] };
}

function siOf(text: string | undefined, base: string, option: string): number | undefined {
  if (text === undefined) return undefined;
  try {
    const u = math.unit(text.replace(/^(\d[\d.eE+-]*)\s*/, '$1 '));
    return u.toNumber(base);
  } catch {
    throw new UsageError(`${option} needs a number with a unit, e.g. ${option === '--span' ? '14yr' : '31.7nHz'}; got "${text}"`);
  }
}

export const importCommand: Command = {
  summary: 'store measured posterior samples (free spectrum or (A, gamma)) or a table of merger densities inside a sheet',
  usage: USAGE,
  async run(args, io) {
    const opts = parseOptions(args, { flags: ['help', 'thin'], values: ['as', 'kind', 'quantity', 'prior', 'span', 'fref', 'output', 'bins'] });
    if (opts.flags.has('help')) {
      io.out(USAGE + '\n');
      return EXIT_OK;
    }
    if (opts.positional.length !== 2) throw new UsageError(`expected a sheet file and a data file, got ${opts.positional.length} file(s)`);
    const [sheetPath, dataPath] = opts.positional;
    const name = opts.values.get('as')?.[0];
    if (!name) throw new UsageError('--as NAME is required: the cell that will hold the data');
    const kind = opts.values.get('kind')?.[0] as MeasurementKind | 'merger-table' | 'merger-events' | undefined;
    if (kind !== 'free-spectrum' && kind !== 'amplitude-gamma' && kind !== 'merger-table' && kind !== 'merger-events') throw new UsageError('--kind must be free-spectrum, amplitude-gamma, merger-table or merger-events');
    const binning = binningOf(opts.values.get('bins')?.[0]);
    let prior: { lower: number; upper: number } | undefined;
    const p = opts.values.get('prior')?.[0];
    if (p !== undefined) {
      const m = /^\s*([+-]?[\d.]+(?:[eE][+-]?\d+)?)\s*:\s*([+-]?[\d.]+(?:[eE][+-]?\d+)?)\s*$/.exec(p);
      if (!m || !(Number(m[1]) < Number(m[2]))) throw new UsageError(`--prior needs LO:HI with LO < HI, e.g. -10:-4; got "${p}"`);
      prior = { lower: Number(m[1]), upper: Number(m[2]) };
    }
    let sheetText: string;
    try {
      sheetText = readFileSync(sheetPath, 'utf8');
    } catch (e) {
      throw new SheetLoadError(`cannot read ${sheetPath}: ${(e as NodeJS.ErrnoException).code === 'ENOENT' ? 'no such file' : (e as Error).message}`);
    }
    let file;
    try {
      file = parseSheetFile(sheetText);
    } catch (e) {
      if (e instanceof SheetFileError) throw new SheetLoadError(`${sheetPath}: ${e.message}`);
      throw e;
    }
    let dataText: string;
    try {
      dataText = readFileSync(dataPath, 'utf8');
    } catch (e) {
      throw new SheetLoadError(`cannot read ${dataPath}: ${(e as NodeJS.ErrnoException).code === 'ENOENT' ? 'no such file' : (e as Error).message}`);
    }
    let cell;
    try {
      cell = kind === 'merger-table' ? mergerTableCell(name, dataText, dataPath) : kind === 'merger-events' ? mergerEventsCell(name, dataText, dataPath, binning) : measurementCell(name, dataText, dataPath, {
        kind,
        quantity: quantityOf(opts.values.get('quantity')?.[0]),
        spanS: siOf(opts.values.get('span')?.[0], 's', '--span'),
        fRefHz: siOf(opts.values.get('fref')?.[0], 'Hz', '--fref'),
        prior,
        thin: opts.flags.has('thin'),
      });
    } catch (e) {
      if (e instanceof ImportError) {
        io.err(`strainsheet import: ${e.message}\n${sheetPath} was not changed.\n`);
        return EXIT_BAD_INPUT;
      }
      throw e;
    }
    const i = file.cells.findIndex((c) => c.name === name);
    const cells = file.cells.slice();
    if (i >= 0) cells[i] = { ...cells[i], formula: cell.formula, note: cell.note };
    else cells.push(cell);
    const text = serializeSheetFile({ ...file, cells });
    let sheet: Sheet;
    try {
      sheet = Sheet.fromFile(text);
    } catch (e) {
      io.err(`strainsheet import: the sheet with the new cell cannot be read back: ${(e as Error).message}\n${sheetPath} was not changed.\n`);
      return EXIT_BAD_INPUT;
    }
    const out = opts.values.get('output')?.[0] ?? sheetPath;
    const tmp = `${out}.${process.pid}.tmp`;
    writeFileSync(tmp, text);
    renameSync(tmp, out);
    const st = sheet.state(name);
    if (st.status === 'error') {
      io.err(`strainsheet import: stored ${name} in ${out}, but it has an error: ${st.error.message}\n`);
      return EXIT_CELL_ERROR;
    }
    io.out(`${name}: ${cell.note}\nwritten to ${out}\n`);
    return EXIT_OK;
  },
};
