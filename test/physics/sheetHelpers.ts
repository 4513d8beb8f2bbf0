// Builds a sheet from cells and reads a value or an error, for the built-in tests.
import { Sheet } from '../../src/sheet/sheet';
import type { CellSpec } from '../../src/sheet/types';

export function sheetOf(cells: Record<string, string>): Sheet {
  const specs: CellSpec[] = Object.entries(cells).map(([name, formula]) => ({ name, formula }));
  return new Sheet({ cells: specs });
}

export function valueOf(s: Sheet, name: string): unknown {
  const st = s.state(name);
  if (st.status !== 'value') throw new Error(`${name}: ${st.status === 'error' ? st.error.message : st.status}`);
  return st.value;
}

export function errorOf(s: Sheet, name: string): string {
  const st = s.state(name);
  if (st.status !== 'error') throw new Error(`${name} has no error (status ${st.status})`);
  return st.error.message;
}

export function siOf(v: unknown): number {
  return typeof v === 'number' ? v : (v as { value: number }).value;
}
