// The reactive sheet: named cells, their formulas compiled once, values recomputed downstream of
// each edit only, errors kept as values. The UI, the command line and the statistics code all
// work through this class.
import type { CellError } from './cellError';
import type { CellSpec, CellState, OffPageTicket, SheetObserver } from './types';
import type { Builtin } from './builtin';
import { compileFormula, makeCellFunction, type CompiledFormula } from './formulaCompiler';
import { DependencyGraph, type CycleThrough, type EvaluationPlan } from './dependencyGraph';
import { RankQueue } from './rankQueue';
import { checkResult, errorFromException, explainUnitMismatch, nearestName } from './evaluationError';
import { sameValue } from './valueEquality';
import { beginCell, endCell, handOffOnTimeout } from './evaluationBudget';
import { isOffPageValue } from './offPageValue';
import { checkCellName } from './cellName';
import { lockedMath } from './lockedMath';
import { SheetEditError } from './sheetEditError';
import { ALLOWED_CONSTANTS, ALLOWED_MATH_FUNCTIONS } from './allowedFunctions';
import { renameInFormula, identifierTokens } from './renameReferences';
import { canonicalCell, cellFileText, parseSheetFile, serializeSheetFile, SheetFileError, type SheetFile, FILE_FORMAT, FILE_VERSION } from './sheetFile';

export { SheetEditError } from './sheetEditError';
export { SheetFileError } from './sheetFile';

export interface SheetOptions {
  title?: string;
  notes?: string;
  cells?: CellSpec[];
  /**
   * Evaluate a cell only when it, or a cell that reads it, is read (state, value, evaluateWith):
   * for one-off uses such as the command line's jobs, which need a few cells of a sheet. Reads give
   * the values of a full recalculation; cells nothing reads are never evaluated.
   */
  evaluateOnRead?: boolean;
  /** Start with the recalculation deferred (planned, not run; see deferRecalculation). */
  deferRecalculation?: boolean;
}

interface CellRecord {
  spec: CellSpec;
  compiled: CompiledFormula;
  state: CellState;
}

type Lookup = (name: string) => CellState | undefined;

/** A recalculation under way: the cells in dependency order, how far it got, the cells it was
 *  asked to recompute and those whose value it changed. */
interface RecalcPass {
  order: string[];
  next: number;
  edited: Set<string>;
  changed: Set<string>;
  notify: boolean;
  /** Cells already brought up to date by reads (sheets that evaluate on read). */
  settled: Set<string>;
  /** Position of each cell in `order`, made on the first read. */
  index?: Map<string, number>;
  /** Where the cells the first cells need end in `order` (see firstCells). */
  firstEnd?: number;
}

/**
 * A cell with no value yet, or a cycle error that may be stale (the cycle may be gone). A cell
 * waiting for an evaluation off the page is not stale: it is evaluated again when an input changes.
 */
function isStale(state: CellState): boolean {
  if (state.status === 'pending') return !state.offPage && state.waitsFor === undefined;
  return state.status === 'error' && state.error.kind === 'cycle';
}

/** Tickets of evaluations handed off the page, unique in this thread. */
let lastTicket = 0;

function handedOff(): CellState {
  return { status: 'pending', offPage: { ticket: ++lastTicket, since: performance.now() } };
}

const PENDING: CellState = Object.freeze({ status: 'pending' }) as CellState;

function sameState(a: CellState | undefined, b: CellState): boolean {
  if (!a || a.status !== b.status) return false;
  if (a.status === 'value' && b.status === 'value') return sameValue(a.value, b.value);
  if (a.status === 'error' && b.status === 'error') {
    // An input error's text can stay the same while the problem it stands for changed (a cycle
    // renamed): cells further down quote that problem, so compare it too.
    return a.error.kind === b.error.kind && a.error.message === b.error.message && rootCause.get(a.error)?.message === rootCause.get(b.error)?.message;
  }
  // A cell that starts or stops waiting for an off-page evaluation changes what its readers wait for.
  return a.status === 'pending' && b.status === 'pending' && !a.offPage === !b.offPage && a.waitsFor === b.waitsFor;
}

function cycleError(name: string, cycle: CycleThrough): CellError {
  if (cycle.names.length === cycle.length + 1) {
    return { kind: 'cycle', message: `${name}: ${name} is on a dependency cycle ${cycle.names.join(' -> ')}`, inputs: cycle.names };
  }
  // A long cycle is shortened: its first and last names, with the count of cells on it.
  const shown = [...cycle.names.slice(0, 5), '...', ...cycle.closing, name];
  return {
    kind: 'cycle',
    message: `${name}: ${name} is on a dependency cycle of ${cycle.length} cells ${shown.join(' -> ')}`,
    inputs: cycle.names,
  };
}

/** The root cause of a failed input (so that messages down a chain name the original problem). */
const rootCause = new WeakMap<CellError, CellError>();

