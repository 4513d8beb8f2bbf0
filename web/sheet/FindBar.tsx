// Find in the sheet: cells whose name, formula, shown value, note or source hold the text typed.
// A long sheet draws only the rows in view, so the browser's find-in-page misses the others; this
// bar searches every cell (web/sheet/findCells.ts) and scrolls to each match, drawing its row.
// Ctrl+F (Cmd+F) comes here; pressed again in the box it is left to the browser.
import { createEffect, createSignal, on, onCleanup, onMount, Show } from 'solid-js';
import { useServices } from '../app/services';
import { APP_SLICE_MS, yieldToPage } from '../engine/slices';
import { findCells } from './findCells';
import { groupBySection } from './sections';

/** Typing pauses this long before a search starts. */
const TYPING_PAUSE_MS = 150;

export function FindBar() {
  const services = useServices();
  const { session } = services;
  const [query, setQuery] = createSignal('');
  const [matches, setMatches] = createSignal<string[] | null>([]);
  const [at, setAt] = createSignal(-1);
  let input!: HTMLInputElement;
  let search = 0;
  /** The text the matches shown were found for. */
  let searched = '';
  let timer: ReturnType<typeof setTimeout> | undefined;

  const show = (i: number) => {
    const list = matches();
    if (!list?.length) return;
    const k = ((i % list.length) + list.length) % list.length;
    setAt(k);
    services.setFound(list[k]);
    services.showCell(list[k]);
  };

  /**
   * Searches; `keep` is the match to stay on when it still matches. A search the user asked for
   * shows the first match; one made again after a recalculation moves nothing.
   */
  const run = async (keep: string | null, again = false) => {
    const id = ++search;
    const q = query();
    searched = q;
    if (!q.trim()) {
      setMatches([]);
      setAt(-1);
      services.setFound(null);
      return;
    }
    setMatches(null); // searching
    const sheet = session.current;
    const cells = groupBySection(session.cells()).flatMap((g) => g.cells);
    const found = await findCells(cells, (n) => sheet.state(n), q, yieldToPage, APP_SLICE_MS, () => id !== search);
    if (found === null || id !== search) return;
    setMatches(found);
    if (!found.length) {
      setAt(-1);
      services.setFound(null);
      return;
    }
    const k = keep === null ? -1 : found.indexOf(keep);
    if (k >= 0) setAt(k);
    else if (again) {
      setAt(-1);
      services.setFound(null);
    } else show(0);
  };

  const onInput = (text: string) => {
    setQuery(text);
    clearTimeout(timer);
    timer = setTimeout(() => void run(null), TYPING_PAUSE_MS);
  };
  // Values and cells change: the matches are found again once a recalculation is complete.
  createEffect(on(session.settled, () => void (query().trim() && run(services.found(), true)), { defer: true }));

  const onKey = (e: KeyboardEvent) => {
    if (e.key === 'Enter') {
      e.preventDefault();
      clearTimeout(timer);
      if (matches() === null || query() !== searched) return void run(null);
      show(at() + (e.shiftKey ? -1 : 1));
    } else if (e.key === 'Escape') {
      services.setFound(null);
      input.blur();
    }
  };
  onMount(() => {
    const onPageKey = (e: KeyboardEvent) => {
      if ((e.ctrlKey || e.metaKey) && !e.altKey && e.key.toLowerCase() === 'f' && document.activeElement !== input) {
        e.preventDefault();
        input.focus();
        input.select();
      }
    };
    window.addEventListener('keydown', onPageKey);
    onCleanup(() => window.removeEventListener('keydown', onPageKey));
  });
  onCleanup(() => clearTimeout(timer));

  const status = () => {
    const list = matches();
    if (!query().trim()) return '';
    if (list === null) return 'searching…';
    if (!list.length) return 'no match';
    if (at() < 0) return `${list.length} match${list.length === 1 ? '' : 'es'}`;
    return `${at() + 1} of ${list.length}`;
  };

  return (
    <div class="find-bar no-print" role="search" aria-label="Find in the sheet">
      <input
        ref={input}
        type="search"
        data-find
        aria-label="Find a cell by name, formula, value, note or source"
        placeholder="Find: name, formula, value, note"
        spellcheck={false}
        autocomplete="off"
        value={query()}
        onInput={(e) => onInput(e.currentTarget.value)}
        onKeyDown={onKey}
      />
      <button type="button" data-action="find-previous" aria-label="Previous match" disabled={!matches()?.length} onClick={() => show(at() - 1)}>
        ↑
      </button>
      <button type="button" data-action="find-next" aria-label="Next match" disabled={!matches()?.length} onClick={() => show(at() + 1)}>
        ↓
      </button>
      <Show when={status()}>
        <span class="find-status" role="status" data-find-status>
          {status()}
        </span>
      </Show>
    </div>
  );
}
