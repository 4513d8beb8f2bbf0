// The live sheet behind the screen: one Sheet, per-cell signals the rows read, undo/redo, and
// performance marks the UI benchmark reads. Every edit goes through `edit()`, so every edit can be undone.
// The sheet's recalculation is deferred and run here in slices of APP_SLICE_MS between the page's
// events: a long recalculation never holds the page, and an edit made meanwhile joins it. A cell
// that runs out of the page's budget is evaluated off the page (OffPageRunner) and supplied back.
import { batch, createSignal, untrack, type Accessor, type Setter } from 'solid-js';
import { Sheet, type CellSpec, type CellState } from '../engine/engine';
import { APP_SLICE_MS, yieldToPage } from '../engine/slices';
import '../engine/pageBudget'; // the page's budget per cell and hand-off (not the command line's)
import { OffPageRunner, type OffPageWorkerLike } from '../engine/offPageRunner';
import { groupsToLoad, loadBuiltinGroups, loadEveryBuiltinGroup } from '../engine/builtinsNeeded';
import { ObjectCells } from './objectCells';
import { applyChange, captureSheet, captureText, changeBetween, isEmptyChange, type SheetCapture } from './sheetChange';
import { SheetHistory, type HistoryStep } from './sheetHistory';

/** What views that scan the whole sheet read (see SheetSession.reader). */
export interface WholeSheetReader {
  cells: CellSpec[];
  /** The cells whose value is a sheet object or a function, in sheet order. */
  objects: CellSpec[];
  valueOf(name: string): unknown;
  stateOf(name: string): CellState;
  /** A cell's spec (a copy), or undefined when there is no such cell. */
  specOf(name: string): CellSpec | undefined;
  /** Names a cell reads directly ([] for no such cell). */
  inputsOf(name: string): string[];
}

/** Outcome of an edit: refused edits (bad name, ...) carry the engine's reason for the user. */
export type EditOutcome = { ok: true } | { ok: false; message: string };


/**
 * Cells the recalculation brings up to date before the rest (Sheet.firstCells): the key result
 * every sheet of this kind leads with (KeyResultsBar picks it by name), so that it shows as soon as
 * its inputs are evaluated, whatever slow cells the sheet holds.
 */
export const FIRST_RESULTS: readonly string[] = ['A_yr'];

export class SheetSession {
  private sheet: Sheet;
  private unsubscribe: () => void = () => {};
  private states = new Map<string, [Accessor<CellState>, Setter<CellState>]>();
  private refreshQueued = false;

  /** Bumps when cells are added, removed, renamed, moved or their specs change. */
  readonly structure: Accessor<number>;
  private setStructure: Setter<number>;
  /** Bumps after any recalculation (any value may have changed). */
  readonly revision: Accessor<number>;
  private setRevision: Setter<number>;
  readonly canUndo: Accessor<string | null>;
  private setCanUndo: Setter<string | null>;
  readonly canRedo: Accessor<string | null>;
  private setCanRedo: Setter<string | null>;
  /** Cells the unfinished recalculation has still to look at (0 when the values are up to date). */
  readonly cellsToRecalculate: Accessor<number>;
  private setCellsToRecalculate: Setter<number>;
  /**
   * True once the first sheet's first results (FIRST_RESULTS) have been evaluated, or it had
   * none: what they do not need (the plots) starts loading then, so as not to delay them.
   */
  readonly firstResultsDone: Accessor<boolean>;
  private setFirstResultsDone: Setter<boolean>;
  /** Bumps when a recalculation is complete (or a sheet is put in place). */
  readonly settled: Accessor<number>;
  private setSettled: Setter<number>;
  private sliceQueued = false;
  private measureEdit = false;
  private settledWaiters: Array<() => void> = [];
  /** Called after each edit that changed the sheet (autosave listens here). */
  onChange: (session: SheetSession) => void = () => {};
  /** Evaluates the cells the sheet hands off; an outcome the sheet takes is recalculated from like an edit. */
  private readonly offPage: OffPageRunner;

  /** `offPageWorker` starts the worker for cells evaluated off the page (a Web Worker unless given). */
  constructor(sheet: Sheet, offPageWorker?: () => OffPageWorkerLike) {
    this.offPage = new OffPageRunner((name, ticket, state) => {
      if (this.sheet.supplyOffPage(name, ticket, state)) this.runSlice();
    }, offPageWorker);
    [this.structure, this.setStructure] = createSignal(0);
    [this.revision, this.setRevision] = createSignal(0);
    [this.canUndo, this.setCanUndo] = createSignal<string | null>(null);
    [this.canRedo, this.setCanRedo] = createSignal<string | null>(null);
    [this.cellsToRecalculate, this.setCellsToRecalculate] = createSignal(0);
    [this.settled, this.setSettled] = createSignal(0);
    [this.firstResultsDone, this.setFirstResultsDone] = createSignal(false);
    this.sheet = sheet;
    this.indexObjects();
    this.attach();
    this.runSlice();
  }

