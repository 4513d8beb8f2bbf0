// The page's side of evaluation off the page: the cells the sheet hands off (Sheet.offPageCells)
// are evaluated one at a time in a worker (offPageWorker.ts) and their outcomes handed back by
// ticket. `sync` is called after each completed recalculation: a request whose ticket the sheet
// no longer waits for (an edit changed the cell or an input, or another sheet was put in place)
// is dropped, and the worker is ended when it is evaluating one (it cannot be interrupted).
import type { Sheet } from '../../src/sheet/sheet';
import type { CellState } from '../../src/sheet/types';
import { stateFromTransfer } from '../../src/sheet/valueTransfer';
import type { OffPageReply, OffPageRequest } from './offPageProtocol';
import offPageWorkerUrl from './offPageWorker.ts?shared-worker-url';

/** What the runner needs of a worker (a Web Worker in the page; a stand-in in unit tests). */
export interface OffPageWorkerLike {
  onmessage: ((e: MessageEvent<OffPageReply>) => void) | null;
  onerror: ((e: ErrorEvent) => void) | null;
  postMessage(m: OffPageRequest): void;
  terminate(): void;
}

// Built as an entry of the app's build: it loads the engine chunks the page loads (scripts/sharedWorkerEntries.mjs).
const defaultWorker = (): OffPageWorkerLike => new Worker(offPageWorkerUrl, { type: 'module', name: 'strainsheet-off-page' });

interface Request {
  id: number;
  name: string;
  ticket: number;
  text: string;
}

export class OffPageRunner {
  private worker: OffPageWorkerLike | null = null;
  private queue: Request[] = [];
  private current: Request | null = null;
  private lastId = 0;

  constructor(
    /** Hands an outcome to the sheet (Sheet.supplyOffPage) and runs the recalculation it plans. */
    private readonly supply: (name: string, ticket: number, state: CellState) => void,
    private readonly makeWorker: () => OffPageWorkerLike = defaultWorker,
  ) {}

  /** Cells being evaluated or waiting to be, by name. */
  requested(): string[] {
    return [...(this.current ? [this.current.name] : []), ...this.queue.map((r) => r.name)];
  }

  /** Follows the cells `sheet` now waits for: drops the others, queues the new ones (with their text now). */
  sync(sheet: Sheet): void {
    const wanted = new Map(sheet.offPageCells().map((c) => [`${c.name}#${c.ticket}`, c]));
    const key = (r: Request) => `${r.name}#${r.ticket}`;
    if (this.current && !wanted.has(key(this.current))) this.endWorker();
    this.queue = this.queue.filter((r) => wanted.has(key(r)));
    const known = new Set([...this.queue, ...(this.current ? [this.current] : [])].map(key));
    for (const [k, c] of wanted) {
      if (!known.has(k)) this.queue.push({ id: ++this.lastId, name: c.name, ticket: c.ticket, text: sheet.closureText([c.name]) });
    }
    this.pump();
  }

  /** Stops the off-page evaluation of `name` (handed off with `ticket` at `since`) at the user's request: the cell gets a 'limit' error saying so. */
  cancel(name: string, ticket: number, since: number): void {
    const seconds = ((performance.now() - since) / 1000).toFixed(1);
    if (this.current?.name === name) this.endWorker();
    this.queue = this.queue.filter((r) => r.name !== name);
    this.supply(name, ticket, {
      status: 'error',
      error: { kind: 'limit', message: `${name}: the evaluation off the page was cancelled after ${seconds} s (edit the formula or an input to evaluate it again)` },
    });
    this.pump();
  }

  dispose(): void {
    this.queue = [];
    this.endWorker();
  }

  private endWorker(): void {
    this.worker?.terminate();
    this.worker = null;
    this.current = null;
  }

  private pump(): void {
    if (this.current || !this.queue.length) return;
    const r = this.queue.shift()!;
    this.current = r;
    if (!this.worker) {
      let w: OffPageWorkerLike;
      try {
        w = this.makeWorker();
      } catch (err) {
        this.fail(r, `no worker could be started (${err instanceof Error ? err.message : String(err)})`);
        return;
      }
      w.onmessage = (e) => this.receive(e.data);
      w.onerror = (e) => {
        e.preventDefault();
        const failed = this.current;
        this.endWorker();
        if (failed) this.fail(failed, `the worker stopped (${e.message || 'unknown error'})`);
      };
      this.worker = w;
    }
    this.worker.postMessage({ id: r.id, name: r.name, text: r.text });
  }

  private fail(r: Request, why: string): void {
    this.current = null;
    this.supply(r.name, r.ticket, { status: 'error', error: { kind: 'eval', message: `${r.name}: the evaluation off the page failed: ${why}` } });
    this.pump();
  }

  private receive(m: OffPageReply): void {
    const r = this.current;
    if (!r || m.id !== r.id) return; // a late reply to a request dropped meanwhile
    this.current = null;
    this.supply(r.name, r.ticket, stateFromTransfer(m.state));
    this.pump();
  }
}