export class Sheet {
  private readonly records = new Map<string, CellRecord>();
  private order: string[] = [];
  private positions: Map<string, number> | null = null;
  private readonly graph = new DependencyGraph();
  private readonly observers = new Set<SheetObserver>();
  private readonly planCache = new Map<string, string[]>();
  private lastPlan: { names: string[]; outputs: string[]; key: string } | null = null;
  /** Names "did you mean" suggestions are chosen from (cells, built-ins, functions), kept until a cell is added, removed or renamed. */
  private pool: string[] | null = null;
  /** Topological ranks of the whole sheet, kept while the graph does not change. */
  private ranked: { rank: Map<string, number>; order: string[]; cycles: ReadonlySet<string> } | null = null;
  private readonly builtinNames: ReadonlySet<string>;
  /** The unfinished recalculation, when recalculation is deferred (see deferRecalculation). */
  private pass: RecalcPass | null = null;
  private deferred = false;
  /** Cells are evaluated when read (SheetOptions.evaluateOnRead). */
  private readonly onRead: boolean;
  private _title: string;
  private _notes: string;

  constructor(options: SheetOptions = {}) {
    this.builtinNames = new Set(lockedMath().builtins.keys());
    this._title = typeof options.title === 'string' ? options.title : '';
    this._notes = typeof options.notes === 'string' ? options.notes : '';
    this.onRead = options.evaluateOnRead === true;
    // A sheet evaluated on read keeps its recalculation deferred: reads run the part they need.
    this.deferred = this.onRead || options.deferRecalculation === true;
    for (const spec of options.cells ?? []) this.addLoaded(spec);
    // Deferred, the recalculation runs later, when observers may be listening: they hear it.
    this.recalculate(this.order, options.deferRecalculation === true);
  }

  /** Adds a cell of a sheet being built (compiled, not evaluated). */
  private addLoaded(spec: CellSpec): void {
    const s = this.normalize(spec);
    if (this.records.has(s.name)) throw new SheetEditError(`cell name ${s.name} appears twice`, 'a cell name must be unique');
    const compiled = this.compile(s);
    this.records.set(s.name, { spec: s, compiled, state: PENDING });
    this.order.push(s.name);
    this.graph.setDependencies(s.name, compiled.deps);
  }

  // ---- files ---------------------------------------------------------------------------------

  /** Reads a sheet file; throws SheetFileError naming the problem. */
  static fromFile(text: string, options: { evaluateOnRead?: boolean; deferRecalculation?: boolean } = {}): Sheet {
    const file = parseSheetFile(text);
    try {
      return new Sheet({ title: file.title, notes: file.notes, cells: file.cells, evaluateOnRead: options.evaluateOnRead, deferRecalculation: options.deferRecalculation });
    } catch (e) {
      if (e instanceof SheetEditError) throw new SheetFileError(`the sheet file has a bad cell: ${e.message}`);
      throw e;
    }
  }

  /**
   * Builds a sheet from a parsed file a few cells at a time, for a page that must stay responsive:
   * after each `sliceMs` of work it awaits `pause()`. The sheet comes back with its recalculation
   * deferred and not yet run (see deferRecalculation). Throws SheetFileError as fromFile does.
   */
  static async fromFileInSlices(file: SheetFile, pause: () => Promise<void>, sliceMs: number): Promise<Sheet> {
    const sheet = new Sheet({ title: file.title, notes: file.notes });
    sheet.deferred = true;
    let start = performance.now();
    for (const spec of file.cells) {
      try {
        sheet.addLoaded(spec);
        // The cell's file text now too, so the first save (an autosave) is not one long step.
        const kept = sheet.records.get(sheet.order[sheet.order.length - 1])!.spec;
        sheet.cellTexts.set(kept, cellFileText(kept));
      } catch (e) {
        if (e instanceof SheetEditError) throw new SheetFileError(`the sheet file has a bad cell: ${e.message}`);
        throw e;
      }
      if (performance.now() - start > sliceMs) {
        await pause();
        start = performance.now();
      }
    }
    // The evaluation order of every cell, worked out in slices too; the recalculation is planned
    // from it and left to the caller (recalculateSome).
    const all = new Set(sheet.order);
    const plan = await sheet.graph.planInSlices(all, sheet.positionMap(), pause, sliceMs);
    sheet.startPass(plan, all, new Set(), true);
    return sheet;
  }

  toFile(): SheetFile {
    return { format: FILE_FORMAT, version: FILE_VERSION, title: this._title, notes: this._notes, cells: this.cells() };
  }

