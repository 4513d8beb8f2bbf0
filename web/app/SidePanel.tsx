// The panel beside the sheet: plots, scans and the built-in reference, one shown at a time
// (once shown, a panel stays mounted, so plot settings and scan results survive a change of tab).
// Each panel's code (and the plotting library) is loaded on its own, after the sheet: the first
// results never wait for it, and a panel that is never opened is never loaded. The tab list
// follows the WAI-ARIA Authoring Practices tabs pattern: one tab in the Tab order, arrow keys,
// Home and End move between tabs.
import { createSignal, For, lazy, Show, Suspense, type Accessor } from 'solid-js';

const PlotsPanel = lazy(() => import('../plots/PlotsPanel').then((m) => ({ default: m.PlotsPanel })));
const ScanPanel = lazy(() => import('../jobs/ScanPanel').then((m) => ({ default: m.ScanPanel })));
const RealisationsPanel = lazy(() => import('../jobs/RealisationsPanel').then((m) => ({ default: m.RealisationsPanel })));
const InferencePanel = lazy(() => import('../inference/InferencePanel').then((m) => ({ default: m.InferencePanel })));
const ReferencePanel = lazy(() => import('../help/ReferencePanel').then((m) => ({ default: m.ReferencePanel })));
const DocsPanel = lazy(() => import('../help/DocsPanel').then((m) => ({ default: m.DocsPanel })));

export type SideTab = 'plots' | 'scan' | 'realise' | 'infer' | 'reference' | 'docs';
const TABS: { id: SideTab; label: string }[] = [
  { id: 'plots', label: 'Plots' },
  { id: 'scan', label: 'Scan & sample' },
  { id: 'realise', label: 'Realisations' },
  { id: 'infer', label: 'Inference' },
  { id: 'reference', label: 'Reference' },
  { id: 'docs', label: 'Docs' },
];

/** The element the skip link and the view switch move focus to. */
export const PLOTS_REGION_ID = 'plots-region';

export interface SidePanelControl {
  tab: Accessor<SideTab>;
  showTab(tab: SideTab): void;
  /** Tabs shown at least once (their panels stay mounted). */
  opened: Accessor<ReadonlySet<SideTab>>;
}

export function createSidePanelControl(): SidePanelControl {
  const [tab, setTab] = createSignal<SideTab>('plots');
  const [opened, setOpened] = createSignal<ReadonlySet<SideTab>>(new Set<SideTab>(['plots']));
  return {
    tab,
    opened,
    showTab(t) {
      setTab(t);
      if (!opened().has(t)) setOpened(new Set([...opened(), t]));
    },
  };
}

/** `ready`: false until the first results are evaluated; the plots (not needed for them) wait for it. */
export function SidePanel(props: { control: SidePanelControl; ready?: Accessor<boolean> }) {
  const { tab, showTab, opened } = props.control;
  const buttons: HTMLButtonElement[] = [];
  const onKey = (e: KeyboardEvent, i: number) => {
    const last = TABS.length - 1;
    const next = e.key === 'ArrowRight' ? (i + 1) % TABS.length : e.key === 'ArrowLeft' ? (i + last) % TABS.length : e.key === 'Home' ? 0 : e.key === 'End' ? last : -1;
    if (next < 0) return;
    e.preventDefault();
    showTab(TABS[next].id);
    buttons[next]?.focus();
  };
  const loading = <p class="panel-loading">Loading…</p>;
  return (
    <aside class="side-panel" aria-label="Plots and tools">
      <div class="tabs no-print" role="tablist" aria-label="Side panel">
        <For each={TABS}>
          {(t, i) => (
            <button
              type="button"
              role="tab"
              id={`tab-${t.id}`}
              ref={(el) => (buttons[i()] = el)}
              data-tab={t.id}
              aria-selected={tab() === t.id}
              aria-controls={`panel-${t.id}`}
              tabindex={tab() === t.id ? 0 : -1}
              classList={{ active: tab() === t.id }}
              onClick={() => showTab(t.id)}
              onKeyDown={(e) => onKey(e, i())}
            >
              {t.label}
            </button>
          )}
        </For>
      </div>
      <div class="tab-body" role="tabpanel" id="panel-plots" aria-labelledby="tab-plots" data-panel="plots" hidden={tab() !== 'plots'}>
        <section id={PLOTS_REGION_ID} class="plots-region" aria-label="Plots" tabindex="-1">
          <Show when={opened().has('plots') && (props.ready?.() ?? true)} fallback={opened().has('plots') ? loading : undefined}>
            <Suspense fallback={loading}>
              <PlotsPanel />
            </Suspense>
          </Show>
        </section>
      </div>
      <div class="tab-body" role="tabpanel" id="panel-scan" aria-labelledby="tab-scan" data-panel="scan" hidden={tab() !== 'scan'}>
        <Show when={opened().has('scan')}>
          <Suspense fallback={loading}>
            <ScanPanel />
          </Suspense>
        </Show>
      </div>
      <div class="tab-body" role="tabpanel" id="panel-realise" aria-labelledby="tab-realise" data-panel="realise" hidden={tab() !== 'realise'}>
        <Show when={opened().has('realise')}>
          <Suspense fallback={loading}>
            <RealisationsPanel />
          </Suspense>
        </Show>
      </div>
      <div class="tab-body" role="tabpanel" id="panel-infer" aria-labelledby="tab-infer" data-panel="infer" hidden={tab() !== 'infer'}>
        <Show when={opened().has('infer')}>
          <Suspense fallback={loading}>
            <InferencePanel />
          </Suspense>
        </Show>
      </div>
      <div class="tab-body" role="tabpanel" id="panel-reference" aria-labelledby="tab-reference" data-panel="reference" hidden={tab() !== 'reference'}>
        <Show when={opened().has('reference')}>
          <Suspense fallback={loading}>
            <ReferencePanel />
          </Suspense>
        </Show>
      </div>
      <div class="tab-body" role="tabpanel" id="panel-docs" aria-labelledby="tab-docs" data-panel="docs" hidden={tab() !== 'docs'}>
        <Show when={opened().has('docs')}>
          <Suspense fallback={loading}>
            <DocsPanel />
          </Suspense>
        </Show>
      </div>
    </aside>
  );
}