  /** Resolves once the values are up to date (at once when they are). */
  whenSettled(): Promise<void> {
    if (!this.sheet.recalculating) return Promise.resolve();
    return new Promise((resolve) => this.settledWaiters.push(resolve));
  }

  /** Resolves once the values are up to date and no cell waits for its evaluation off the page. */
  whenComplete(): Promise<void> {
    if (!this.sheet.recalculating && !this.sheet.offPageCells().length) return Promise.resolve();
    return new Promise((resolve) => this.completeWaiters.push(resolve));
  }
  private completeWaiters: Array<() => void> = [];

  /** Runs one slice of the sheet's recalculation now, and queues the next when work is left. */
  private runSlice(): void {
    const sheet = this.sheet;
    sheet.deferRecalculation = true;
    // The built-ins' code arrives in groups (web/engine/lazyBuiltins.ts): first those the first
    // results need, then those the rest of the sheet names; the recalculation waits for them.
    const missing = groupsToLoad(sheet);
    if (missing.length > 0) {
      this.setCellsToRecalculate(sheet.cellsToRecalculate);
      this.waitForBuiltins(missing);
      return;
    }
    const start = performance.now();
    const end = start + APP_SLICE_MS;
    // The slice that brings the first results up to date ends there, so they are shown at once.
    const firstPending = sheet.firstCellsPending;
    const done = sheet.recalculateSome(() => performance.now() >= end || (firstPending && !sheet.firstCellsPending));
    this.setCellsToRecalculate(sheet.cellsToRecalculate);
    // After the first results, the other built-ins load in the background. (Not after an empty
    // sheet's: the page shows one while its first sheet loads.)
    if (!this.firstResultsDone() && !sheet.firstCellsPending && sheet.specList().length > 0) {
      this.setFirstResultsDone(true);
      loadEveryBuiltinGroup();
    }
    if (done) {
      this.offPage.sync(sheet);
      // A slice that ran long (a cell used up the page's budget) gives the page back before the
      // views read the new values, so that the two do not add up in one task.
      if (performance.now() - start > APP_SLICE_MS) {
        void yieldToPage().then(() => {
          if (this.sheet === sheet && !sheet.recalculating) this.settle();
        });
        return;
      }
      this.settle();
      return;
    }
    this.queueSlice();
  }

  /** Runs the recalculation on once these groups of built-ins have loaded (or failed to: their calls then give errors). */
  private waitForBuiltins(groups: string[]): void {
    if (this.builtinsWait) return;
    this.builtinsWait = loadBuiltinGroups(groups).then(() => {
      this.builtinsWait = null;
      this.runSlice(); // of the sheet in place now (it may have been replaced meanwhile)
    });
  }
  private builtinsWait: Promise<void> | null = null;

  /** Runs the next slice in a task of its own, after the page's events. */
  private queueSlice(): void {
    if (this.sliceQueued) return;
    this.sliceQueued = true;
    void yieldToPage().then(() => {
      this.sliceQueued = false;
      this.runSlice();
    });
  }

  /** Tells the views and the waiters that the recalculation is complete. */
  private settle(): void {
    this.setSettled((n) => n + 1);
    if (this.measureEdit) {
      // The engine's share of edit -> plot (the UI benchmark reports both).
      this.measureEdit = false;
      performance.measure('strainsheet:recalculate', 'strainsheet:edit');
    }
    const waiters = this.settledWaiters;
    this.settledWaiters = [];
    for (const w of waiters) w();
    if (this.completeWaiters.length && !this.sheet.offPageCells().length) {
      const complete = this.completeWaiters;
      this.completeWaiters = [];
      for (const w of complete) w();
    }
  }

  /** Stops the off-page evaluation of a cell (its row's Cancel): it gets a 'limit' error saying so. */
  cancelOffPage(name: string): void {
    const st = this.sheet.state(name);
    if (st.status === 'pending' && st.offPage) this.offPage.cancel(name, st.offPage.ticket, st.offPage.since);
  }

  /** The engine object, for read-only calls (builtins, evaluateWith, dependencies). */
  get current(): Sheet {
    return this.sheet;
  }

  /** The cells in sheet order: one shared array per structure change, of the engine's own specs (change neither). */
  cells(): CellSpec[] {
    this.structure();
    this.cellList ??= this.sheet.specList() as CellSpec[];
    return this.cellList;
  }
  private cellList: CellSpec[] | null = null;
  /** Each cell's place in `cells()`, made when first asked after a structure change. */
  private positions: Map<string, number> | null = null;
  private position(name: string): number {
    if (!this.positions) {
      const list = untrack(() => this.cells());
      this.positions = new Map(list.map((c, i) => [c.name, i]));
    }
    return this.positions.get(name) ?? Number.POSITIVE_INFINITY;
  }
  /** The cells holding a sheet object or a function, kept from the cells the engine reports. */
  private objectCells = new ObjectCells();

