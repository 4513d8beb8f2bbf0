// The worker's copy of the cells a page hands off (Sheet.offPageCells): each request brings the
// file text of a cell and of every cell it reads (Sheet.closureText); the copy takes those cells as
// edits, so cells evaluated for an earlier request keep their values (a slow cell read by several
// cells is evaluated once), drops the others, and recalculates in one pass.
import { Sheet } from './sheet';
import { parseSheetFile } from './sheetFile';
import type { CellState } from './types';

export class SheetReplica {
  private sheet = new Sheet({ deferRecalculation: true });

  /** The state of `name` after taking the cells of `closureText`. Throws SheetFileError on bad text. */
  evaluate(closureText: string, name: string): CellState {
    const file = parseSheetFile(closureText);
    const sheet = this.sheet;
    sheet.deferRecalculation = true;
    const wanted = new Set(file.cells.map((c) => c.name));
    for (const c of sheet.cells()) if (!wanted.has(c.name)) sheet.removeCell(c.name);
    for (const c of file.cells) {
      if (sheet.get(c.name)?.formula !== c.formula) sheet.setCell(c);
    }
    sheet.deferRecalculation = false; // runs the planned recalculation
    return sheet.state(name);
  }
}