  /** Stable JSON text (2-space indent, canonical key order, trailing newline). */
  toFileText(): string {
    const texts = this.cellTexts;
    const file: SheetFile = { format: FILE_FORMAT, version: FILE_VERSION, title: this._title, notes: this._notes, cells: this.order.map((n) => this.records.get(n)!.spec) };
    return serializeSheetFile(file, (spec) => {
      let t = texts.get(spec);
      if (t === undefined) texts.set(spec, (t = cellFileText(spec)));
      return t;
    });
  }
  /**
   * The same text, for a page that must stay responsive: the cells' texts are made a few at a time
   * (awaiting `pause()` after each `sliceMs`), then put together in one step. The text is that of
   * the sheet when the call was made, whatever edits come meanwhile.
   */
  async toFileTextInSlices(pause: () => Promise<void>, sliceMs: number): Promise<string> {
    const file: SheetFile = { format: FILE_FORMAT, version: FILE_VERSION, title: this._title, notes: this._notes, cells: this.specList() as CellSpec[] };
    const texts = this.cellTexts;
    let start = performance.now();
    for (let i = 0; i < file.cells.length; i++) {
      const spec = file.cells[i];
      if (!texts.has(spec)) texts.set(spec, cellFileText(spec));
      if ((i & 63) === 63 && performance.now() - start > sliceMs) {
        await pause();
        start = performance.now();
      }
    }
    return serializeSheetFile(file, (spec) => texts.get(spec) ?? cellFileText(spec));
  }

  /** Each cell's file text, kept while its spec (replaced on every change) is the same object. */
  private readonly cellTexts = new WeakMap<CellSpec, string>();

  // ---- reading -------------------------------------------------------------------------------

  get title(): string {
    return this._title;
  }
  set title(text: string) {
    this._title = String(text);
    this.emitStructure();
  }
  get notes(): string {
    return this._notes;
  }
  set notes(text: string) {
    this._notes = String(text);
    this.emitStructure();
  }

  /** The cells in sheet order (copies). */
  cells(): CellSpec[] {
    return this.order.map((n) => ({ ...this.records.get(n)!.spec }));
  }

  /**
   * The cells in sheet order, not copied: read them, never change them (a changed cell gets a new
   * spec object, so comparing two lists by identity finds the cells that changed).
   */
  specList(): readonly Readonly<CellSpec>[] {
    return this.order.map((n) => this.records.get(n)!.spec);
  }

  get(name: string): CellSpec | undefined {
    const r = this.records.get(name);
    return r ? { ...r.spec } : undefined;
  }

  has(name: string): boolean {
    return this.records.has(name);
  }

  state(name: string): CellState {
    const r = this.records.get(name);
    if (r) {
      this.settle([name]);
      return r.state;
    }
    return { status: 'error', error: { kind: 'name', message: `${name}: there is no cell of that name` } };
  }

  /** The cell's value, or undefined when it has none (error, pending or no such cell). */
  value(name: string): unknown {
    if (!this.records.has(name)) return undefined;
    this.settle([name]);
    const s = this.records.get(name)?.state;
    return s && s.status === 'value' ? s.value : undefined;
  }

  /** Names the cell reads directly (including names that are not cells yet). */
  dependencies(name: string): string[] {
    return this.graph.dependencies(name);
  }

  /** Cells that read this cell directly, in sheet order. */
  dependents(name: string): string[] {
    const pos = this.positionMap();
    return this.graph
      .dependents(name)
      .filter((n) => this.records.has(n))
      .sort((a, b) => pos.get(a)! - pos.get(b)!);
  }

  builtins(): Builtin[] {
    return [...lockedMath().builtins.values()];
  }

  subscribe(observer: SheetObserver): () => void {
    this.observers.add(observer);
    return () => {
      this.observers.delete(observer);
    };
  }

  // ---- deferred recalculation ----------------------------------------------------------------

  /**
   * When on, an edit only plans its recalculation and the caller runs it in slices with
   * recalculateSome (a page does, between its events); until it is complete some cells hold
   * out-of-date values. An edit made meanwhile joins the unfinished work, so the values reached
   * are those of a recalculation from scratch. Off (the default): every edit recalculates at once.
   */
  get deferRecalculation(): boolean {
    return this.deferred;
  }
  set deferRecalculation(on: boolean) {
    this.deferred = on;
    if (!on) this.recalculateSome(() => false);
  }

  /**
   * Cells whose values are wanted first, such as a page's key results: an unfinished recalculation
   * evaluates what they need (they and the cells they read, directly or not) before the rest. Each
   * part keeps its order, so the values reached are the same; they are only final sooner.
   */
  get firstCells(): readonly string[] {
    return this.first;
  }
  set firstCells(names: readonly string[]) {
    this.first = [...names];
    if (this.pass) this.putFirst(this.pass);
  }
  private first: readonly string[] = [];

  /**
   * Moves the cells the first cells need to the front of what a pass has still to do. The pass's
   * order is topological and the moved set holds every cell its members read, so both parts stay so.
   */
  private putFirst(pass: RecalcPass): void {
    if (this.first.length === 0) return;
    const needed = this.graph.upstream(this.first);
    const rest = pass.order.slice(pass.next);
    const front = rest.filter((n) => needed.has(n));
    pass.firstEnd = pass.next + front.length;
    if (front.length === 0 || front.length === rest.length) return;
    pass.order = [...pass.order.slice(0, pass.next), ...front, ...rest.filter((n) => !needed.has(n))];
    pass.index = undefined;
  }

