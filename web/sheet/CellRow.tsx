// One named cell on screen: name, formula (editable), value with unit, status, note and source,
// and the row's actions (trace, rename, duplicate, move, delete).
import { createMemo, createSignal, For, onCleanup, Show } from 'solid-js';
import { useServices } from '../app/services';
import { formatValue, type CellSpec, type CellState } from '../engine/engine';
import { FormulaBox } from './FormulaBox';
import { ScientificText } from './ScientificText';
import { freshName, sectionChoices, sectionOf } from './sections';
import { AnnotationBadges, AnnotationEditor } from './AnnotationBadges';
import { ROW_ANNOTATION_KINDS } from './rowAnnotations';
import { LinkedText } from '../help/LinkedText';
import { OffPageStatus } from './OffPageStatus';

export function CellRow(props: { spec: CellSpec }) {
  const services = useServices();
  const { session } = services;
  const name = () => props.spec.name;
  const state = createMemo<CellState>(() => session.state(name()));
  const [renaming, setRenaming] = createSignal(false);
  const [renameError, setRenameError] = createSignal<string | null>(null);
  const [newSection, setNewSection] = createSignal(false);
  const [annotating, setAnnotating] = createSignal<string | null>(null);
  let rowEl!: HTMLDivElement;

  const shown = createMemo(() => {
    const s = state();
    if (s.status !== 'value') return '';
    try {
      return formatValue(s.value, props.spec.unit);
    } catch (err) {
      return `(cannot show: ${err instanceof Error ? err.message : String(err)})`;
    }
  });

  const commitFormula = (formula: string, group?: string) => {
    const r = session.edit(`edit ${name()}`, (sheet) => sheet.updateCell(name(), { formula }), { group });
    if (!r.ok) services.notify(`${name()}: ${r.message}`, 'error');
  };

  const rename = (next: string) => {
    const old = name();
    next = next.trim();
    if (!next || next === old) {
      setRenaming(false);
      setRenameError(null);
      return;
    }
    const r = session.edit(`rename ${old} to ${next}`, (sheet) => sheet.renameCell(old, next));
    if (r.ok) {
      setRenaming(false);
      setRenameError(null);
      queueMicrotask(() => services.focusCell(next));
    } else setRenameError(r.message);
  };

  const duplicate = () => {
    const cells = session.cells();
    const taken = new Set(cells.map((c) => c.name));
    // A function cell's name is part of its formula, so only plain cells keep the formula as is.
    const isFunction = /^\s*[A-Za-z_][A-Za-z0-9_]*\s*\([^)]*\)\s*=(?!=)/.test(props.spec.formula);
    const copyName = freshName(`${name()}_copy`, taken);
    const formula = isFunction ? props.spec.formula.replace(/^\s*[A-Za-z_][A-Za-z0-9_]*/, copyName) : props.spec.formula;
    const index = cells.findIndex((c) => c.name === name()) + 1;
    const r = session.edit(`duplicate ${name()}`, (sheet) => sheet.setCell({ ...props.spec, name: copyName, formula }, index));
    if (r.ok) queueMicrotask(() => services.focusCell(copyName));
    else services.notify(r.message, 'error');
  };

  const remove = () => {
    const users = session.dependents(name());
    const r = session.edit(`delete ${name()}`, (sheet) => sheet.removeCell(name()));
    if (!r.ok) services.notify(r.message, 'error');
    else if (users.length) services.notify(`Deleted ${name()}; it was an input of ${users.join(', ')}, which now report it missing. Undo brings it back.`);
    else services.notify(`Deleted ${name()}. Undo brings it back.`);
  };

  const moveTo = (section: string) => {
    const r = session.edit(`move ${name()} to ${section}`, (sheet) => sheet.updateCell(name(), { section }));
    if (!r.ok) services.notify(r.message, 'error');
  };

  const shift = (direction: -1 | 1) => {
    const cells = session.cells();
    const here = cells.findIndex((c) => c.name === name());
    const mine = sectionOf(props.spec);
    let j = here + direction;
    while (j >= 0 && j < cells.length && sectionOf(cells[j]) !== mine) j += direction;
    if (j < 0 || j >= cells.length) return;
    session.edit(`move ${name()} ${direction < 0 ? 'up' : 'down'}`, (sheet) => sheet.moveCell(name(), j));
    queueMicrotask(() => services.focusCell(name()));
  };

  const navigate = (direction: -1 | 1) => {
    const order = services.rowOrder();
    const i = order.indexOf(name());
    const next = order[i + direction];
    if (next) services.focusCell(next);
  };

  const traced = () => services.traced() === name();
  const status = createMemo(() => {
    const s = state();
    if (s.status === 'value') return { label: 'ok', cls: 'ok' };
    if (s.status === 'pending') return { label: s.offPage ? 'off page' : s.waitsFor !== undefined ? 'waiting' : 'computing', cls: 'pending' };
    return { label: s.error.kind, cls: 'error' };
  });

  return (
    <div
      class={`cell-row status-${status().cls}`}
      classList={{ traced: traced(), found: services.found() === name() }}
      data-cell={name()}
      role="row"
      ref={(el) => {
        rowEl = el;
        services.registerRow(name(), el);
        // A long sheet drops rows scrolled out of view: forget this one once it is gone.
        onCleanup(() => {
          const n = name();
          queueMicrotask(() => services.registerRow(n, undefined));
        });
      }}
    >
      <div class="cell-name" role="cell">
        <Show
          when={renaming()}
          fallback={
            <button type="button" class="name-button" title="Show inputs, dependents and actions (double-click to rename)" aria-expanded={traced()} onDblClick={() => setRenaming(true)} onClick={() => services.setTraced(traced() ? null : name())}>
              {name()}
            </button>
          }
        >
          <input
            class="rename-input"
            aria-label={`New name for ${name()}`}
            value={name()}
            ref={(el) => queueMicrotask(() => el.select())}
            onKeyDown={(e) => {
              if (e.key === 'Enter') rename(e.currentTarget.value);
              if (e.key === 'Escape') {
                setRenaming(false);
                setRenameError(null);
              }
            }}
            onBlur={(e) => rename(e.currentTarget.value)}
          />
          <Show when={renameError()}>
            <div class="rename-error" role="alert">{renameError()}</div>
          </Show>
        </Show>
      </div>
      <div class="cell-formula" role="cell">
        <FormulaBox name={name()} formula={props.spec.formula} onCommit={commitFormula} onNavigate={navigate} />
        <Show when={state().status === 'error' ? (state() as Extract<CellState, { status: 'error' }>).error : null}>
          {(err) => (
            <div class="cell-error" role="alert" data-error-kind={err().kind}>
              <span class="error-message">{err().message}</span>
              <Show when={err().position !== undefined}>
                <span class="error-position">
                  {/character/.test(err().message) ? ' ' : ` at character ${err().position! + 1}: `}
                  <code>
                    {props.spec.formula.slice(0, err().position)}
                    <mark>{props.spec.formula.slice(err().position, err().position! + 1) || ' '}</mark>
                    {props.spec.formula.slice(err().position! + 1)}
                  </code>
                </span>
              </Show>
            </div>
          )}
        </Show>
      </div>
      <div class="cell-value" role="cell" data-value={name()} data-raw={shown()} title={shown()}>
        <ScientificText text={shown()} />
        <Show when={(() => { const s = state(); return s.status === 'pending' && (s.offPage || s.waitsFor !== undefined) ? s : null; })()}>
          {(s) => <OffPageStatus name={name()} state={s()} onCancel={() => session.cancelOffPage(name())} />}
        </Show>
        <AnnotationBadges spec={props.spec} onEdit={setAnnotating} />
      </div>
      <div class="cell-status" role="cell">
        <span class={`badge badge-${status().cls}`}>{status().label}</span>
      </div>
      <div class="cell-notes" role="cell">
        <Show when={props.spec.note}>
          <div class="cell-note">
            <LinkedText text={props.spec.note!} />
          </div>
        </Show>
        <Show when={props.spec.source}>
          <div class="cell-source">
            <LinkedText text={props.spec.source!} />
          </div>
        </Show>
      </div>
      <Show when={annotating()}>
        {(kind) => (
          <div class="row-annotation" role="cell">
            <AnnotationEditor kindId={kind()} spec={props.spec} onClose={() => setAnnotating(null)} />
          </div>
        )}
      </Show>
      <Show when={traced()}>
        <div class="row-details" role="cell">
          <TraceStrip name={name()} />
          <div class="cell-actions no-print">
            <button type="button" title="Rename" onClick={() => setRenaming(true)}>
              rename
            </button>
            <button type="button" title="Move up" onClick={() => shift(-1)}>
              ↑
            </button>
            <button type="button" title="Move down" onClick={() => shift(1)}>
              ↓
            </button>
            <button type="button" title="Duplicate" onClick={duplicate}>
              copy
            </button>
            <For each={ROW_ANNOTATION_KINDS}>
              {(kind) => (
                <button type="button" data-action={`edit-${kind.id}`} title={`Set the ${kind.label} of ${name()}`} onClick={() => setAnnotating(kind.id)}>
                  {kind.read(props.spec) ? `edit ${kind.label}` : `+ ${kind.label}`}
                </button>
              )}
            </For>
            <Show
              when={!newSection()}
              fallback={
                <input
                  class="section-input"
                  placeholder="new section"
                  aria-label="New section name"
                  ref={(el) => queueMicrotask(() => el.focus())}
                  onKeyDown={(e) => {
                    if (e.key === 'Enter' && e.currentTarget.value.trim()) {
                      moveTo(e.currentTarget.value.trim());
                      setNewSection(false);
                    }
                    if (e.key === 'Escape') setNewSection(false);
                  }}
                  onBlur={() => setNewSection(false)}
                />
              }
            >
              <select
                class="section-select"
                aria-label={`Section of ${name()}`}
                title="Move to section"
                value={sectionOf(props.spec)}
                onChange={(e) => {
                  const v = e.currentTarget.value;
                  if (v === '\u0000new') setNewSection(true);
                  else moveTo(v);
                }}
              >
                <For each={sectionChoices(session.cells())}>{(s) => <option value={s}>{s}</option>}</For>
                <option value={'\u0000new'}>new section…</option>
              </select>
            </Show>
            <button type="button" class="danger" title="Delete" onClick={remove}>
              delete
            </button>
          </div>
        </div>
      </Show>
    </div>
  );
}

function TraceStrip(props: { name: string }) {
  const services = useServices();
  const inputs = () => services.session.dependencies(props.name);
  const users = () => services.session.dependents(props.name);
  const chip = (n: string) => (
    <button type="button" class="trace-chip" onClick={() => { services.setTraced(n); services.focusCell(n); }}>
      {n}
    </button>
  );
  return (
    <div class="trace-strip" data-trace={props.name}>
      <span class="trace-label">inputs</span>
      <Show when={inputs().length} fallback={<span class="trace-none">none</span>}>
        <For each={inputs()}>{chip}</For>
      </Show>
      <span class="trace-label">used by</span>
      <Show when={users().length} fallback={<span class="trace-none">nothing</span>}>
        <For each={users()}>{chip}</For>
      </Show>
    </div>
  );
}
