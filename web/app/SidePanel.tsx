// The panel beside the sheet: plots, scans and the built-in reference, one shown at a time
// (all stay mounted, so plot settings and scan results survive a change of tab).
import { createSignal, For } from 'solid-js';
import { PlotsPanel } from '../plots/PlotsPanel';
import { ScanPanel } from '../jobs/ScanPanel';
import { ReferencePanel } from '../help/ReferencePanel';

type Tab = 'plots' | 'scan' | 'reference';
const TABS: { id: Tab; label: string }[] = [
  { id: 'plots', label: 'Plots' },
  { id: 'scan', label: 'Scan & sample' },
  { id: 'reference', label: 'Reference' },
];

export function SidePanel() {
  const [tab, setTab] = createSignal<Tab>('plots');
  return (
    <aside class="side-panel">
      <div class="tabs no-print" role="tablist">
        <For each={TABS}>
          {(t) => (
            <button type="button" role="tab" data-tab={t.id} aria-selected={tab() === t.id} classList={{ active: tab() === t.id }} onClick={() => setTab(t.id)}>
              {t.label}
            </button>
          )}
        </For>
      </div>
      <div class="tab-body" role="tabpanel" data-panel="plots" hidden={tab() !== 'plots'}>
        <PlotsPanel />
      </div>
      <div class="tab-body" role="tabpanel" data-panel="scan" hidden={tab() !== 'scan'}>
        <ScanPanel />
      </div>
      <div class="tab-body" role="tabpanel" data-panel="reference" hidden={tab() !== 'reference'}>
        <ReferencePanel />
      </div>
    </aside>
  );
}
