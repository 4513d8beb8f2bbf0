// The page's evaluation settings, set when the page's session module loads (sheetSession.ts), not
// in engine.ts: modules shared with the command line (plots for `strainsheet plot`) import the
// engine, and the command line keeps its own budget and no hand-off.
import { setCellBudget, setHandOffOnTimeout } from '../../src/sheet/evaluationBudget';

/**
 * The page evaluates in slices (APP_SLICE_MS, slices.ts) between its events, so a recalculation of
 * many cells never holds it. One cell's evaluation is not split: its list work and function-cell
 * calls (and population integrals) stop after APP_PAGE_CELL_SECONDS, and the cell is then handed
 * off, not failed: a worker evaluates it with the command line's budget (DEFAULT_CELL_SECONDS, 5 s)
 * and its value comes back (offPageRunner.ts). So a slow formula, typed or restored from the
 * autosave, holds the page for about this long at most, once, and still gets its value.
 */
export const APP_PAGE_CELL_SECONDS = 0.1;
setCellBudget(APP_PAGE_CELL_SECONDS);
setHandOffOnTimeout(true);
