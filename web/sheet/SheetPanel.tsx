// The sheet: sections of named rows (a long sheet draws only the rows in view), and a form to
// add a cell to any section.
import { createMemo, createSignal, For, Show } from 'solid-js';
import { useServices } from '../app/services';
import type { CellSpec } from '../engine/engine';
import { CellRow } from './CellRow';
import { FormulaBox } from './FormulaBox';
import { groupBySection, LOOSE_SECTION, sectionChoices } from './sections';
import { createRowWindow, titleKey } from './rowWindow';
import { FindBar } from './FindBar';

export function SheetPanel() {
  const services = useServices();
  const { session } = services;
  const specs = createMemo(() => {
    const map = new Map<string, CellSpec>();
    for (const c of session.cells()) map.set(c.name, c);
    return map;
  });
  // Sections and rows are keyed by name (plain strings), so an edit that changes the structure
  // keeps every row that is still there, with its focus and the text being typed.
  const groups = createMemo(() => groupBySection(session.cells()));
  const sectionNames = createMemo(() => groups().map((g) => g.name), undefined, { equals: sameList });
  const rows = createRowWindow(services, groups);

  return (
    <div class="sheet">
      <FindBar />
      <Show when={session.cellsToRecalculate() > 0}>
        <p class="recalculating" role="status" data-recalculating={session.cellsToRecalculate()}>
          Recalculating: {thousands(session.cellsToRecalculate())} cells to look at; values shown may be out of date.
        </p>
      </Show>
      <div class="sheet-table" role="table" aria-label="Cells of the sheet">
        <div class="sheet-head" role="row">
          <span role="columnheader">name</span>
          <span role="columnheader">formula</span>
          <span role="columnheader">value</span>
          <span role="columnheader">status</span>
          <span role="columnheader">note · source</span>
        </div>
        <div class="sheet-rows" role="presentation" ref={rows.attach}>
          <For each={sectionNames()}>
            {(section) => (
              <section class="sheet-section" data-section={section} role="rowgroup" aria-label={section}>
                <div class="row-slot" data-row-slot={titleKey(section)} ref={rows.measure}>
                  <div class="section-title-row" role="row">
                    <div role="cell">
                      <h2 class="section-title">{section}</h2>
                    </div>
                  </div>
                </div>
                <For each={rows.drawnIn(section)}>
                  {(n) => {
                    // The row's spec, or its last one while the row is being removed (a sheet
                    // replaced): reads that come before the removal must not fail.
                    let last: CellSpec | undefined;
                    const spec = () => (last = specs().get(n) ?? last);
                    // One element per row (the rows not drawn above it are its top margin), so
                    // that drawing other rows never moves it (a moved element loses the focus).
                    return (
                      <div class="row-slot" data-row-slot={n} ref={rows.measure} style={{ 'margin-top': rows.gapBefore(n) > 0 ? `${rows.gapBefore(n)}px` : undefined }}>
                        <Show when={spec()}>
                          <CellRow spec={spec()!} />
                        </Show>
                      </div>
                    );
                  }}
                </For>
                <Show when={rows.gapAfter(section) > 0}>
                  <div class="row-gap" aria-hidden="true" style={{ height: `${rows.gapAfter(section)}px` }} />
                </Show>
              </section>
            )}
          </For>
        </div>
      </div>
      <Show when={sectionNames().length === 0}>
        <p class="empty-sheet">This sheet has no cells yet. Add one below.</p>
      </Show>
      <AddCellForm />
    </div>
  );
}

/** 20000 as "20,000" (not toLocaleString: its first call loads locale data, tens of milliseconds). */
function thousands(n: number): string {
  return String(n).replace(/\B(?=(\d{3})+(?!\d))/g, ',');
}

function sameList(a: string[], b: string[]): boolean {
  return a.length === b.length && a.every((x, i) => x === b[i]);
}

function AddCellForm() {
  const services = useServices();
  const { session } = services;
  const [error, setError] = createSignal<string | null>(null);
  const choices = createMemo(() => sectionChoices(session.cells()), undefined, { equals: sameList });
  let nameEl!: HTMLInputElement;
  let formEl!: HTMLFormElement;
  const [formula, setFormula] = createSignal('');
  let sectionEl!: HTMLInputElement;
  let unitEl!: HTMLInputElement;

  const add = (e: Event) => {
    e.preventDefault();
    // A function cell is named once: by its formula's head, name(args) = body.
    const head = /^\s*([A-Za-z_][A-Za-z0-9_]*)\s*\([^()]*\)\s*=(?!=)/.exec(formula());
    const typed = nameEl.value.trim();
    if (head && typed && typed !== head[1]) return setError(`The formula defines the function ${head[1]}; leave the name empty (it is taken from the formula) or write ${head[1]}.`);
    const name = head ? head[1] : typed;
    const section = sectionEl.value.trim();
    const unit = unitEl.value.trim();
    if (!name) return setError('Give the new cell a name (or write a function as name(args) = body).');
    if (session.cells().some((c) => c.name === name)) return setError(`A cell named ${name} already exists.`);
    const spec: CellSpec = { name, formula: formula() || '0' };
    if (section && section !== LOOSE_SECTION) spec.section = section;
    if (unit) spec.unit = unit;
    const r = session.edit(`add ${name}`, (sheet) => sheet.setCell(spec));
    if (!r.ok) return setError(r.message);
    setError(null);
    nameEl.value = '';
    setFormula('');
    unitEl.value = '';
    queueMicrotask(() => services.focusCell(name));
  };

  return (
    <form class="add-cell no-print" ref={formEl} onSubmit={add} aria-label="Add a cell">
      <h2 class="section-title">add a cell</h2>
      <div class="add-fields">
        <label>
          name <input ref={nameEl} name="name" spellcheck={false} autocomplete="off" placeholder="e.g. T_span (a function: from its formula)" />
        </label>
        <label class="grow">
          formula
          <FormulaBox
            name=""
            formula=""
            onCommit={() => undefined}
            onNavigate={() => undefined}
            field={{ inputName: 'formula', label: 'Formula of the new cell', placeholder: 'e.g. 12.5 yr, or f(x) = 2 x', onDraft: setFormula, onSubmit: () => formEl.requestSubmit(), value: formula }}
          />
        </label>
        <label>
          display unit <input ref={unitEl} name="unit" spellcheck={false} autocomplete="off" placeholder="optional" />
        </label>
        <label>
          section <input ref={sectionEl} name="section" list="section-names" autocomplete="off" placeholder={LOOSE_SECTION} />
        </label>
        <datalist id="section-names">
          <For each={choices()}>{(s) => <option value={s} />}</For>
        </datalist>
        <button type="submit">Add</button>
      </div>
      <Show when={error()}>
        <div class="form-error" role="alert">{error()}</div>
      </Show>
    </form>
  );
}
