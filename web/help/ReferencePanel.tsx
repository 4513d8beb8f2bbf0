// The reference beside the sheet: every built-in with its arguments, units and source, and the
// names available in formulas (cells and built-ins), filtered as you type.
import { createMemo, createSignal, For, Show } from 'solid-js';
import { useServices } from '../app/services';
import { BuiltinSignature } from './BuiltinSignature';
import type { BuiltinDoc } from './builtinDocs';

export function ReferencePanel() {
  const services = useServices();
  const [filter, setFilter] = createSignal('');
  const matches = (text: string) => text.toLowerCase().includes(filter().trim().toLowerCase());
  const groups = createMemo(() => {
    const byCategory = new Map<string, BuiltinDoc[]>();
    for (const b of services.builtins()) {
      if (filter() && !matches(`${b.name} ${b.summary} ${b.category}`)) continue;
      if (!byCategory.has(b.category)) byCategory.set(b.category, []);
      byCategory.get(b.category)!.push(b);
    }
    return [...byCategory].sort(([a], [b]) => a.localeCompare(b));
  });
  const categories = createMemo(() => groups().map(([c]) => c), undefined, { equals: (a, b) => a.length === b.length && a.every((x, i) => x === b[i]) });
  const entriesOf = (category: string) => groups().find(([c]) => c === category)?.[1] ?? [];
  const cellNames = createMemo(() => services.session.cells().map((c) => c.name).filter((n) => !filter() || matches(n)), undefined, {
    equals: (a, b) => a.length === b.length && a.every((x, i) => x === b[i]),
  });
  return (
    <div class="reference-panel">
      <input class="reference-filter" type="search" placeholder="Filter built-ins and names" aria-label="Filter the reference" value={filter()} onInput={(e) => setFilter(e.currentTarget.value)} />
      <h3>cells in this sheet</h3>
      <div class="name-list">
        <For each={cellNames()} fallback={<span class="trace-none">none</span>}>
          {(n) => (
            <button type="button" class="trace-chip" onClick={() => services.focusCell(n)}>
              {n}
            </button>
          )}
        </For>
      </div>
      <Show when={services.builtins().length} fallback={<p class="trace-none">Loading the built-ins’ reference…</p>}>
      <Show when={categories().length} fallback={<p class="trace-none">No built-in matches.</p>}>
        <For each={categories()}>
          {(category) => (
            <section class="reference-group">
              <h3>{category}</h3>
              <For each={entriesOf(category)}>
                {(b) => (
                  <article class="reference-entry" data-builtin={b.name}>
                    <BuiltinSignature builtin={b} />
                    <Show when={b.example}>
                      <div class="sig-example">
                        Example: <code>{b.example}</code>
                      </div>
                    </Show>
                  </article>
                )}
              </For>
            </section>
          )}
        </For>
      </Show>
      </Show>
      <p class="reference-foot">
        Formulas use arithmetic, units (e.g. <code>70 km/s/Mpc</code>, <code>3 weeks</code>), lists <code>[1, 2, 3]</code> and functions of cells{' '}
        <code>g(x) = 2 * x</code>. Tab or Enter completes a name.
      </p>
    </div>
  );
}