  /**
   * Whether the unfinished recalculation has still to bring the first cells up to date (a caller
   * running it in slices may end a slice when this turns false, to show them at once).
   */
  get firstCellsPending(): boolean {
    const pass = this.pass;
    return pass !== null && pass.firstEnd !== undefined && pass.next < pass.firstEnd;
  }

  /** Whether a deferred recalculation is unfinished. */
  get recalculating(): boolean {
    return this.pass !== null;
  }

  /** Cells the unfinished recalculation has still to look at (0 when it is complete). */
  get cellsToRecalculate(): number {
    return this.pass ? this.pass.order.length - this.pass.next : 0;
  }

  /**
   * Continues the unfinished recalculation until it is complete or `stop()`, asked after each cell
   * evaluated, says to stop. True when it is complete.
   */
  recalculateSome(stop: () => boolean): boolean {
    const pass = this.pass;
    if (!pass) return true;
    const lookup: Lookup = (n) => this.records.get(n)?.state;
    let skipped = 0;
    while (pass.next < pass.order.length) {
      const name = pass.order[pass.next++];
      if (!this.step(pass, name, lookup)) {
        if ((++skipped & 1023) === 0 && stop()) break;
        continue;
      }
      if (stop()) break;
    }
    if (pass.next < pass.order.length) return false;
    this.pass = null;
    return true;
  }

  /**
   * One cell of a recalculation: evaluated when it was edited, has no value yet, its cycle error
   * may be stale (it is no longer on a cycle), or one of its inputs changed. True when evaluated.
   */
  private step(pass: RecalcPass, name: string, lookup: Lookup): boolean {
    const rec = this.records.get(name);
    if (!rec || pass.settled.has(name)) return false;
    if (!pass.edited.has(name) && !isStale(rec.state) && !rec.compiled.deps.some((d) => pass.changed.has(d))) return false;
    if (pass.notify) this.emit((o) => o.pending?.(name));
    this.store(pass, name, this.evaluateCompiled(name, rec.compiled, lookup, true));
    return true;
  }

  /**
   * In a sheet evaluated on read: runs the part of the unfinished recalculation that `names` and
   * the cells they read (directly or not) need, in the same order, so they hold their final values.
   */
  private settle(names: readonly string[]): void {
    const pass = this.pass;
    if (!this.onRead || !pass || names.every((n) => pass.settled.has(n))) return;
    pass.index ??= new Map(pass.order.map((n, i) => [n, i]));
    const index = pass.index;
    const needed = [...this.graph.upstream(names)];
    const ahead = needed.filter((n) => (index.get(n) ?? -1) >= pass.next).sort((a, b) => index.get(a)! - index.get(b)!);
    const lookup: Lookup = (n) => this.records.get(n)?.state;
    for (const name of ahead) {
      this.step(pass, name, lookup);
      pass.settled.add(name);
    }
    for (const n of needed) pass.settled.add(n);
  }

  // ---- evaluation off the page ---------------------------------------------------------------

  /** Cells handed off to be evaluated elsewhere and not yet supplied, in sheet order. */
  offPageCells(): Array<{ name: string } & OffPageTicket> {
    const out: Array<{ name: string } & OffPageTicket> = [];
    for (const name of this.order) {
      const st = this.records.get(name)!.state;
      if (st.status === 'pending' && st.offPage) out.push({ name, ...st.offPage });
    }
    return out;
  }

  /**
   * The outcome of an evaluation handed off the page. Taken (true) only while the cell still waits
   * for that ticket: an edit that changed the cell or its inputs has handed it off again or given
   * it a value. Its readers are then recalculated (deferred or not, as any edit).
   */
  supplyOffPage(name: string, ticket: number, state: CellState): boolean {
    const rec = this.records.get(name);
    if (!rec || rec.state.status !== 'pending' || rec.state.offPage?.ticket !== ticket) return false;
    rec.state = state;
    if (state.status === 'value') this.emit((o) => o.value?.(name, state.value));
    else if (state.status === 'error') this.emit((o) => o.error?.(name, state.error));
    this.recalculate([], true, [name]);
    return true;
  }

  /** The file text of these cells and of every cell they read, directly or not (all their evaluation needs). */
  closureText(names: string[]): string {
    const needed = this.graph.upstream(names);
    const cells = this.order.filter((n) => needed.has(n)).map((n) => this.records.get(n)!.spec);
    return serializeSheetFile({ format: FILE_FORMAT, version: FILE_VERSION, title: '', notes: '', cells });
  }

  // ---- editing -------------------------------------------------------------------------------

  /** Adds a cell, or replaces the cell of the same name; `index` places it. */
  setCell(spec: CellSpec, index?: number): void {
    const s = this.normalize(spec);
    const existing = this.records.get(s.name);
    if (existing) {
      const formulaChanged = existing.spec.formula !== s.formula;
      existing.spec = s;
      if (index !== undefined) this.place(s.name, index);
      this.emitStructure();
      if (formulaChanged) this.recompile(s.name);
      return;
    }
    this.records.set(s.name, { spec: s, compiled: this.compile(s), state: PENDING });
    this.graph.setDependencies(s.name, this.records.get(s.name)!.compiled.deps);
    this.order.push(s.name);
    this.positions = null;
    if (index !== undefined) this.place(s.name, index);
    this.structureChanged();
    this.emitStructure();
    this.recalculate([s.name]);
  }

