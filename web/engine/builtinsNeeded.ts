// Which groups of built-ins a sheet on the page needs before its recalculation goes on
// (web/engine/lazyBuiltins.ts): while its first cells (the key results) are pending, the groups
// their formulas and those of the cells they read name; after, those the whole sheet names. (A
// cell's uncertainty and prior are not evaluated here: their checks and the jobs load their own.)
import { builtinGroups } from 'virtual:builtin-groups';
import { formulaTextsOfFile } from './lazyBuiltins';
import type { Sheet } from '../../src/sheet/sheet';

/** The formulas of these cells and of every cell they read, directly or not. */
function upstreamFormulas(sheet: Sheet, names: readonly string[]): string[] {
  const seen = new Set<string>();
  const stack = names.filter((n) => sheet.has(n));
  const out: string[] = [];
  while (stack.length > 0) {
    const n = stack.pop()!;
    if (seen.has(n)) continue;
    seen.add(n);
    const spec = sheet.get(n);
    if (spec) out.push(spec.formula);
    for (const d of sheet.dependencies(n)) if (!seen.has(d) && sheet.has(d)) stack.push(d);
  }
  return out;
}

/** Groups to load before the sheet's recalculation goes on ([] when none, always once every group has loaded). */
export function groupsToLoad(sheet: Sheet): string[] {
  if (builtinGroups.allLoaded || !sheet.recalculating) return [];
  const formulas = sheet.firstCellsPending ? upstreamFormulas(sheet, sheet.firstCells) : sheet.specList().map((c) => c.formula);
  return builtinGroups.groupsNamedIn(formulas);
}

export function loadBuiltinGroups(groups: string[]): Promise<void> {
  return builtinGroups.load(groups);
}

/** Loads every group not loaded yet, in the background (once the first results are shown). */
export function loadEveryBuiltinGroup(): void {
  if (!builtinGroups.allLoaded) void builtinGroups.loadAll();
}

/**
 * Loads the groups the formulas of a sheet's file text name (a worker, before it evaluates them),
 * or those a formula's text names (an uncertainty or prior). Text that starts like JSON but is no
 * sheet file is read whole, quotes included.
 */
export function loadBuiltinsNamedIn(text: string): Promise<void> {
  // A chunk worker is handed the same sheet text with every chunk: read it once.
  if (lastNamed?.text === text) return lastNamed.loaded;
  const formulas = formulaTextsOfFile(text);
  const groups = formulas ? builtinGroups.groupsNamedIn(formulas) : builtinGroups.groupsNamedIn([text], !text.trimStart().startsWith('{'));
  lastNamed = { text, loaded: builtinGroups.load(groups) };
  return lastNamed.loaded;
}

/** The last text loadBuiltinsNamedIn read and the load of the groups it names. */
let lastNamed: { text: string; loaded: Promise<void> } | undefined;
