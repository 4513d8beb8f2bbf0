// The checks of the row annotations (rowAnnotations.ts), in one module loaded on first use: the
// statistics code they call is not needed to show the sheet.
import { cellDistribution } from '../../src/statistics/sheetMonteCarlo';
import { freeParameter } from '../../src/statistics/priors';
import type { Sheet } from '../engine/engine';

function problemOf(check: () => void): string | null {
  try {
    check();
    return null;
  } catch (err) {
    return err instanceof Error ? err.message : String(err);
  }
}

/** Null when `text` is a distribution the cell can be drawn from, else what is wrong. */
export const uncertaintyProblem = (sheet: Sheet, cell: string, text: string) => problemOf(() => cellDistribution(sheet, cell, text));

/** Null when `text` is a prior `strainsheet infer` accepts for the cell, else what is wrong (names the cell). */
export const priorProblem = (sheet: Sheet, cell: string, text: string) => problemOf(() => freeParameter(sheet, cell, { prior: text }));
