// The panel beside the sheet: plots, scans and the built-in reference, one shown at a time
// (once shown, a panel stays mounted, so plot settings and scan results survive a change of tab).
// Each panel's code (and the plotting library) is loaded on its own, after the sheet: the first
// results never wait for it, and a panel that is never opened is never loaded.
import { createSignal, For, lazy, Show, Suspense } from 'solid-js';

const PlotsPanel = lazy(() => import('../plots/PlotsPanel').then((m) => ({ default: m.PlotsPanel })));
const ScanPanel = lazy(() => import('../jobs/ScanPanel').then((m) => ({ default: m.ScanPanel })));
const ReferencePanel = lazy(() => import('../help/ReferencePanel').then((m) => ({ default: m.ReferencePanel })));

type Tab = 'plots' | 'scan' | 'reference';
const TABS: { id: Tab; label: string }[] = [
  { id: 'plots', label: 'Plots' },
  { id: 'scan', label: 'Scan & sample' },
  { id: 'reference', label: 'Reference' },
];

export function SidePanel() {
  const [tab, setTab] = createSignal<Tab>('plots');
  const [opened, setOpened] = createSignal<ReadonlySet<Tab>>(new Set<Tab>(['plots']));
  const open = (t: Tab) => {
    setTab(t);
    if (!opened().has(t)) setOpened(new Set([...opened(), t]));
  };
  return (
    <aside class="side-panel">
      <div class="tabs no-print" role="tablist">
        <For each={TABS}>
          {(t) => (
            <button type="button" role="tab" data-tab={t.id} aria-selected={tab() === t.id} classList={{ active: tab() === t.id }} onClick={() => open(t.id)}>
              {t.label}
            </button>
          )}
        </For>
      </div>
      <div class="tab-body" role="tabpanel" data-panel="plots" hidden={tab() !== 'plots'}>
        <Show when={opened().has('plots')}>
          <Suspense fallback={<p class="panel-loading">Loading…</p>}>
            <PlotsPanel />
          </Suspense>
        </Show>
      </div>
      <div class="tab-body" role="tabpanel" data-panel="scan" hidden={tab() !== 'scan'}>
        <Show when={opened().has('scan')}>
          <Suspense fallback={<p class="panel-loading">Loading…</p>}>
            <ScanPanel />
          </Suspense>
        </Show>
      </div>
      <div class="tab-body" role="tabpanel" data-panel="reference" hidden={tab() !== 'reference'}>
        <Show when={opened().has('reference')}>
          <Suspense fallback={<p class="panel-loading">Loading…</p>}>
            <ReferencePanel />
          </Suspense>
        </Show>
      </div>
    </aside>
  );
}
