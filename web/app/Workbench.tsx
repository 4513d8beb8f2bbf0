// The whole screen: tool bar, key results, the sheet, and the side panel (plots, scans, reference).
import { createEffect, createSignal, onCleanup, onMount, Show } from 'solid-js';
import { Sheet } from '../engine/engine';
import { loadSheet } from '../engine/loadSheet';
import { SheetSession } from '../state/sheetSession';
import { ServicesProvider, type DocLocation, type Services, type Tone } from './services';
import { SheetNotes } from './SheetNotes';
import { createMessages, MessageList } from './Messages';
import { KeyResultsBar } from './KeyResultsBar';
import { SheetPanel } from '../sheet/SheetPanel';
import { groupBySection } from '../sheet/sections';
import { createSidePanelControl, PLOTS_REGION_ID, SidePanel } from './SidePanel';
import { ViewSwitch, type WorkspaceView } from './ViewSwitch';
import { restoreAutosave, writeAutosave } from '../files/autosave';
import { openSheetFile, MAX_SHEET_FILE_BYTES } from '../files/openSheetFile';
import { openDataFile } from '../files/openDataFile';
import { notTextMessage } from '../files/binaryContent';
import { createOpenDataDialog } from '../files/OpenDataDialog';
import { downloadText, fileStem } from '../files/download';
import { cellTableCsv } from '../files/cellTableCsv';
import type { Completion } from '../help/formulaContext';
import { arrivedDemoText, demoText } from './demoSheet';
import { builtinDocs } from '../help/builtinDocs';

/** Autosaved sheets at least this long (about 1,500 cells) are loaded in slices once the page is up. */
const LOAD_LATER_FROM = 200_000;

function initialSheet(notify: (t: string, tone?: Tone) => void): { sheet: Sheet; autosaveAllowed: boolean; later?: string; demo?: true } {
  let later: string | undefined;
  const restored = restoreAutosave((text) => {
    if (text.length < LOAD_LATER_FROM) return Sheet.fromFile(text, { deferRecalculation: true });
    later = text;
    return new Sheet({ title: 'Loading the autosaved sheet…' });
  });
  if (restored.message) notify(restored.message, restored.sheet ? 'info' : 'error');
  if (restored.sheet) return { sheet: restored.sheet, autosaveAllowed: restored.safeToWrite, later };
  const text = arrivedDemoText();
  if (text !== undefined) return { sheet: demoSheetOf(text, notify), autosaveAllowed: restored.safeToWrite };
  return { sheet: new Sheet({ title: 'Loading the demo sheet…' }), autosaveAllowed: restored.safeToWrite, demo: true };
}

/** The demo sheet of its text, or an empty one with a message when it is missing (null) or unreadable. */
function demoSheetOf(text: string | null, notify: (t: string, tone?: Tone) => void): Sheet {
  if (text === null) {
    notify('The demo sheet (examples/demo.json) is not part of this build; starting with an empty sheet.', 'error');
    return new Sheet({ title: 'Untitled sheet' });
  }
  try {
    // Evaluated by the session in slices, A_yr and its inputs first (FIRST_RESULTS).
    return Sheet.fromFile(text, { deferRecalculation: true });
  } catch (err) {
    notify(`The demo sheet could not be read: ${err instanceof Error ? err.message : String(err)}`, 'error');
    return new Sheet({ title: 'Untitled sheet' });
  }
}

/** The demo sheet, or an empty one with a message when the demo file is missing or unreadable. */
async function demoSheet(notify: (t: string, tone?: Tone) => void): Promise<Sheet> {
  let text: string | null;
  try {
    text = await demoText();
  } catch (err) {
    notify(`The demo sheet could not be loaded (${err instanceof Error ? err.message : String(err)}); starting with an empty sheet.`, 'error');
    return new Sheet({ title: 'Untitled sheet' });
  }
  return demoSheetOf(text, notify);
}

/** 14:05:09 (not toLocaleTimeString: its first call loads locale data, tens of milliseconds). */
function clockTime(d: Date): string {
  return [d.getHours(), d.getMinutes(), d.getSeconds()].map((x) => String(x).padStart(2, '0')).join(':');
}

