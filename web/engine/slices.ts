// Work on the page's thread is done in slices of APP_SLICE_MS, giving the page back between them
// (to input, rendering and timers), so no task holds the page much longer than one slice. One
// cell's evaluation is not split: it is bounded by the page's cell budget (APP_PAGE_CELL_SECONDS, pageBudget.ts), after which the cell is evaluated off the page.

/** Length of one slice of recalculation or loading, in milliseconds. */
export const APP_SLICE_MS = 12;

const channel = typeof MessageChannel === 'undefined' ? null : new MessageChannel();
const waiting: Array<() => void> = [];
if (channel) {
  channel.port1.onmessage = () => waiting.shift()?.();
}

/** Resolves in a new task, after the page has handled what came in meanwhile (a message-channel task; no 4 ms timer clamping). */
export function yieldToPage(): Promise<void> {
  return new Promise((resolve) => {
    if (!channel) {
      setTimeout(resolve, 0);
      return;
    }
    waiting.push(resolve);
    channel.port2.postMessage(null);
  });
}