  /** Changes some fields of a cell; a new `name` renames it (references follow). */
  updateCell(name: string, patch: Partial<CellSpec>): void {
    const r = this.records.get(name);
    if (!r) throw new SheetEditError(`there is no cell named ${name}`);
    let target = name;
    if (patch.name !== undefined && patch.name !== name) {
      this.renameCell(name, patch.name);
      target = patch.name;
    }
    const current = this.records.get(target)!;
    const { name: _ignored, ...rest } = patch;
    void _ignored;
    // An absent formula keeps the current one; absent optional fields are cleared.
    if (rest.formula === undefined) delete rest.formula;
    const s = this.normalize({ ...current.spec, ...rest, name: target });
    const formulaChanged = s.formula !== current.spec.formula;
    current.spec = s;
    this.emitStructure();
    if (formulaChanged) this.recompile(target);
  }

  removeCell(name: string): void {
    if (!this.records.has(name)) throw new SheetEditError(`there is no cell named ${name}`);
    this.records.delete(name);
    this.order = this.order.filter((n) => n !== name);
    this.positions = null;
    this.graph.removeCell(name);
    this.structureChanged();
    this.emitStructure();
    this.recalculate([name]);
  }

  /** Renames a cell and rewrites every formula that refers to it. */
  renameCell(oldName: string, newName: string): void {
    const r = this.records.get(oldName);
    if (!r) throw new SheetEditError(`there is no cell named ${oldName}`);
    if (oldName === newName) return;
    this.assertName(newName);
    if (this.records.has(newName)) throw new SheetEditError(`a cell named ${newName} already exists`, 'the name is taken');
    const readers = new Set(this.graph.dependents(oldName).filter((n) => this.records.has(n)));
    if (r.compiled.kind === 'function' || r.compiled.deps.includes(oldName)) readers.add(oldName);
    // Formulas in error have no known inputs; their text follows the rename too, so that fixing
    // them later finds the cell under its new name.
    for (const [name, rec] of this.records) {
      if (rec.compiled.kind === 'error' && identifierTokens(rec.spec.formula).some((t) => t.name === oldName)) readers.add(name);
    }
    const rewrites = new Map<string, CellSpec>();
    for (const reader of readers) {
      const rec = this.records.get(reader)!;
      if (rec.compiled.kind === 'function' && rec.compiled.params.includes(newName)) {
        throw new SheetEditError(
          `cannot rename ${oldName} to ${newName}: ${newName} is a parameter of the function cell ${reader}`,
          'the new name would be captured by a function parameter',
        );
      }
      const formula = renameInFormula(rec.spec.formula, oldName, newName);
      if (formula === undefined) throw new SheetEditError(`cannot rename ${oldName} safely in the formula of ${reader}`);
      rewrites.set(reader, { ...rec.spec, formula });
    }
    // Uncertainty and prior formulas (read by the statistics code) follow the rename too.
    for (const [name, rec] of this.records) {
      for (const key of ['uncertainty', 'prior'] as const) {
        const u = rec.spec[key];
        if (u && identifierTokens(u).some((t) => t.name === oldName)) {
          const renamed = renameInFormula(u, oldName, newName);
          if (renamed === undefined) throw new SheetEditError(`cannot rename ${oldName} safely in the ${key} of ${name}`);
          rewrites.set(name, { ...(rewrites.get(name) ?? rec.spec), [key]: renamed });
        }
      }
    }
    // Apply: move the record, then the rewritten formulas.
    this.records.delete(oldName);
    this.records.set(newName, r);
    r.spec = { ...r.spec, name: newName };
    // Its own messages name the cell (a syntax error's, say): compile it again under the new name.
    if (!rewrites.has(oldName)) r.compiled = this.compile(r.spec);
    this.order = this.order.map((n) => (n === oldName ? newName : n));
    this.positions = null;
    this.graph.removeCell(oldName);
    this.graph.setDependencies(newName, r.compiled.deps);
    for (const [name, spec] of rewrites) {
      const target = name === oldName ? newName : name;
      const rec = this.records.get(target)!;
      rec.spec = { ...spec, name: target };
      rec.compiled = this.compile(rec.spec);
      this.graph.setDependencies(target, rec.compiled.deps);
    }
    this.structureChanged();
    this.emitStructure();
    this.recalculate([oldName, newName, ...[...rewrites.keys()].map((n) => (n === oldName ? newName : n))], true, [newName]);
  }

  /** Moves a cell to position `index` in the sheet order. */
  moveCell(name: string, index: number): void {
    if (!this.records.has(name)) throw new SheetEditError(`there is no cell named ${name}`);
    this.place(name, index);
    this.emitStructure();
  }

