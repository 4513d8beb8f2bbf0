// The cell table as CSV: one row per cell with its formula, shown value, value in SI, unit and notes.
import { csvDocument } from './csvText';
import { formatValue, isSheetObject, type CellSpec, type CellState } from '../engine/engine';

export interface CellTableSource {
  cells(): CellSpec[];
  state(name: string): CellState;
}

export const CELL_TABLE_HEADER = ['name', 'section', 'formula', 'value', 'value_si', 'display_unit', 'status', 'message', 'note', 'source'];

/** A plain SI number for a value, where it has one (numbers, quantities); blank otherwise. */
function siNumber(v: unknown): number | null {
  if (typeof v === 'number') return v;
  if (v && typeof v === 'object' && !isSheetObject(v) && 'value' in v && typeof (v as { value: unknown }).value === 'number' && 'units' in v) {
    return (v as { value: number }).value;
  }
  return null;
}

export function cellTableCsv(source: CellTableSource): string {
  const rows = source.cells().map((c) => {
    const s = source.state(c.name);
    let shown = '';
    let si: number | null = null;
    if (s.status === 'value') {
      try {
        shown = formatValue(s.value, c.unit);
      } catch {
        shown = '';
      }
      si = siNumber(s.value);
    }
    return [
      c.name,
      c.section ?? '',
      c.formula,
      shown,
      si,
      c.unit ?? '',
      s.status,
      s.status === 'error' ? s.error.message : '',
      c.note ?? '',
      c.source ?? '',
    ];
  });
  return csvDocument(CELL_TABLE_HEADER, rows);
}
