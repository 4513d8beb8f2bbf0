// The undo and redo history of the sheet session. An edit is kept as the change it made to the
// cells (web/state/sheetChange.ts), not as a copy of the sheet, so undoing an edit of a long sheet
// is an edit too; opening, a new sheet and the demo keep the sheet object they replaced, which
// undo puts back as it was, values included.
import type { Sheet } from '../engine/engine';
import { changeBetween, isEmptyChange, type SheetCapture, type SheetChange } from './sheetChange';

export type HistoryStep = { label: string } & ({ kind: 'cells'; change: SheetChange } | { kind: 'sheet'; before: Sheet; after: Sheet });

/** Steps kept for undo. */
export const HISTORY_LIMIT = 200;
/** Whole sheets kept by the history (each replaced sheet is held with its values). */
export const SHEETS_KEPT = 8;

export class SheetHistory {
  private undoStack: HistoryStep[] = [];
  private redoStack: HistoryStep[] = [];
  /** The grouped edit under way (a row being typed into) and the sheet before its first edit. */
  private openGroup: string | null = null;
  private groupStart: SheetCapture | null = null;

  get undoLabel(): string | null {
    return this.undoStack.at(-1)?.label ?? null;
  }
  get redoLabel(): string | null {
    return this.redoStack.at(-1)?.label ?? null;
  }

  /**
   * Records an edit. Edits of the same group in a row make one step, from before the first of them;
   * when they come back to where the group started, the step goes. An edit that changed nothing
   * leaves no step.
   */
  recordEdit(label: string, before: SheetCapture, after: SheetCapture, group?: string): void {
    if (group !== undefined && group === this.openGroup && this.groupStart && this.undoStack.at(-1)?.kind === 'cells') {
      const step = this.undoStack.pop()!;
      const change = changeBetween(this.groupStart, after);
      if (!isEmptyChange(change)) this.undoStack.push({ label: step.label, kind: 'cells', change });
      return;
    }
    const change = changeBetween(before, after);
    if (isEmptyChange(change)) return;
    this.push({ label, kind: 'cells', change });
    this.openGroup = group ?? null;
    this.groupStart = before;
  }

  /** Records the replacement of the whole sheet. */
  recordSheet(label: string, before: Sheet, after: Sheet): void {
    this.push({ label, kind: 'sheet', before, after });
  }

  /** Ends the grouped edit: the next edit makes a new step. */
  closeGroup(group: string): void {
    if (this.openGroup === group) this.endGroup();
  }

  /** The step to undo (now kept for redo), if any. */
  takeUndo(): HistoryStep | undefined {
    this.endGroup();
    const step = this.undoStack.pop();
    if (step) this.redoStack.push(step);
    return step;
  }

  /** The step to redo (now kept for undo), if any. */
  takeRedo(): HistoryStep | undefined {
    this.endGroup();
    const step = this.redoStack.pop();
    if (step) this.undoStack.push(step);
    return step;
  }

  clear(): void {
    this.undoStack = [];
    this.redoStack = [];
    this.endGroup();
  }

  private endGroup(): void {
    this.openGroup = null;
    this.groupStart = null;
  }

  private push(step: HistoryStep): void {
    this.endGroup();
    this.undoStack.push(step);
    this.redoStack = [];
    if (this.undoStack.length > HISTORY_LIMIT) this.undoStack.shift();
    // Past the oldest kept sheet nothing can be undone: drop the steps up to it.
    if (this.undoStack.filter((s) => s.kind === 'sheet').length > SHEETS_KEPT) {
      this.undoStack.splice(0, this.undoStack.findIndex((s) => s.kind === 'sheet') + 1);
    }
  }
}
