// The sheet's notes (its scenario: what is invented, what is assumed), shown above the cells with
// links to the docs pages they name, and editable as one undoable step.
import { createMemo, createSignal, Show } from 'solid-js';
import { useServices } from './services';
import { LinkedText } from '../help/LinkedText';

export function SheetNotes() {
  const services = useServices();
  const { session } = services;
  const notes = createMemo(() => {
    session.structure();
    return session.current.notes;
  });
  const [editing, setEditing] = createSignal(false);
  let box!: HTMLTextAreaElement;

  const save = () => {
    if (!editing()) return;
    const text = box.value;
    setEditing(false);
    if (text === notes()) return;
    const r = session.edit('edit sheet notes', (sheet) => {
      sheet.notes = text;
    });
    if (!r.ok) services.notify(`Sheet notes: ${r.message}`, 'error');
  };

  return (
    <section class="sheet-notes" aria-label="Sheet notes" data-sheet-notes>
      <Show
        when={editing()}
        fallback={
          <div class="sheet-notes-view">
            <Show when={notes()} fallback={<span class="trace-none">This sheet has no notes.</span>}>
              <p class="sheet-notes-text">
                <LinkedText text={notes()} />
              </p>
            </Show>
            <button type="button" class="sheet-notes-edit no-print" data-action="edit-notes" onClick={() => setEditing(true)}>
              {notes() ? 'edit notes' : '+ notes'}
            </button>
          </div>
        }
      >
        <textarea
          ref={(el) => {
            box = el;
            queueMicrotask(() => el.focus());
          }}
          class="sheet-notes-input"
          aria-label="Notes of the sheet (Enter with Ctrl saves, Escape cancels)"
          rows={3}
          value={notes()}
          onKeyDown={(e) => {
            if (e.key === 'Escape') {
              e.preventDefault();
              setEditing(false);
            } else if (e.key === 'Enter' && (e.ctrlKey || e.metaKey)) {
              e.preventDefault();
              save();
            }
          }}
          onBlur={save}
        />
      </Show>
    </section>
  );
}