export function Workbench() {
  const { messages, notify, dismiss } = createMessages();

  const start = initialSheet(notify);
  const session = new SheetSession(start.sheet);
  // A long autosave, or the demo, is loaded after the page is up; until then nothing is autosaved over it.
  let autosaveAllowed = start.later === undefined && !start.demo && start.autosaveAllowed;
  if (start.demo) {
    void demoSheet(notify).then((sheet) => {
      autosaveAllowed = start.autosaveAllowed;
      session.restore(sheet);
    });
  }
  if (start.later !== undefined) {
    loadSheet(start.later).then(
      (sheet) => {
        autosaveAllowed = start.autosaveAllowed;
        session.restore(sheet);
      },
      (err: unknown) => {
        // Set the unreadable autosave aside (once), as a small one is, and show the demo.
        const aside = restoreAutosave(() => {
          throw err;
        });
        if (aside.message) notify(aside.message, 'error');
        autosaveAllowed = aside.safeToWrite;
        void demoSheet(notify).then((sheet) => session.restore(sheet));
      },
    );
  }
  // (Said of the demo while it loads as of it once loaded.)
  const [autosaveState, setAutosaveState] = createSignal(autosaveAllowed || (start.demo && start.autosaveAllowed) ? 'autosave on' : 'autosave off');
  let lastAutosaveError = '';
  // The autosave is written after the edit's task: the text is put together a slice at a time
  // (a long sheet's text takes a while) and stored in one step; at once when the page is left.
  let changes = 0;
  let written = 0;
  let saving = false;
  session.onHistoryProblem = (m) => notify(m, 'error');
  session.onChange = () => {
    if (!autosaveAllowed) return;
    changes++;
    if (saving) return;
    saving = true;
    setTimeout(() => void saveInSlices(), 0);
  };
  const saveInSlices = async () => {
    while (written < changes && autosaveAllowed) {
      const at = changes;
      const text = await session.toFileTextInSlices();
      if (written < at) store(text, at);
    }
    saving = false;
  };
  window.addEventListener('pagehide', () => {
    if (written < changes && autosaveAllowed) store(session.toFileText(), changes);
  });
  const store = (text: string, upTo: number) => {
    written = upTo;
    const r = writeAutosave(text);
    if (r.ok) {
      lastAutosaveError = '';
      setAutosaveState(`autosaved ${clockTime(new Date())}`);
    } else {
      setAutosaveState('autosave failed');
      if (r.message !== lastAutosaveError) notify(r.message, 'error');
      lastAutosaveError = r.message;
    }
  };

  // First computed A_yr after start: read by the UI benchmark.
  let firstMarked = false;
  createEffect(() => {
    if (!firstMarked && session.value('A_yr') !== undefined) {
      firstMarked = true;
      performance.mark('strainsheet:first-A_yr');
    }
  });

  const rows = new Map<string, HTMLElement>();
  const [traced, setTraced] = createSignal<string | null>(null);
  const [found, setFound] = createSignal<string | null>(null);
  /** The row of a cell, drawn and scrolled into view (a long sheet draws only the rows in view). */
  const rowInView = (name: string): HTMLElement | undefined => {
    // A long sheet draws the row (if it was not) and keeps it in view while rows around it are measured.
    services.revealRow?.(name);
    const row = rows.get(name);
    if (!row?.isConnected) return undefined;
    row.scrollIntoView({ block: 'nearest' });
    return row;
  };
  // Built when a formula box first asks after the cells (or the built-ins' documentation, loaded on
  // first use) changed; not on every change: a long sheet would pay for it at each structure change.
  let completionList: { cells: unknown; docs: unknown; list: Completion[] } | null = null;
  const completions = (): Completion[] => {
    const all = session.cells();
    const docs = builtinDocs();
    if (completionList?.cells === all && completionList.docs === docs) return completionList.list;
    const cells = all.map<Completion>((c) => {
      const fn = /^\s*[A-Za-z_][A-Za-z0-9_]*\s*\(/.test(c.formula) && /\)\s*=(?!=)/.test(c.formula);
      return { name: c.name, kind: fn ? 'function' : 'cell', detail: c.unit ? `cell [${c.unit}]` : 'cell' };
    });
    const fns = docs.map<Completion>((b) => ({ name: b.name, kind: 'built-in', detail: b.summary }));
    completionList = { cells: all, docs, list: [...cells, ...fns] };
    return completionList.list;
  };

  // The Docs tab opens on the physics page until a reference asks for another page.
  const [docPage, setDocPage] = createSignal<DocLocation>({ page: 'physics' });

  const services: Services = {
    session,
    notify,
    focusCell(name, part = 'formula') {
      const row = rowInView(name);
      if (!row) return;
      const target = row.querySelector<HTMLElement>(part === 'formula' ? '.formula-input' : '.name-button');
      target?.focus();
    },
    registerRow(name, el) {
      if (el) rows.set(name, el);
      else if (!rows.get(name)?.isConnected) rows.delete(name);
    },
    rowOrder: () => groupBySection(session.cells()).flatMap((g) => g.cells.map((c) => c.name)),
    builtins: builtinDocs,
    completions,
    showCell: (name) => rowInView(name) !== undefined,
    found,
    setFound,
    traced,
    setTraced,
    docPage,
    openDoc(page, anchor) {
      setDocPage(anchor ? { page, anchor } : { page });
      setView('side');
      sidePanel.showTab('docs');
    },
  };

  // Files.
  let filePicker!: HTMLInputElement;
  const openFile = async (file: File) => {
    const r = await openSheetFile(file, loadSheet);
    if (!r.ok) {
      notify(r.message, 'error');
      return;
    }
    session.load(r.sheet, `open ${file.name}`);
    notify(`Opened ${file.name}.`);
  };
  let dataPicker!: HTMLInputElement;
  const dataDialog = createOpenDataDialog(() => dataPicker.click());
  const openData = async (file: File) => {
    const binary = await notTextMessage(file, 'a data file (CSV or JSON)');
    if (binary) {
      notify(binary, 'error');
      return;
    }
    const r = await openDataFile(file, session.cells(), dataDialog.control.prior());
    if (!r.ok) {
      notify(r.message, 'error');
      return;
    }
    const e = session.edit(`read ${file.name}`, (sheet) => sheet.setCell(r.cell));
    notify(e.ok ? r.message : `${file.name} was read but not stored: ${e.message}`, e.ok ? 'info' : 'error');
  };
  const newSheet = () => {
    session.load(new Sheet({ title: 'Untitled sheet', cells: [] }), 'new sheet');
    notify('New empty sheet. Undo brings the previous one back.');
  };
  const loadDemo = () => {
    void demoSheet(notify).then((sheet) => {
      session.load(sheet, 'load demo');
      notify('Demo sheet loaded. Undo brings the previous one back.');
    });
  };
  const title = () => {
    session.revision();
    return session.current.title || 'Untitled sheet';
  };
  const saveFile = () => downloadText(session.toFileText(), `${fileStem(title(), 'sheet')}.strainsheet.json`, 'application/json');
  // The table holds the values: it is written once a recalculation under way is complete and the
  // cells evaluated off the page have their values.
  const exportCells = async () => {
    await session.whenComplete();
    const sheet = session.current;
    downloadText(cellTableCsv({ cells: () => session.cells(), state: (n) => sheet.state(n) }), `${fileStem(title(), 'sheet')}-cells.csv`, 'text/csv');
  };

  // Drag and drop a sheet file anywhere on the page.
  const [dropping, setDropping] = createSignal(false);
  const onDragOver = (e: DragEvent) => {
    if (!e.dataTransfer?.types.includes('Files')) return;
    e.preventDefault();
    setDropping(true);
  };
  const onDragLeave = (e: DragEvent) => {
    if (e.relatedTarget === null) setDropping(false);
  };
  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setDropping(false);
    const file = e.dataTransfer?.files[0];
    if (file) void openFile(file);
  };

  // Undo and redo from the keyboard, outside text boxes (text boxes keep the browser's own undo).
  const onKey = (e: KeyboardEvent) => {
    const inText = e.target instanceof HTMLInputElement || e.target instanceof HTMLTextAreaElement;
    const mod = e.ctrlKey || e.metaKey;
    if (!mod) return;
    const k = e.key.toLowerCase();
    if (k === 's') {
      e.preventDefault();
      saveFile();
    } else if (!inText && k === 'z') {
      e.preventDefault();
      if (e.shiftKey) session.redo();
      else session.undo();
    } else if (!inText && k === 'y') {
      e.preventDefault();
      session.redo();
    }
  };
  onMount(() => {
    window.addEventListener('keydown', onKey);
    window.addEventListener('dragover', onDragOver);
    window.addEventListener('dragleave', onDragLeave);
    window.addEventListener('drop', onDrop);
  });
  onCleanup(() => {
    window.removeEventListener('keydown', onKey);
    window.removeEventListener('dragover', onDragOver);
    window.removeEventListener('dragleave', onDragLeave);
    window.removeEventListener('drop', onDrop);
  });

  // Below the width where sheet and side panel fit side by side, one of them is shown at a time
  // and a switch (always on screen) brings the other in one click.
  const [view, setView] = createSignal<WorkspaceView>('sheet');
  const showPlots = () => {
    setView('side');
    sidePanel.showTab('plots');
    queueMicrotask(() => document.getElementById(PLOTS_REGION_ID)?.focus());
  };
  const sidePanel = createSidePanelControl();

  return (
    <ServicesProvider value={services}>
      <div class="workbench" classList={{ dropping: dropping() }}>
        <a class="skip-link" href={`#${PLOTS_REGION_ID}`} onClick={(e) => { e.preventDefault(); showPlots(); }}>
          Skip to the plots
        </a>
        <header class="topbar">
          <div class="brand">
            <span class="brand-mark" aria-hidden="true">
              h<sub>c</sub>
            </span>
            <span class="brand-name">Strainsheet</span>
          </div>
          <input
            class="sheet-title"
            aria-label="Sheet title"
            value={title()}
            onChange={(e) => {
              const t = e.currentTarget.value;
              session.edit('rename sheet', (sheet) => {
                sheet.title = t;
              });
            }}
          />
          <nav class="toolbar no-print" aria-label="File and history">
            <button type="button" onClick={newSheet}>New</button>
            <button type="button" onClick={() => filePicker.click()}>Open…</button>
            <button type="button" data-action="open-data" title="Read a free spectrum or (A, gamma) samples (CSV or JSON) into the sheet" onClick={() => dataDialog.control.open(session.cells().find((c) => c.name === 'measured_free_spectrum')?.formula)}>
              Open data…
            </button>
            <button type="button" data-action="save-sheet" onClick={saveFile}>Save</button>
            <button type="button" onClick={loadDemo}>Demo</button>
            <button type="button" data-action="export-cells" onClick={() => void exportCells()}>Cells CSV</button>
            <span class="toolbar-gap" />
            <button type="button" data-action="undo" disabled={!session.canUndo()} title={session.canUndo() ? `Undo ${session.canUndo()}` : 'Nothing to undo'} onClick={() => session.undo()}>
              Undo
            </button>
            <button type="button" data-action="redo" disabled={!session.canRedo()} title={session.canRedo() ? `Redo ${session.canRedo()}` : 'Nothing to redo'} onClick={() => session.redo()}>
              Redo
            </button>
            <button type="button" onClick={() => window.print()}>Print</button>
            <span class="autosave-state" data-autosave>{autosaveState()}</span>
          </nav>
          <dataDialog.Dialog />
          <input
            ref={dataPicker}
            type="file"
            accept=".csv,.json,text/csv,application/json"
            data-action="open-data-file"
            hidden
            onChange={(e) => {
              const f = e.currentTarget.files?.[0];
              e.currentTarget.value = '';
              if (f) void openData(f);
            }}
          />
          <input
            ref={filePicker}
            type="file"
            accept=".json,application/json"
            data-action="open-file"
            hidden
            onChange={(e) => {
              const f = e.currentTarget.files?.[0];
              e.currentTarget.value = '';
              if (f) void openFile(f);
            }}
          />
        </header>
        <KeyResultsBar />
        <MessageList messages={messages()} onDismiss={dismiss} />
        <ViewSwitch view={view()} onView={(v) => (v === 'side' ? showPlots() : setView(v))} />
        <main class="workspace" data-view={view()}>
          <section class="sheet-pane" aria-label="Sheet" tabindex="-1">
            <SheetNotes />
            <SheetPanel />
          </section>
          <SidePanel control={sidePanel} ready={session.firstResultsDone} />
        </main>
        <Show when={dropping()}>
          <div class="drop-overlay" aria-hidden="true">
            Drop a sheet file (at most {Math.round(MAX_SHEET_FILE_BYTES / 1e6)} MB) to open it
          </div>
        </Show>
      </div>
    </ServicesProvider>
  );
}
