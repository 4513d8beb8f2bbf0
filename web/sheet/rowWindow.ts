// The rows of the sheet that are drawn. A sheet of up to DRAW_ALL_UP_TO cells draws them all; a
// longer one draws the rows that meet the view of its scrolling box (plus OVERSCAN_PX), the row
// that holds the keyboard focus, and spacers of the measured (or estimated) height of the rest.
// focusCell reaches an undrawn row through `services.revealRow`, which scrolls it into view.
// While the page is printed every row is drawn (`beforeprint` to `afterprint`, and the print media
// query for browsers that print without those events), so a printout holds the whole sheet.
import { batch, createMemo, createSignal, onCleanup, onMount, type Accessor } from 'solid-js';
import type { Services } from '../app/services';
import type { SectionGroup } from './sections';
import { DRAW_ALL_UP_TO, itemsInBand, layoutRows, OVERSCAN_PX } from './rowLayout';

/** The key of a section's title among the items (cell names cannot contain a space). */
export function titleKey(section: string): string {
  return `title ${section}`;
}

const ROW_ESTIMATE_PX = 42;
const TITLE_ESTIMATE_PX = 36;

export interface RowWindow {
  /** Ref of the box holding the sections (the items are laid out from its top). */
  attach(el: HTMLElement): void;
  /** Ref of each drawn item's box: its height is measured while it is drawn. */
  measure(el: HTMLElement): void;
  /** Names of the section's cells that are drawn, in order. */
  drawnIn(section: string): string[];
  /** Height of the spacer before a drawn row (for the undrawn rows just above it). */
  gapBefore(name: string): number;
  /** Height of the spacer after the section's last drawn row. */
  gapAfter(section: string): number;
}

function scrollingBox(el: HTMLElement): HTMLElement | null {
  for (let p = el.parentElement; p; p = p.parentElement) {
    const oy = getComputedStyle(p).overflowY;
    if (oy === 'auto' || oy === 'scroll') return p;
  }
  return null; // the page scrolls
}

