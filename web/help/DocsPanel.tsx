// The docs pages beside the sheet: a list of the shipped pages and the one opened, rendered from
// its Markdown. Links to other pages (and headings) open here; outside addresses open in a new tab.
import { createEffect, createResource, createSignal, For, on, Show } from 'solid-js';
import { useServices } from '../app/services';
import { DOC_PAGES, loadDocPage } from './docPages';
import { docLinkTarget } from './docReferences';
import { DOC_HEADING_PREFIX, markdownToHtml } from './markdownPage';

export function DocsPanel() {
  const services = useServices();
  const [text] = createResource(() => services.docPage().page, loadDocPage);
  const [history, setHistory] = createSignal<string[]>([]);
  let article!: HTMLElement;
  let panel!: HTMLDivElement;

  // Track the pages visited here, for the Back button.
  createEffect(on(() => services.docPage().page, (page, prev) => {
    if (prev !== undefined && prev !== page) setHistory((h) => [...h.slice(-19), prev]);
  }));

  // After a page is drawn: scroll to the heading asked for, or to the top.
  createEffect(() => {
    const html = text.state === 'ready' ? text() : undefined;
    const { anchor } = services.docPage();
    if (html === undefined) return;
    queueMicrotask(() => {
      const target = anchor ? article.querySelector(`#${CSS.escape(DOC_HEADING_PREFIX + anchor)}`) : null;
      (target ?? panel).scrollIntoView({ block: 'start' });
      // Keyboard and screen-reader users land on the page they asked for.
      article.focus({ preventScroll: true });
    });
  });

  const onClick = (e: MouseEvent) => {
    const link = (e.target as HTMLElement).closest('a');
    if (!link) return;
    const href = link.getAttribute('href') ?? '';
    const to = docLinkTarget(href, services.docPage().page, DOC_PAGES);
    if (to) {
      e.preventDefault();
      services.openDoc(to.page, to.anchor);
    } else if (/^[a-z][a-z0-9+.-]*:/i.test(href)) {
      link.target = '_blank';
      link.rel = 'noopener noreferrer';
    } else {
      // A file of the repository that is not shipped with the app: nothing to open.
      e.preventDefault();
      services.notify(`${href} is not shipped with the app; only the docs pages (${DOC_PAGES.map((p) => `${p}.md`).join(', ')}) are.`);
    }
  };

  const back = () => {
    const h = history();
    const prev = h.at(-1);
    if (!prev) return;
    services.openDoc(prev);
    // openDoc records the page we leave; drop both that and the one we went back to.
    queueMicrotask(() => setHistory(h.slice(0, -1)));
  };

  return (
    <div class="docs-panel" ref={panel}>
      <nav class="docs-nav" aria-label="Docs pages">
        <button type="button" class="docs-back" disabled={history().length === 0} onClick={back}>
          ← Back
        </button>
        <For each={DOC_PAGES}>
          {(p) => (
            <button type="button" class="trace-chip" data-doc-page={p} aria-current={services.docPage().page === p ? 'page' : undefined} onClick={() => services.openDoc(p)}>
              {p}.md
            </button>
          )}
        </For>
      </nav>
      <Show when={text.state === 'ready' && text() === null}>
        <p class="trace-none">There is no page {services.docPage().page}.md in this build.</p>
      </Show>
      <article class="doc-page" tabindex="-1" aria-label={`${services.docPage().page}.md`} data-doc={services.docPage().page} ref={article} onClick={onClick} innerHTML={text() ? markdownToHtml(text()!, DOC_PAGES) : ''} />
    </div>
  );
}