  /** Puts the cells in the order given: every cell's name, each once. */
  reorder(names: readonly string[]): void {
    const unique = new Set(names);
    if (names.length !== this.order.length || unique.size !== names.length || names.some((n) => !this.records.has(n))) {
      throw new SheetEditError('a new order of the cells must name every cell once');
    }
    this.order = [...names];
    this.positions = null;
    this.ranked = null; // ties between independent cells follow sheet order
    this.emitStructure();
  }

  // ---- evaluation with overrides ---------------------------------------------------------------

  /**
   * Evaluates `outputs` with some cells' values replaced, leaving the sheet untouched. Only cells
   * between the overrides and the outputs are recomputed; the rest are read from the sheet. The
   * plan for a given set of override names and outputs is cached until the sheet changes.
   */
  evaluateWith(overrides: Record<string, unknown>, outputs: string[]): Record<string, CellState> {
    const entries = Object.entries(overrides);
    for (const [name] of entries) {
      if (!this.records.has(name)) throw new SheetEditError(`cannot override ${name}: there is no cell of that name`);
    }
    this.settle(outputs);
    // Scans and samples ask with the same names again and again: compare with the last request
    // before building the cache key.
    const last = this.lastPlan;
    let plan: string[] | undefined;
    if (last && last.outputs.length === outputs.length && last.names.length === entries.length &&
      last.outputs.every((o, i) => o === outputs[i]) && last.names.every((n, i) => n === entries[i][0])) {
      plan = this.planCache.get(last.key);
    }
    const key = plan ? '' : `${entries.map(([n]) => n).sort().join(',')}|${outputs.join(',')}`;
    if (!plan) plan = this.planCache.get(key);
    if (!plan) {
      const overridden = new Set(entries.map(([n]) => n));
      const down = this.graph.downstream(overridden);
      const up = this.graph.upstream(outputs);
      const subset = new Set([...down].filter((n) => up.has(n) && !overridden.has(n) && this.records.has(n)));
      plan = this.graph.plan(subset, this.positionMap()).order;
      this.planCache.set(key, plan);
    }
    if (key) this.lastPlan = { names: entries.map(([n]) => n), outputs: [...outputs], key };
    const local = new Map<string, CellState>();
    for (const [name, value] of entries) local.set(name, { status: 'value', value });
    const lookup: Lookup = (n) => local.get(n) ?? this.records.get(n)?.state;
    for (const name of plan) {
      const rec = this.records.get(name)!;
      local.set(name, this.evaluateCompiled(name, rec.compiled, lookup));
    }
    const result: Record<string, CellState> = {};
    for (const o of outputs) result[o] = local.get(o) ?? this.state(o);
    return result;
  }

  /**
   * Values of formulas written for existing cells, evaluated against the sheet as it is (for
   * `--set` style overrides and scans). Throws SheetEditError naming the cell when one fails.
   */
  overridesFromFormulas(formulas: Record<string, string>): Record<string, unknown> {
    const out: Record<string, unknown> = {};
    for (const [name, text] of Object.entries(formulas)) {
      if (!this.records.has(name)) throw new SheetEditError(`cannot override ${name}: there is no cell of that name`);
      const compiled = compileFormula(text, name, this.builtinNames);
      this.settle(compiled.deps);
      const state = this.evaluateCompiled(name, compiled, (n) => this.records.get(n)?.state);
      if (state.status !== 'value') {
        throw new SheetEditError(state.status === 'error' ? state.error.message : `${name}: the formula has no value`);
      }
      out[name] = state.value;
    }
    return out;
  }

  // ---- internals -----------------------------------------------------------------------------

  private normalize(spec: CellSpec): CellSpec {
    if (typeof spec !== 'object' || spec === null) throw new SheetEditError('a cell must be given as { name, formula }');
    if (typeof spec.formula !== 'string') {
      throw new SheetEditError(`the formula of cell ${String(spec.name)} must be text`);
    }
    for (const key of ['unit', 'note', 'source', 'section', 'uncertainty', 'prior'] as const) {
      const v = spec[key];
      if (v !== undefined && typeof v !== 'string') throw new SheetEditError(`the ${key} of cell ${String(spec.name)} must be text`);
    }
    this.assertName(spec.name);
    return canonicalCell(spec);
  }

  private assertName(name: unknown): asserts name is string {
    const verdict = checkCellName(name, this.builtinNames);
    if (!verdict.ok) {
      throw new SheetEditError(
        `${typeof name === 'string' ? name || '(empty)' : 'the name'} cannot be a cell name: ${verdict.reason} (try ${verdict.suggestion})`,
        verdict.reason,
        verdict.suggestion,
      );
    }
  }

  private compile(spec: CellSpec): CompiledFormula {
    return compileFormula(spec.formula, spec.name, this.builtinNames);
  }

