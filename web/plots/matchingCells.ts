// Cells picked by their spec alone (a name pattern), kept per list of cells: the session hands out
// the same array until the cells change, so a view that looks for such cells after every
// recalculation goes through a long sheet once per change of its cells, not once per recalculation.
import type { CellSpec } from '../engine/engine';

const kept = new WeakMap<readonly CellSpec[], Map<string, CellSpec[]>>();

/** The cells of `cells` passing `test`, in order; `key` names the test (one key, one test). */
export function matchingCells(cells: readonly CellSpec[], key: string, test: (c: CellSpec) => boolean): CellSpec[] {
  let byKey = kept.get(cells);
  if (!byKey) kept.set(cells, (byKey = new Map()));
  let list = byKey.get(key);
  if (!list) byKey.set(key, (list = cells.filter(test)));
  return list;
}
