// Text with its references to docs pages ("docs/orbits.md") as links that open the page in the app.
import { createMemo, For, Show } from 'solid-js';
import { useServices } from '../app/services';
import { DOC_PAGES } from './docPages';
import { splitDocReferences } from './docReferences';

export function LinkedText(props: { text: string }) {
  const services = useServices();
  const parts = createMemo(() => splitDocReferences(props.text, DOC_PAGES));
  return (
    <For each={parts()}>
      {(p) => (
        <Show when={p.page} fallback={p.text}>
          <a
            class="doc-ref"
            href={`#docs/${p.page}`}
            data-doc-ref={p.page}
            title={`Open ${p.page}.md`}
            onClick={(e) => {
              e.preventDefault();
              services.openDoc(p.page!, p.anchor);
            }}
          >
            {p.text}
          </a>
        </Show>
      )}
    </For>
  );
}