  private recompile(name: string): void {
    const rec = this.records.get(name)!;
    const before = rec.compiled.deps;
    rec.compiled = this.compile(rec.spec);
    const after = rec.compiled.deps;
    const sameInputs = before.length === after.length && after.every((d) => before.includes(d));
    this.structureChanged();
    if (sameInputs && !this.deferred && !this.pass) {
      // The graph is as it was: recompute downstream in the cached topological order.
      this.propagate(name);
      return;
    }
    if (!sameInputs) this.graph.setDependencies(name, after);
    this.recalculate([name]);
  }

  /** The topological rank of every cell outside cycles, and the cells on cycles (cached). */
  private globalPlan(): { rank: Map<string, number>; order: string[]; cycles: ReadonlySet<string> } {
    if (!this.ranked) {
      const plan = this.graph.plan(new Set(this.order), this.positionMap());
      this.ranked = { rank: new Map(plan.order.map((n, i) => [n, i])), order: plan.order, cycles: new Set(plan.cycles.keys()) };
    }
    return this.ranked;
  }

  /**
   * Recomputes one edited cell whose inputs did not change, then, in topological rank, only the
   * cells one of whose inputs changed value.
   */
  private propagate(edited: string): void {
    const { rank, order, cycles } = this.globalPlan();
    if (cycles.has(edited)) return; // still on its cycle: the cycle error stands
    const queue = new RankQueue();
    queue.push(rank.get(edited)!);
    const lookup: Lookup = (n) => this.records.get(n)?.state;
    const notify = this.observers.size > 0;
    while (queue.size > 0) {
      const name = order[queue.pop()];
      const rec = this.records.get(name)!;
      if (notify) this.emit((o) => o.pending?.(name));
      const state = this.evaluateCompiled(name, rec.compiled, lookup, true);
      const changed = !sameState(rec.state, state);
      rec.state = state;
      if (notify) {
        if (state.status === 'value') this.emit((o) => o.value?.(name, state.value));
        else if (state.status === 'error') this.emit((o) => o.error?.(name, state.error));
      }
      if (!changed) continue;
      for (const reader of this.graph.dependentsView(name)) {
        const r = rank.get(reader);
        if (r !== undefined) queue.push(r);
      }
    }
  }

  private place(name: string, index: number): void {
    const rest = this.order.filter((n) => n !== name);
    const i = Math.max(0, Math.min(rest.length, Number.isFinite(index) ? Math.trunc(index) : rest.length));
    rest.splice(i, 0, name);
    this.order = rest;
    this.positions = null;
    this.ranked = null; // ties between independent cells follow sheet order
  }

  private positionMap(): Map<string, number> {
    if (!this.positions) this.positions = new Map(this.order.map((n, i) => [n, i]));
    return this.positions;
  }

  /**
   * Recomputes the edited cells and whatever reads them, in dependency order. A cell is
   * recomputed only when it was edited or one of its inputs changed; unchanged values stop
   * the propagation there. With deferred recalculation this only plans the work (joined with
   * the unfinished work of earlier edits); recalculateSome runs it.
   */
  private recalculate(edited: Iterable<string>, notify = true, alwaysChanged: Iterable<string> = []): void {
    this.ranked = null; // the graph or the set of cells changed
    const editedSet = new Set(edited);
    const changed = new Set(alwaysChanged);
    const old = this.pass;
    if (old) {
      // The unfinished work joins this one: cells it has still to evaluate for its own edits or
      // because they have no value yet, and the cells whose value it changed (their readers may
      // not have been recomputed yet).
      for (let i = old.next; i < old.order.length; i++) {
        const n = old.order[i];
        const rec = this.records.get(n);
        if (old.edited.has(n) || (rec && isStale(rec.state))) editedSet.add(n);
      }
      for (const n of old.changed) changed.add(n);
      notify ||= old.notify;
    }
    const all = editedSet.size === this.records.size && changed.size === 0 && [...editedSet].every((n) => this.records.has(n));
    const affected = all ? new Set(this.order) : new Set([...this.graph.downstream([...editedSet, ...changed])].filter((n) => this.records.has(n)));
    this.startPass(this.graph.plan(affected, this.positionMap()), editedSet, changed, notify);
  }

  /** Starts the recalculation of a plan (run at once unless recalculation is deferred). */
  private startPass(plan: EvaluationPlan, editedSet: Set<string>, changed: Set<string>, notify: boolean): void {
    // Edited names that are no longer cells (removed, renamed) count as changed, and so does a
    // renamed cell under its new name (cells waiting for that name must now read it).
    for (const n of editedSet) if (!this.records.has(n)) changed.add(n);
    const pass: RecalcPass = { order: plan.order, next: 0, edited: editedSet, changed, notify, settled: new Set() };
    for (const [name, cycle] of plan.cycles) {
      if (notify) this.emit((o) => o.pending?.(name));
      this.store(pass, name, { status: 'error', error: cycleError(name, cycle) });
    }
    this.putFirst(pass);
    this.pass = pass;
    if (!this.deferred) this.recalculateSome(() => false);
  }

