// A button that adds a starter cell (starterCells.ts) to the sheet as one undoable edit.
import { Show } from 'solid-js';
import { useServices } from '../app/services';
import type { StarterCell } from './starterCells';

export function StarterButton(props: { starter: StarterCell | null; onAdded?: (name: string) => void }) {
  const services = useServices();
  const add = (c: StarterCell) => {
    const r = services.session.edit(`add ${c.name}`, (sheet) => sheet.setCell({ name: c.name, formula: c.formula, section: c.section }));
    if (!r.ok) return services.notify(r.message, 'error');
    services.notify(`Added ${c.name} = ${c.formula}. Undo takes it away.`);
    props.onAdded?.(c.name);
  };
  return (
    <Show when={props.starter}>
      {(c) => (
        <button type="button" data-action="add-starter-cell" onClick={() => add(c())}>
          Add {c().name} = {c().formula}
        </button>
      )}
    </Show>
  );
}
