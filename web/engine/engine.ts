// The one place the web app imports the sheet engine from src/ (the engine never imports the DOM).
export { Sheet } from '../../src/sheet/sheet';
export { formatValue } from '../../src/sheet/formatValue';
export { sheetTextFromBytes } from '../../src/sheet/sheetFile';
export { isSheetObject, type SheetObject } from '../../src/sheet/sheetObject';
export type { CellSpec, CellState, SheetObserver } from '../../src/sheet/types';
export type { CellError } from '../../src/sheet/cellError';
export type { Builtin, BuiltinArg } from '../../src/sheet/builtin';

import { setCellBudget } from '../../src/sheet/evaluationBudget';
/**
 * The app evaluates on the page's thread, in slices (APP_SLICE_MS, slices.ts) between the page's
 * events, so a recalculation of many cells never holds the page. One cell's evaluation is not
 * split: its list work and function-cell calls stop after APP_CELL_SECONDS (the command line's
 * default is 5 s), so a slow formula, typed or restored from the autosave, holds the page for at
 * most about that long before it shows a 'limit' error.
 */
export const APP_CELL_SECONDS = 1;
setCellBudget(APP_CELL_SECONDS);
