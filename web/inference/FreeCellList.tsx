// The free cells of an inference run: every cell with a prior or an uncertainty (the default prior),
// each with a box to include it and its prior edited in place with the row's own annotation editor
// (web/sheet/rowAnnotations.ts: the same check and one undoable edit); any other input can be given
// a prior here too.
import { createMemo, createSignal, For, Show } from 'solid-js';
import { useServices } from '../app/services';
import type { CellSpec } from '../engine/engine';
import { AnnotationEditor } from '../sheet/AnnotationBadges';
import { CellSelect } from '../jobs/CellSelect';

export function FreeCellList(props: { chosen: ReadonlySet<string>; onToggle: (cell: string, on: boolean) => void; inputs: string[] }) {
  const { session } = useServices();
  const [editing, setEditing] = createSignal<string | null>(null);
  const [other, setOther] = createSignal('');
  const candidates = createMemo(() => session.cells().filter((c) => (c.prior ?? '').trim() || (c.uncertainty ?? '').trim()));
  const spec = (name: string): CellSpec | undefined => (session.cells(), session.current.get(name));
  const candidateNames = createMemo(() => new Set(candidates().map((c) => c.name)));
  const others = () => props.inputs.filter((n) => !candidateNames().has(n));
  return (
    <fieldset class="axis-fields free-cells" data-free-cells>
      <legend>free cells and their priors</legend>
      <Show when={candidates().length === 0}>
        <p class="form-hint">No cell has a prior or an uncertainty yet: give one below.</p>
      </Show>
      <For each={candidates()}>
        {(c) => (
          <div class="free-cell" data-free-cell={c.name}>
            <label class="inline">
              <input type="checkbox" checked={props.chosen.has(c.name)} onChange={(e) => props.onToggle(c.name, e.currentTarget.checked)} /> <b>{c.name}</b>
            </label>{' '}
            <span class="prior-text" data-prior-of={c.name}>
              {(c.prior ?? '').trim() ? `prior ${c.prior}` : `no prior; its uncertainty ${c.uncertainty} is the default prior`}
            </span>{' '}
            <button type="button" data-action={`edit-prior-${c.name}`} onClick={() => setEditing(editing() === c.name ? null : c.name)}>
              {(c.prior ?? '').trim() ? 'edit prior' : '+ prior'}
            </button>
          </div>
        )}
      </For>
      <div class="free-cell">
        <label>
          another input
          <CellSelect value={other()} choices={others()} label="Cell to give a prior" emptyLabel="choose" onChange={setOther} />
        </label>{' '}
        <button type="button" data-action="add-prior" disabled={!other()} onClick={() => setEditing(other())}>
          + prior
        </button>
      </div>
      <Show when={editing() ? spec(editing()!) : undefined}>
        {(s) => (
          <div class="prior-editor" data-prior-editor={s().name}>
            <AnnotationEditor
              kindId="prior"
              spec={s()}
              onClose={() => {
                const name = s().name;
                setEditing(null);
                if ((spec(name)?.prior ?? '').trim()) props.onToggle(name, true);
              }}
            />
          </div>
        )}
      </Show>
    </fieldset>
  );
}
