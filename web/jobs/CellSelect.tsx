// A select of cell names whose state is the chosen cell's name. The option shown is always the
// one whose name is the state: every option carries `selected` from the state (so a rebuilt option
// list cannot make the browser show its first entry), and a chosen cell that has no usable value
// right now stays listed, marked, instead of silently showing another cell.
import { For, Show } from 'solid-js';

export function CellSelect(props: { value: string; choices: string[]; label: string; onChange: (cell: string) => void; emptyLabel?: string }) {
  const missing = () => props.value !== '' && !props.choices.includes(props.value);
  return (
    <select aria-label={props.label} data-cell-select={props.label} onChange={(e) => props.onChange(e.currentTarget.value)}>
      <Show when={props.emptyLabel !== undefined}>
        <option value="" selected={props.value === ''}>
          {props.emptyLabel}
        </option>
      </Show>
      <Show when={missing()}>
        <option value={props.value} selected>
          {props.value} (no value now)
        </option>
      </Show>
      <For each={props.choices}>
        {(c) => (
          <option value={c} selected={c === props.value}>
            {c}
          </option>
        )}
      </For>
    </select>
  );
}