export function createRowWindow(services: Services, groups: Accessor<SectionGroup[]>): RowWindow {
  const items = createMemo(() => groups().flatMap((g) => [titleKey(g.name), ...g.cells.map((c) => c.name)]));
  const cellCount = createMemo(() => items().length - groups().length);
  const [printing, setPrinting] = createSignal(false);
  const drawAll = createMemo(() => printing() || cellCount() <= DRAW_ALL_UP_TO);
  const indexOf = createMemo(() => new Map(items().map((k, i) => [k, i])));
  const heights = new Map<string, number>();
  let rowEstimate = ROW_ESTIMATE_PX;
  const [measured, setMeasured] = createSignal(0);
  const layout = createMemo(() => {
    measured();
    return layoutRows(items(), (k) => heights.get(k) ?? (k.startsWith('title ') ? TITLE_ESTIMATE_PX : rowEstimate));
  });
  const [view, setView] = createSignal({ top: 0, bottom: 1200 });
  const [pinned, setPinned] = createSignal<string | null>(null);
  const band = createMemo(
    () => (drawAll() ? null : itemsInBand(layout(), view().top - OVERSCAN_PX, view().bottom + OVERSCAN_PX)),
    undefined,
    { equals: (a, b) => a === b || (!!a && !!b && a.start === b.start && a.end === b.end) },
  );

  /** Per section: the drawn names and the spacer heights around them. */
  const drawn = createMemo(() => {
    const b = band();
    const byName = new Map<string, number>();
    const sections = new Map<string, { names: string[]; after: number }>();
    const { offsets } = layout();
    const index = indexOf();
    const keep = pinned();
    let first = 0;
    for (const g of groups()) {
      const title = first;
      const rowsFrom = title + 1;
      const rowsTo = rowsFrom + g.cells.length;
      first = rowsTo;
      if (!b) {
        sections.set(g.name, { names: g.cells.map((c) => c.name), after: 0 });
        continue;
      }
      const picked: number[] = [];
      for (let i = Math.max(rowsFrom, b.start); i < Math.min(rowsTo, b.end); i++) picked.push(i);
      const k = keep !== null ? index.get(keep) : undefined;
      if (k !== undefined && k >= rowsFrom && k < rowsTo && !picked.includes(k)) {
        picked.push(k);
        picked.sort((x, y) => x - y);
      }
      let end = offsets[rowsFrom];
      const names: string[] = [];
      for (const i of picked) {
        const n = items()[i];
        names.push(n);
        byName.set(n, offsets[i] - end);
        end = offsets[i + 1];
      }
      sections.set(g.name, { names, after: offsets[rowsTo] - end });
    }
    return { sections, byName };
  });

  let box: HTMLElement | undefined;
  let scroller: HTMLElement | null = null;
  const updateView = () => {
    if (!box) return;
    const top = box.getBoundingClientRect().top;
    const viewTop = scroller ? scroller.getBoundingClientRect().top : 0;
    const height = scroller ? scroller.clientHeight : window.innerHeight;
    setView({ top: viewTop - top, bottom: viewTop - top + height });
  };

  // Heights of drawn items, read as they are drawn or change (an error message, an open trace).
  const observer = typeof ResizeObserver === 'undefined' ? null : new ResizeObserver((entries) => {
    let changed = false;
    for (const e of entries) {
      const key = (e.target as HTMLElement).dataset.rowSlot;
      if (!key || !(e.target as HTMLElement).isConnected) continue;
      const h = e.borderBoxSize?.[0]?.blockSize ?? (e.target as HTMLElement).getBoundingClientRect().height;
      if (Math.abs((heights.get(key) ?? -1) - h) > 0.5) {
        heights.set(key, h);
        changed = true;
        if (!key.startsWith('title ')) rowEstimate += (h - rowEstimate) / Math.min(heights.size, 50);
      }
    }
    if (changed && !drawAll()) {
      setMeasured((v) => v + 1);
      holdInView();
    }
  });

  // A row revealed (focusCell, the find bar) is kept in view while the rows drawn around it are
  // measured (their heights were estimates, so the rows above it move), until the view is scrolled
  // by anything else (the user, a script) away from it.
  let revealed: string | null = null;
  /** Set while a scroll of ours (bringing the revealed row back) is under way. */
  let holding = false;
  const revealedSlot = () => (revealed === null || !box ? null : box.querySelector<HTMLElement>(`[data-row-slot="${CSS.escape(revealed)}"]`));
  const inView = (el: HTMLElement) => {
    const r = el.getBoundingClientRect();
    const top = scroller ? scroller.getBoundingClientRect().top : 0;
    const bottom = top + (scroller ? scroller.clientHeight : window.innerHeight);
    return r.top >= top - 1 && r.bottom <= bottom + 1;
  };
  const holdInView = () => {
    const slot = revealedSlot();
    if (!slot || inView(slot)) return;
    holding = true;
    slot.scrollIntoView({ block: 'nearest' });
  };
  const letGo = () => {
    revealed = null;
  };
  const onScroll = () => {
    if (!holding && revealed !== null) {
      const slot = revealedSlot();
      if (!slot || !inView(slot)) letGo();
    }
    holding = false;
    updateView();
  };

  const onFocusIn = (e: FocusEvent) => {
    const slot = (e.target as HTMLElement).closest?.('[data-row-slot]') as HTMLElement | null;
    if (slot?.dataset.rowSlot) setPinned(slot.dataset.rowSlot);
  };
  const onFocusOut = (e: FocusEvent) => {
    const to = e.relatedTarget as HTMLElement | null;
    if (!to || !to.closest?.(`[data-row-slot]`)) setPinned(null);
  };

  const reveal = (name: string) => {
    const i = indexOf().get(name);
    if (i === undefined || !box || drawAll()) return; // every row is drawn: the caller scrolls to it
    const { offsets } = layout();
    const top = box.getBoundingClientRect().top;
    const viewTop = scroller ? scroller.getBoundingClientRect().top : 0;
    const height = scroller ? scroller.clientHeight : window.innerHeight;
    const rowTop = offsets[i] + top - viewTop; // relative to the view's top
    const rowBottom = offsets[i + 1] + top - viewTop;
    let by = 0;
    if (rowTop < 0) by = rowTop - height / 3;
    else if (rowBottom > height) by = rowBottom - (2 * height) / 3;
    if (by !== 0) {
      if (scroller) scroller.scrollTop += by;
      else window.scrollBy(0, by);
    }
    // The row is drawn whatever the band (heights of rows not yet drawn are estimates, so the
    // band reached may miss it); the caller scrolls the drawn row itself into view.
    batch(() => {
      setPinned(name);
      updateView();
    });
    revealed = name;
    holdInView();
  };

  onMount(() => {
    if (box) scroller = scrollingBox(box);
    services.revealRow = reveal;
    const target: HTMLElement | Window = scroller ?? window;
    target.addEventListener('scroll', onScroll, { passive: true });
    window.addEventListener('resize', updateView);
    box?.addEventListener('focusin', onFocusIn);
    box?.addEventListener('focusout', onFocusOut);
    const printMedia = typeof window.matchMedia === 'function' ? window.matchMedia('print') : null;
    const beforePrint = () => setPrinting(true);
    const afterPrint = () => setPrinting(false);
    const onPrintMedia = (e: MediaQueryListEvent) => setPrinting(e.matches);
    window.addEventListener('beforeprint', beforePrint);
    window.addEventListener('afterprint', afterPrint);
    printMedia?.addEventListener('change', onPrintMedia);
    updateView();
    onCleanup(() => {
      window.removeEventListener('beforeprint', beforePrint);
      window.removeEventListener('afterprint', afterPrint);
      printMedia?.removeEventListener('change', onPrintMedia);
      if (services.revealRow === reveal) services.revealRow = undefined;
      target.removeEventListener('scroll', onScroll);
      window.removeEventListener('resize', updateView);
      box?.removeEventListener('focusin', onFocusIn);
      box?.removeEventListener('focusout', onFocusOut);
    });
  });
  onCleanup(() => observer?.disconnect());

  return {
    attach(el) {
      box = el; // its scrolling box is found once the panel is in the document (onMount)
    },
    measure(el) {
      observer?.observe(el);
      onCleanup(() => observer?.unobserve(el));
    },
    drawnIn: (section) => drawn().sections.get(section)?.names ?? [],
    gapBefore: (name) => drawn().byName.get(name) ?? 0,
    gapAfter: (section) => drawn().sections.get(section)?.after ?? 0,
  };
}