  /** Reactive state of one cell. */
  state(name: string): CellState {
    let entry = this.states.get(name);
    if (!entry) {
      entry = createSignal<CellState>(this.safeState(name), { equals: false });
      this.states.set(name, entry);
    }
    return entry[0]();
  }

  /**
   * The cells and a way to read any cell's value and state, for views that scan the whole sheet
   * (plots, key results): reactive on the cells and on each completed recalculation, not on each
   * cell's signal, so a long sheet is not scanned again after every slice of a recalculation.
   */
  reader(): WholeSheetReader {
    // Every change of the cells is followed by a completed recalculation (runSlice bumps `settled`
    // when it finds no work too), so the cells are read untracked: a long sheet put in place is
    // scanned once, when its values are there, not also while they are still pending.
    this.settled();
    const sheet = this.sheet;
    const cells = untrack(() => this.cells());
    this.syncObjects();
    const objects = this.objectCells.size === 0 ? [] : this.objectCells.inOrder((n) => this.position(n)).map((n) => cells[this.position(n)]).filter((c) => c !== undefined);
    return { cells, objects, valueOf: (n) => sheet.value(n), stateOf: (n) => sheet.state(n), specOf: (n) => sheet.get(n), inputsOf: (n) => (sheet.has(n) ? sheet.dependencies(n) : []) };
  }

  /** Reactive value of a cell, or undefined when it has none (error, pending, absent). */
  value(name: string): unknown {
    const s = this.state(name);
    return s.status === 'value' ? s.value : undefined;
  }

  dependencies(name: string): string[] {
    this.revision();
    try {
      return this.sheet.dependencies(name);
    } catch {
      return [];
    }
  }

  dependents(name: string): string[] {
    this.revision();
    try {
      return this.sheet.dependents(name);
    } catch {
      return [];
    }
  }

  toFileText(): string {
    return this.sheet.toFileText();
  }

  /** The sheet's file text as it is now, put together in slices (see Sheet.toFileTextInSlices). */
  toFileTextInSlices(): Promise<string> {
    return this.sheet.toFileTextInSlices(yieldToPage, APP_SLICE_MS);
  }

  /**
   * Applies one edit as an undoable step. Edits the engine refuses (SheetEditError) leave the
   * sheet and history as they were and return the reason.
   */
  edit(label: string, change: (sheet: Sheet) => void, opts: { group?: string } = {}): EditOutcome {
    const before = captureSheet(this.sheet);
    try {
      performance.mark('strainsheet:edit');
      change(this.sheet);
      this.measureEdit = true;
    } catch (err) {
      // A refused edit may have been partly applied: take back what it changed.
      this.bringBack(before);
      return { ok: false, message: err instanceof Error ? err.message : String(err) };
    }
    // Same edit of a row (focus to Enter or blur): one undo step (sheetHistory.ts).
    this.history.recordEdit(label, before, captureSheet(this.sheet), opts.group);
    this.updateHistorySignals();
    this.runSlice();
    this.refresh(true);
    this.onChange(this);
    return { ok: true };
  }

  /** Ends the current grouped edit: the next edit makes a new undo step. */
  closeGroup(group: string): void {
    this.history.closeGroup(group);
  }
  private history = new SheetHistory();
  /** Told when an undo or redo could not be applied (the history is then cleared). */
  onHistoryProblem: (message: string) => void = () => {};

  /** Undoes the last step: an edit is taken back by edits (no rebuild), a replaced sheet is put back. */
  undo(): boolean {
    return this.step(this.history.takeUndo(), 'before');
  }

  redo(): boolean {
    return this.step(this.history.takeRedo(), 'after');
  }

  private step(step: HistoryStep | undefined, to: 'before' | 'after'): boolean {
    if (!step) return false;
    if (step.kind === 'sheet') this.replaceSheet(to === 'before' ? step.before : step.after);
    else {
      try {
        applyChange(this.sheet, step.change, to);
      } catch (err) {
        this.history.clear();
        this.onHistoryProblem(`${to === 'before' ? 'Undo' : 'Redo'} of "${step.label}" could not be applied (${err instanceof Error ? err.message : String(err)}); the sheet is as it is now shown, and the undo history was cleared.`);
      }
      this.runSlice();
      this.refresh(true);
    }
    this.updateHistorySignals();
    this.onChange(this);
    return true;
  }