  /** Stores a cell's new state, noting whether it changed, and tells the observers. */
  private store(pass: RecalcPass, name: string, state: CellState): void {
    const rec = this.records.get(name)!;
    if (!sameState(rec.state, state)) pass.changed.add(name);
    rec.state = state;
    if (!pass.notify || this.observers.size === 0) return;
    if (state.status === 'value') this.emit((o) => o.value?.(name, state.value));
    else if (state.status === 'error') this.emit((o) => o.error?.(name, state.error));
  }

  /**
   * Evaluates one compiled formula with inputs read through `lookup`. Never throws. In a
   * recalculation (`mayHandOff`) with hand-off on (setHandOffOnTimeout), a cell that runs out of
   * time, or reads a value held off the page, is handed off instead (see offPageCells).
   */
  private evaluateCompiled(name: string, compiled: CompiledFormula, lookup: Lookup, mayHandOff = false): CellState {
    try {
      return this.evaluateInputsAndFormula(name, compiled, lookup, mayHandOff && handOffOnTimeout());
    } catch (e) {
      // A last line of defence: whatever escaped (a value mathjs cannot copy, a failing check)
      // becomes the cell's error.
      return { status: 'error', error: errorFromException(name, e) };
    }
  }

  private evaluateInputsAndFormula(name: string, compiled: CompiledFormula, lookup: Lookup, handOff: boolean): CellState {
    if (compiled.kind === 'error') return { status: 'error', error: compiled.error };
    const inputs = new Map<string, unknown>();
    let heldInput = false;
    for (const dep of compiled.deps) {
      const st = lookup(dep);
      if (!st) {
        const near = nearestName(dep, this.suggestionPool());
        return {
          status: 'error',
          error: { kind: 'name', message: `${name}: unknown name ${dep}${near ? ` (did you mean ${near}?)` : ''}`, inputs: [dep] },
        };
      }
      if (st.status === 'error') {
        const root = st.error.kind === 'input' || st.error.kind === 'cycle' ? (rootCause.get(st.error) ?? st.error) : st.error;
        const error: CellError = {
          kind: 'input',
          message: st.error.kind === 'cycle'
            ? `${name}: input ${dep} is on a dependency cycle`
            : `${name}: input ${dep} has an error (${root.message})`,
          inputs: [dep],
        };
        rootCause.set(error, root);
        return { status: 'error', error };
      }
      if (st.status === 'pending') {
        if (st.offPage || st.waitsFor !== undefined) return { status: 'pending', waitsFor: st.offPage ? dep : st.waitsFor };
        return { status: 'error', error: { kind: 'input', message: `${name}: input ${dep} has no value yet`, inputs: [dep] } };
      }
      if (isOffPageValue(st.value)) heldInput = true;
      inputs.set(dep, st.value);
    }
    // A value held off the page cannot be used here: the cell is evaluated where it is.
    if (heldInput && handOff) return handedOff();
    if (compiled.kind === 'function') {
      return { status: 'value', value: makeCellFunction(compiled.functionName, compiled.params, compiled.body, inputs) };
    }
    const budget = beginCell();
    let state: CellState;
    try {
      const value = compiled.code.evaluate(inputs);
      const problem = checkResult(name, value);
      state = problem ? { status: 'error', error: problem } : { status: 'value', value };
    } catch (e) {
      const error = errorFromException(name, e);
      if (error.kind === 'unit') {
        const why = explainUnitMismatch(compiled.tree, inputs);
        if (why) error.message = `${name}: ${why}`;
      }
      state = { status: 'error', error };
    }
    // Out of time (even if a built-in caught the error and went on): evaluated elsewhere, with a longer budget.
    if (endCell(budget) && handOff) return handedOff();
    return state;
  }

  private suggestionPool(): string[] {
    this.pool ??= [...this.records.keys(), ...this.builtinNames, ...ALLOWED_MATH_FUNCTIONS];
    return this.pool;
  }

  /** Forgets what depends on the set of cells and their inputs (cached plans, the name pool). */
  private structureChanged(): void {
    this.planCache.clear();
    this.pool = null;
  }

  private emit(call: (o: SheetObserver) => void): void {
    for (const o of [...this.observers]) {
      try {
        call(o);
      } catch {
        // An observer's failure must not stop the recalculation of the sheet.
      }
    }
  }

  private emitStructure(): void {
    this.emit((o) => o.structure?.());
  }
}

/** Every function a formula can call: the allowed mathjs functions and the built-ins, sorted. */
export function allFunctionNames(): string[] {
  return [...new Set([...ALLOWED_MATH_FUNCTIONS, ...lockedMath().builtins.keys()])].sort();
}

/** Names a formula can use (for completion): functions, constants, and the sheet's cells. */
export function availableNames(sheet?: Sheet): string[] {
  const cells = sheet ? sheet.cells().map((c) => c.name) : [];
  return [...new Set([...cells, ...allFunctionNames(), ...ALLOWED_CONSTANTS])].sort();
}
