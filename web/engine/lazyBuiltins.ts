// The built-ins in the app, in groups loaded on demand (scripts/builtinGroupsInApp.mjs). Every
// built-in's name is known from the start, so the engine compiles, refuses and completes formulas
// as before; each name's function forwards to its group's implementation once that group's chunk
// has loaded. Whoever evaluates formulas (the page's session, the workers) first awaits the groups
// the formulas name (`load(groupsNamedIn(...))`); a call that comes before its group throws.
import type { Builtin } from '../../src/sheet/builtin';

/** One group: the built-ins of one file of src/builtins, loaded together. */
export interface BuiltinGroupSpec {
  group: string;
  names: readonly string[];
  /** Other names whose use needs this group loaded (not built-ins: mathjs functions it provides the code of). */
  triggers?: readonly string[];
  /** Text whose presence in a formula, outside double quotes, needs this group loaded (operators whose mathjs functions it provides). */
  symbols?: readonly string[];
  load: () => Promise<readonly Builtin[]>;
}

/** Identifiers in formula text (names of cells, built-ins, mathjs functions, units). */
const IDENTIFIER = /[A-Za-z_$][\w$]*/g;
/** Text in double quotes (a string of a formula, as an encoded measurement: its characters are no operators). */
const QUOTED = /"(?:[^"\\]|\\.)*"/g;

/**
 * The formula texts of a sheet file's text (its cells' formulas, uncertainties and priors), or
 * null when the text is not a sheet file (then it is a formula, or must be read whole).
 */
export function formulaTextsOfFile(text: string): string[] | null {
  if (!text.trimStart().startsWith('{')) return null;
  try {
    const file = JSON.parse(text) as { cells?: unknown };
    if (!Array.isArray(file.cells)) return null;
    return (file.cells as Array<Record<string, unknown>>).flatMap((c) => [c?.formula, c?.uncertainty, c?.prior].filter((x): x is string => typeof x === 'string'));
  } catch {
    return null;
  }
}

export class LazyBuiltins {
  private readonly groupOf = new Map<string, string>();
  private readonly triggerOf = new Map<string, string>();
  private readonly symbolsOf: Array<[string, readonly string[]]> = [];
  private readonly specs = new Map<string, BuiltinGroupSpec>();
  private readonly impl = new Map<string, (...args: unknown[]) => unknown>();
  private readonly loading = new Map<string, Promise<void>>();
  private readonly failed = new Map<string, string>();
  private readonly loaded = new Set<string>();
  private readonly list: Builtin[];

  constructor(groups: readonly BuiltinGroupSpec[]) {
    this.list = [];
    for (const g of groups) {
      this.specs.set(g.group, g);
      for (const t of g.triggers ?? []) this.triggerOf.set(t, g.group);
      if (g.symbols && g.symbols.length > 0) this.symbolsOf.push([g.group, g.symbols]);
      for (const name of g.names) {
        if (this.groupOf.has(name)) continue; // defined twice: the first is kept (as lockedMath does)
        this.groupOf.set(name, g.group);
        this.list.push({ name, fn: this.forwarder(name) } as Builtin);
      }
    }
  }

  /** Every built-in, in the order of src/builtins/index.ts: its name and a function that forwards to its group. */
  allBuiltins(): Builtin[] {
    return this.list;
  }

  /** Whether every group has loaded. */
  get allLoaded(): boolean {
    return this.loaded.size === this.specs.size;
  }

  /**
   * The groups not loaded yet (nor failed to: a failed group is not tried again) whose built-ins
   * (or triggers, or symbols) these formula texts name. `unquote`: whether text in double quotes
   * is a string of the formula (no symbols looked for there); false for text that is not a
   * formula, where quotes may hold formulas.
   */
  groupsNamedIn(texts: Iterable<string>, unquote = true): string[] {
    if (this.allLoaded) return [];
    const out = new Set<string>();
    const wanted = (g: string | undefined): g is string => g !== undefined && !this.loaded.has(g) && !this.failed.has(g);
    for (const text of texts) {
      for (const id of text.match(IDENTIFIER) ?? []) {
        const g = this.groupOf.get(id) ?? this.triggerOf.get(id);
        if (wanted(g)) out.add(g);
      }
      if (this.symbolsOf.length === 0) continue;
      const unquoted = unquote && text.includes('"') ? text.replace(QUOTED, '""') : text;
      for (const [g, symbols] of this.symbolsOf) if (wanted(g) && symbols.some((s) => unquoted.includes(s))) out.add(g);
    }
    return [...out];
  }

  /** Loads these groups (those loading already are awaited); resolves when each has loaded or failed. */
  load(groups: Iterable<string>): Promise<void> {
    return Promise.all([...groups].map((g) => this.loadGroup(g))).then(() => {});
  }

  /** Loads every group. */
  loadAll(): Promise<void> {
    return this.load(this.specs.keys());
  }

  private loadGroup(group: string): Promise<void> {
    const spec = this.specs.get(group);
    if (!spec) return Promise.resolve();
    const known = this.loading.get(group);
    if (known) return known;
    const p = spec.load().then(
      (builtins) => this.take(group, builtins),
      (err: unknown) => {
        this.failed.set(group, err instanceof Error ? err.message : String(err));
      },
    );
    this.loading.set(group, p);
    return p;
  }

  /** Gives a group's built-ins already at hand (the page imports those the demo's first result needs). */
  provide(group: string, builtins: readonly Builtin[]): void {
    if (this.specs.has(group) && !this.loaded.has(group)) this.take(group, builtins);
  }

  private take(group: string, builtins: readonly Builtin[]): void {
    for (const b of builtins) if (this.groupOf.get(b.name) === group) this.impl.set(b.name, b.fn);
    this.loaded.add(group);
    this.loading.set(group, Promise.resolve());
  }

  private forwarder(name: string): (...args: unknown[]) => unknown {
    const impl = this.impl;
    const failed = this.failed;
    const groupOf = this.groupOf;
    return function (this: unknown, ...args: unknown[]) {
      const f = impl.get(name);
      if (f) return f.apply(this, args);
      const why = failed.get(groupOf.get(name)!);
      throw new Error(why ? `the code of ${name} could not be loaded (${why}); reload the page` : `the code of ${name} has not loaded yet`);
    };
  }
}
