// The app's own find over the sheet: a long sheet draws only the rows in view, so the browser's
// find-in-page cannot see the others. Cells match on their name, formula, shown value (or error
// message), note and source, ignoring case; the search runs in slices between the page's events.
import { formatValue, type CellSpec, type CellState } from '../engine/engine';

/** The text a cell's value is found by: its value as the row shows it, or its error message. */
const shownTexts = new WeakMap<CellState, Map<string | undefined, string>>();
export function shownText(state: CellState, unit: string | undefined): string {
  if (state.status === 'pending') return '';
  let byUnit = shownTexts.get(state);
  if (!byUnit) shownTexts.set(state, (byUnit = new Map()));
  let text = byUnit.get(unit);
  if (text === undefined) {
    if (state.status === 'error') text = state.error.message;
    else {
      try {
        text = formatValue(state.value, unit);
      } catch {
        text = '';
      }
    }
    byUnit.set(unit, text);
  }
  return text;
}

export function cellMatches(spec: CellSpec, state: CellState, needle: string): boolean {
  const hit = (s: string | undefined) => s !== undefined && s.toLowerCase().includes(needle);
  return hit(spec.name) || hit(spec.formula) || hit(spec.note) || hit(spec.source) || hit(shownText(state, spec.unit));
}

/**
 * Names of the cells matching `query`, in the order given. After each `sliceMs` of work it awaits
 * `pause()`; when `cancelled()` says so it stops and returns null.
 */
export async function findCells(
  cells: readonly CellSpec[],
  stateOf: (name: string) => CellState,
  query: string,
  pause: () => Promise<void>,
  sliceMs: number,
  cancelled: () => boolean = () => false,
): Promise<string[] | null> {
  const needle = query.trim().toLowerCase();
  if (!needle) return [];
  const out: string[] = [];
  let start = performance.now();
  for (let i = 0; i < cells.length; i++) {
    const c = cells[i];
    if (cellMatches(c, stateOf(c.name), needle)) out.push(c.name);
    if ((i & 63) === 63 && performance.now() - start > sliceMs) {
      await pause();
      if (cancelled()) return null;
      start = performance.now();
    }
  }
  return out;
}
