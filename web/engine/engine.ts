// The one place the web app imports the sheet engine from src/ (the engine never imports the DOM).
export { Sheet } from '../../src/sheet/sheet';
export { formatValue } from '../../src/sheet/formatValue';
export { sheetTextFromBytes } from '../../src/sheet/sheetFile';
export { isSheetObject, type SheetObject } from '../../src/sheet/sheetObject';
export { isOffPageValue } from '../../src/sheet/offPageValue';
export type { CellSpec, CellState, SheetObserver } from '../../src/sheet/types';
export type { CellError } from '../../src/sheet/cellError';
export type { Builtin, BuiltinArg } from '../../src/sheet/builtin';

import { setCellBudget, setHandOffOnTimeout } from '../../src/sheet/evaluationBudget';
/**
 * The page evaluates in slices (APP_SLICE_MS, slices.ts) between its events, so a recalculation of
 * many cells never holds it. One cell's evaluation is not split: its list work and function-cell
 * calls stop after APP_PAGE_CELL_SECONDS, and the cell is then handed off, not failed: a worker
 * evaluates it with the command line's budget (DEFAULT_CELL_SECONDS, 5 s) and its value comes back
 * (web/engine/offPageRunner.ts). So a slow formula, typed or restored from the autosave, holds the
 * page for about this long at most, once, and still gets its value.
 */
export const APP_PAGE_CELL_SECONDS = 0.1;
setCellBudget(APP_PAGE_CELL_SECONDS);
setHandOffOnTimeout(true);
