// Reading a measurement data file (free spectrum or (A, gamma) samples, CSV or JSON) into a cell of
// the current sheet. The file is parsed completely first; a bad file changes nothing and the message
// names the file, line and column.
import type { CellSpec } from '../engine/engine';
import { measurementCell, type MeasurementKind } from '../../src/builtins/measurementCells';

export const MAX_DATA_FILE_BYTES = 50_000_000;

export type DataOutcome = { ok: true; cell: CellSpec; message: string } | { ok: false; message: string };

/** (A, gamma) when the first non-comment line names a gamma column, a free spectrum otherwise. */
export function guessKind(text: string, fileName: string): MeasurementKind {
  if (/\.json$/i.test(fileName)) return 'free-spectrum';
  const head = text.split(/\r?\n/).find((l) => l.trim() !== '' && !l.trim().startsWith('#')) ?? '';
  return /(^|,)\s*gamma\s*(,|$)/i.test(head) ? 'amplitude-gamma' : 'free-spectrum';
}

const PRIOR_TAIL = /",\s*([-+\d.eE]+)\s*,\s*([-+\d.eE]+)\s*\)\s*$/;

export async function openDataFile(file: Blob & { name: string }, cells: CellSpec[]): Promise<DataOutcome> {
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
  const tail = existing ? PRIOR_TAIL.exec(existing.formula) : null;
  const prior = kind === 'free-spectrum' && tail ? { lower: Number(tail[1]), upper: Number(tail[2]) } : undefined;
  try {
    const cell = measurementCell(name, text, file.name, { kind, prior, thin: true });
    const spec: CellSpec = existing ? { ...existing, formula: cell.formula, note: cell.note } : cell;
    const priorText = kind === 'free-spectrum' ? (prior ? ` Prior kept: uniform ${prior.lower} to ${prior.upper}.` : ' No prior is divided out: add priorLower, priorUpper to its formula.') : '';
    return { ok: true, cell: spec, message: `Read ${file.name} into ${name}: ${cell.note}.${priorText}` };
  } catch (err) {
    return { ok: false, message: `${err instanceof Error ? err.message : String(err)}. The sheet is unchanged.` };
  }
}