  /** Takes the sheet back to a capture of it (a refused edit's partial changes). */
  private bringBack(before: SheetCapture): void {
    const back = changeBetween(before, captureSheet(this.sheet));
    if (isEmptyChange(back)) return;
    try {
      applyChange(this.sheet, back, 'before');
      this.runSlice();
      this.refresh(true);
    } catch {
      this.replaceSheet(Sheet.fromFile(captureText(before), { deferRecalculation: true }));
    }
  }

  /** Replaces the whole sheet (open, new) as one undoable step; undo puts the replaced one back as it was. */
  load(sheet: Sheet, label: string): void {
    this.history.recordSheet(label, this.sheet, sheet);
    this.replaceSheet(sheet);
    this.updateHistorySignals();
    this.onChange(this);
  }

  /** Puts a sheet in place without an undo step or a change (the autosave loaded after start); the history starts again. */
  restore(sheet: Sheet): void {
    this.history.clear();
    this.replaceSheet(sheet);
    this.updateHistorySignals();
  }

  private replaceSheet(sheet: Sheet): void {
    this.unsubscribe();
    this.sheet = sheet;
    sheet.deferRecalculation = true;
    this.cellList = null;
    this.positions = null;
    this.indexObjects();
    this.attach();
    // The views follow the new cells in this task; the recalculation starts in the next.
    this.setCellsToRecalculate(sheet.cellsToRecalculate);
    this.queueSlice();
    this.refresh(true);
  }

  /** Brings the cells holding objects up to date with the cells reported since it was last read. */
  private syncObjects(): void {
    if (this.objectNamesToCheck) this.objectCells.keepOnly((n) => this.sheet.has(n));
    for (const n of this.objectsToCheck) this.objectCells.update(n, this.sheet.value(n));
    this.objectNamesToCheck = false;
    this.objectsToCheck.clear();
  }
  private objectsToCheck = new Set<string>();
  private objectNamesToCheck = false;

  /** Finds the cells holding objects or functions in a sheet just put in place (one look at each cell). */
  private indexObjects(): void {
    const sheet = this.sheet;
    this.objectsToCheck.clear();
    this.objectNamesToCheck = false;
    this.objectCells.rebuild(
      sheet.specList().map((c) => c.name),
      (n) => sheet.value(n),
    );
  }

  private attach(): void {
    this.sheet.firstCells = FIRST_RESULTS;
    this.unsubscribe = this.sheet.subscribe({
      pending: (name) => this.queueRefresh(false, name),
      value: (name) => this.queueRefresh(false, name),
      error: (name) => this.queueRefresh(false, name),
      structure: () => {
        this.cellList = null;
        this.positions = null;
        this.queueRefresh(true);
      },
    });
  }

  private updateHistorySignals(): void {
    this.setCanUndo(this.history.undoLabel);
    this.setCanRedo(this.history.redoLabel);
  }

  private queueRefresh(structural: boolean, name?: string): void {
    if (structural) this.structuralPending = this.objectNamesToCheck = true;
    if (name !== undefined) {
      this.touched.add(name);
      this.objectsToCheck.add(name);
    }
    if (this.refreshQueued) return;
    this.refreshQueued = true;
    queueMicrotask(() => this.refresh(this.structuralPending));
  }
  private structuralPending = false;
  /** Cells whose state the engine reported since the last refresh. */
  private touched = new Set<string>();

  /**
   * Copies the engine's states into the signals; only changed states notify. After a change of
   * structure (or a new sheet) every signal is compared, else only those of the cells reported.
   */
  private refresh(structural: boolean): void {
    this.refreshQueued = false;
    this.structuralPending = false;
    const touched = this.touched;
    this.touched = new Set();
    if (structural) {
      this.cellList = null;
      this.positions = null;
    }
    batch(() => {
      const update = (name: string, entry: [Accessor<CellState>, Setter<CellState>]) => {
        const next = this.safeState(name);
        if (!sameState(entry[0](), next)) entry[1](next);
      };
      if (structural) for (const [name, entry] of this.states) update(name, entry);
      else for (const name of touched) {
        const entry = this.states.get(name);
        if (entry) update(name, entry);
      }
      if (structural) this.setStructure((n) => n + 1);
      this.setRevision((n) => n + 1);
    });
  }

  private safeState(name: string): CellState {
    try {
      return this.sheet.state(name);
    } catch (err) {
      return { status: 'error', error: { kind: 'eval', message: `${name}: ${String(err)}` } };
    }
  }
}

function sameState(a: CellState, b: CellState): boolean {
  if (a === b) return true;
  if (a.status !== b.status) return false;
  if (a.status === 'value' && b.status === 'value') return a.value === b.value;
  if (a.status === 'pending' && b.status === 'pending') return a.offPage?.ticket === b.offPage?.ticket && a.waitsFor === b.waitsFor;
  if (a.status === 'error' && b.status === 'error') {
    return a.error.message === b.error.message && a.error.kind === b.error.kind && a.error.position === b.error.position;
  }
  return true;
}
