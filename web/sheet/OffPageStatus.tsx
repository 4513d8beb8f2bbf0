// What a row shows while its cell is evaluated off the page (a worker, web/engine/offPageRunner.ts):
// the time since it was handed off and a Cancel; or, for a cell that reads one, which cell it waits for.
import { createSignal, onCleanup, Show } from 'solid-js';
import type { CellState } from '../engine/engine';

type Pending = Extract<CellState, { status: 'pending' }>;

export function OffPageStatus(props: { name: string; state: Pending; onCancel: () => void }) {
  const [now, setNow] = createSignal(performance.now());
  const timer = setInterval(() => setNow(performance.now()), 1000);
  onCleanup(() => clearInterval(timer));
  const seconds = () => Math.max(0, Math.floor((now() - (props.state.offPage?.since ?? now())) / 1000));
  return (
    <Show
      when={props.state.offPage}
      fallback={
        <span class="off-page" data-waits-for={props.state.waitsFor}>
          waits for {props.state.waitsFor} (evaluated off the page)
        </span>
      }
    >
      <span class="off-page" data-off-page={props.name}>
        evaluating off the page, {seconds()} s{' '}
        <button type="button" class="link-button" data-action="cancel-off-page" aria-label={`Cancel the evaluation of ${props.name}`} onClick={() => props.onCancel()}>
          Cancel
        </button>
      </span>
    </Show>
  );
}
