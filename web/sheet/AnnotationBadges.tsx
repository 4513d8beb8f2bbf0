// A row's uncertainty (and any other annotation kind of rowAnnotations.ts) as a compact badge
// under the value; clicking it opens an editor. Enter checks the text and stores it as one
// undoable edit; a text that fails the check stays in the editor with the reason beside it (nothing
// typed is lost); Escape closes the editor leaving the cell as it was; an empty text removes it.
import { createSignal, For, Show } from 'solid-js';
import { useServices } from '../app/services';
import type { CellSpec } from '../engine/engine';
import { ROW_ANNOTATION_KINDS, type RowAnnotationKind } from './rowAnnotations';

export function AnnotationBadges(props: { spec: CellSpec; onEdit: (kind: string) => void }) {
  return (
    <For each={ROW_ANNOTATION_KINDS}>
      {(kind) => (
        <Show when={kind.read(props.spec)}>
          {(text) => (
            <button
              type="button"
              class={`annotation-badge annotation-${kind.id}`}
              data-annotation={kind.id}
              title={`${kind.label}: ${text()} (click to edit)`}
              aria-label={`${kind.label} of ${props.spec.name}: ${text()}. Edit`}
              onClick={() => props.onEdit(kind.id)}
            >
              <span class="annotation-symbol" aria-hidden="true">{kind.symbol}</span>
              <span class="annotation-text">{text()}</span>
            </button>
          )}
        </Show>
      )}
    </For>
  );
}

/** The editor of one annotation kind of a row, shown across the row's full width. */
export function AnnotationEditor(props: { kindId: string; spec: CellSpec; onClose: () => void }) {
  const kind = ROW_ANNOTATION_KINDS.find((k) => k.id === props.kindId);
  return <Show when={kind}>{(k) => <KindEditor kind={k()} spec={props.spec} onClose={props.onClose} />}</Show>;
}

function KindEditor(props: { kind: RowAnnotationKind; spec: CellSpec; onClose: () => void }) {
  const services = useServices();
  const { session } = services;
  const [error, setError] = createSignal<string | null>(null);
  const [busy, setBusy] = createSignal(false);
  const name = props.spec.name;
  let input!: HTMLInputElement;

  const save = async () => {
    if (busy()) return;
    const text = input.value.trim();
    const before = props.kind.read(props.spec);
    if ((text || undefined) === before) return props.onClose();
    setBusy(true);
    const problem = text ? await props.kind.check(session.current, name, text) : null;
    setBusy(false);
    if (problem) {
      setError(problem);
      input.focus();
      return;
    }
    const verb = text ? (before ? 'change' : 'set') : 'remove';
    const r = session.edit(`${verb} ${props.kind.label} of ${name}`, (sheet) => sheet.updateCell(name, props.kind.patch(text || undefined)));
    if (!r.ok) return setError(r.message);
    props.onClose();
  };

  return (
    <div class="annotation-editor" data-annotation-editor={props.kind.id}>
      <label class="annotation-editor-label">
        <span>{props.kind.label}</span>
        <input
          ref={(el) => {
            input = el;
            queueMicrotask(() => el.focus());
          }}
          class="annotation-input"
          spellcheck={false}
          autocomplete="off"
          value={props.kind.read(props.spec) ?? ''}
          placeholder={props.kind.placeholder}
          aria-label={`${props.kind.label} of ${name}`}
          aria-invalid={error() ? 'true' : undefined}
          aria-describedby={error() ? `annotation-error-${name}` : undefined}
          onInput={() => setError(null)}
          onKeyDown={(e) => {
            if (e.key === 'Enter') {
              e.preventDefault();
              void save();
            } else if (e.key === 'Escape') {
              e.preventDefault();
              props.onClose();
            }
          }}
        />
      </label>
      <div class="annotation-buttons">
        <button type="button" data-action="save-annotation" disabled={busy()} onClick={() => void save()}>
          save
        </button>
        <Show when={props.kind.read(props.spec)}>
          <button
            type="button"
            class="danger"
            data-action="remove-annotation"
            onClick={() => {
              input.value = '';
              void save();
            }}
          >
            remove
          </button>
        </Show>
        <button type="button" onClick={() => props.onClose()}>
          cancel
        </button>
      </div>
      <Show when={error()}>
        <div class="form-error" role="alert" id={`annotation-error-${name}`}>
          {error()}
        </div>
      </Show>
    </div>
  );
}
