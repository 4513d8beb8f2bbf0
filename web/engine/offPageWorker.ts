/// <reference lib="webworker" />
// Evaluates the cells the page hands off (a cell that ran out of the page's budget, or one that
// reads a value held here) with the command line's budget per cell (DEFAULT_CELL_SECONDS) and no
// hand-off (set here, whatever the shared chunks hold). One request at a time; the page ends this
// worker to cancel one. The replica keeps the cells of earlier requests, so a slow cell read by
// several handed-off cells is evaluated once.
import { SheetReplica } from '../../src/sheet/sheetReplica';
import { stateToTransfer } from '../../src/sheet/valueTransfer';
import type { OffPageReply, OffPageRequest } from './offPageProtocol';
import { loadBuiltinsNamedIn } from './builtinsNeeded';
import { DEFAULT_CELL_SECONDS, setCellBudget, setHandOffOnTimeout } from '../../src/sheet/evaluationBudget';

setCellBudget(DEFAULT_CELL_SECONDS);
setHandOffOnTimeout(false);

const scope = self as unknown as DedicatedWorkerGlobalScope;
const replica = new SheetReplica();

scope.onmessage = async (e: MessageEvent<OffPageRequest>) => {
  const { id, name, text } = e.data;
  const t0 = performance.now();
  await loadBuiltinsNamedIn(text); // the groups of built-ins these cells name (lazyBuiltins.ts)
  let reply: OffPageReply;
  try {
    const state = replica.evaluate(text, name);
    // Never pending here (nothing is handed off in this thread); were it so, the page would hand it off again.
    const outcome: typeof state = state.status === 'pending' ? { status: 'error', error: { kind: 'eval', message: `${name}: no value came from the evaluation off the page` } } : state;
    reply = { id, state: stateToTransfer(outcome), elapsedMs: performance.now() - t0 };
  } catch (err) {
    const message = `${name}: the evaluation off the page failed: ${err instanceof Error ? err.message : String(err)}`;
    reply = { id, state: { status: 'error', error: { kind: 'eval', message } }, elapsedMs: performance.now() - t0 };
  }
  scope.postMessage(reply);
};
