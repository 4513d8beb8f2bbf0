// Reading a measurement data file (free spectrum or (A, gamma) samples, CSV or JSON) into a cell of
// the current sheet. The file is parsed completely first; a bad file changes nothing and the message
// names the file, line and column. The readers (CSV and JSON parsers) load on first use.
import type { CellSpec } from '../engine/engine';
import type { MeasurementKind } from '../../src/builtins/measurementCells';

export const MAX_DATA_FILE_BYTES = 50_000_000;

export type DataOutcome = { ok: true; cell: CellSpec; message: string } | { ok: false; message: string };

/** (A, gamma) when the first non-comment line names a gamma column, a free spectrum otherwise. */
export function guessKind(text: string, fileName: string): MeasurementKind {
  if (/\.json$/i.test(fileName)) return 'free-spectrum';
  const head = text.split(/\r?\n/).find((l) => l.trim() !== '' && !l.trim().startsWith('#')) ?? '';
  return /(^|,)\s*gamma\s*(,|$)/i.test(head) ? 'amplitude-gamma' : 'free-spectrum';
}

const PRIOR_TAIL = /",\s*([-+\d.eE]+)\s*,\s*([-+\d.eE]+)\s*\)\s*$/;

/**
 * The prior the free-spectrum analysis used on its sampled quantity (log10 rho_k or log10 h_c), as
 * the user states it in the Open data dialog: keep the one in the cell's formula, uniform on a
 * range (common in published free spectra), or none (the samples are then read as a likelihood).
 * It is stored with the data: the last two arguments of measuredFreeSpectrum(...).
 */
export type DataPrior = { kind: 'keep' } | { kind: 'uniform'; lower: number; upper: number } | { kind: 'none' };

/** The uniform prior already in a measuredFreeSpectrum(...) formula, if any. */
export function priorInFormula(formula: string | undefined): { lower: number; upper: number } | undefined {
  const tail = formula ? PRIOR_TAIL.exec(formula) : null;
  return tail ? { lower: Number(tail[1]), upper: Number(tail[2]) } : undefined;
}

/** Checks a stated uniform range; null when it is usable, else what is wrong. */
export function priorProblem(lower: number, upper: number): string | null {
  if (!Number.isFinite(lower) || !Number.isFinite(upper)) return 'the prior range needs two numbers';
  if (!(lower < upper)) return `the prior's lower end (${lower}) must be below its upper end (${upper})`;
  return null;
}

export async function openDataFile(file: Blob & { name: string }, cells: CellSpec[], stated: DataPrior = { kind: 'keep' }): Promise<DataOutcome> {
  if (stated.kind === 'uniform') {
    const why = priorProblem(stated.lower, stated.upper);
    if (why) return { ok: false, message: `"${file.name}" was not read: ${why}. The sheet is unchanged.` };
  }
  if (file.size > MAX_DATA_FILE_BYTES) return { ok: false, message: `"${file.name}" was not read: it is larger than ${MAX_DATA_FILE_BYTES / 1e6} MB. The sheet is unchanged.` };
  let text: string;
  try {
    text = await file.text();
  } catch (err) {
    return { ok: false, message: `"${file.name}" could not be read (${err instanceof Error ? err.message : String(err)}). The sheet is unchanged.` };
  }
  const kind = guessKind(text, file.name);
  const name = kind === 'free-spectrum' ? 'measured_free_spectrum' : 'measured_A_gamma';
  const existing = cells.find((c) => c.name === name);
  const kept = priorInFormula(existing?.formula);
  const chosen = stated.kind === 'keep' ? kept : stated.kind === 'uniform' ? { lower: stated.lower, upper: stated.upper } : undefined;
  const prior = kind === 'free-spectrum' ? chosen : undefined;
  try {
    const { measurementCell } = await import('../../src/builtins/measurementCells');
    const cell = measurementCell(name, text, file.name, { kind, prior, thin: true });
    const spec: CellSpec = existing ? { ...existing, formula: cell.formula, note: cell.note } : cell;
    const priorText =
      kind !== 'free-spectrum'
        ? ''
        : prior
          ? ` Prior ${stated.kind === 'keep' ? 'kept' : 'stated'}: uniform ${prior.lower} to ${prior.upper}.`
          : stated.kind === 'none'
            ? ' No prior is divided out (stated: none).'
            : ' No prior is divided out: state it in Open data… or add priorLower, priorUpper to its formula.';
    return { ok: true, cell: spec, message: `Read ${file.name} into ${name}: ${cell.note}.${priorText}` };
  } catch (err) {
    return { ok: false, message: `${err instanceof Error ? err.message : String(err)}. The sheet is unchanged.` };
  }
}
