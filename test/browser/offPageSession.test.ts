// The page's session with cells evaluated off the page (issue 10, item 1), against a stand-in
// worker that runs the real replica (node, no browser): the outcome of a slow cell comes back and
// its readers compute on the page; an edit that changes the cell or an input ends the worker and
// asks again (a late reply is dropped); Cancel gives a 'limit' error; undo and redo put a sheet
// with a slow cell in place without evaluating it on the page. Values are checked against a sheet
// evaluated from scratch with the command line's budget (the oracle of deferredRecalculation.test.ts).
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Sheet } from '../../web/engine/engine';
import { SheetSession } from '../../web/state/sheetSession';
import type { OffPageWorkerLike } from '../../web/engine/offPageRunner';
import type { OffPageReply, OffPageRequest } from '../../web/engine/offPageProtocol';
import { SheetReplica } from '../../src/sheet/sheetReplica';
import { stateToTransfer } from '../../src/sheet/valueTransfer';
import { cellBudgetSeconds, DEFAULT_CELL_SECONDS, setCellBudget, setHandOffOnTimeout } from '../../src/sheet/evaluationBudget';
import type { CellSpec } from '../../src/sheet/types';

let pageBudget = 0;
beforeAll(() => {
  pageBudget = cellBudgetSeconds(); // pageBudget.ts (imported by the session) set the page's budget and hand-off
  setCellBudget(1e-9); // so short that any cell reaching two time checks is handed off
});
afterAll(() => {
  setCellBudget(pageBudget);
});

/** Runs `f` with the command line's settings, as the worker thread has them. */
function asCommandLine<T>(f: () => T): T {
  const before = cellBudgetSeconds();
  setCellBudget(DEFAULT_CELL_SECONDS);
  setHandOffOnTimeout(false);
  try {
    return f();
  } finally {
    setCellBudget(before);
    setHandOffOnTimeout(true);
  }
}

class StandInWorker implements OffPageWorkerLike {
  onmessage: ((e: MessageEvent<OffPageReply>) => void) | null = null;
  onerror: ((e: ErrorEvent) => void) | null = null;
  requests: OffPageRequest[] = [];
  terminated = false;
  private replica = new SheetReplica();
  postMessage(m: OffPageRequest): void {
    this.requests.push(m);
  }
  terminate(): void {
    this.terminated = true;
  }
  /** Answers the oldest unanswered request as the real worker would. */
  answer(): void {
    const m = this.requests.shift()!;
    const state = asCommandLine(() => stateToTransfer(this.replica.evaluate(m.text, m.name)));
    this.onmessage?.({ data: structuredClone({ id: m.id, state, elapsedMs: 1 }) } as MessageEvent<OffPageReply>);
  }
}

function harness(cells: CellSpec[]) {
  const workers: StandInWorker[] = [];
  const session = new SheetSession(new Sheet({ cells, deferRecalculation: true }), () => {
    const w = new StandInWorker();
    workers.push(w);
    return w;
  });
  return { session, workers, live: () => workers.filter((w) => !w.terminated) };
}

const oracle = (cells: CellSpec[]) => asCommandLine(() => new Sheet({ cells }));

// steps(x) = x + 4 through four calls; sum(map(1:100, steps)) = 100 * 101 / 2 + 400 (arithmetic series).
const CELLS: CellSpec[] = [
  { name: 'step', formula: 'step(x) = x + 1' },
  { name: 'steps', formula: 'steps(x) = step(step(step(step(x))))' },
  { name: 'n', formula: '1' },
  { name: 'slow', formula: 'sum(map(1:100, steps)) + n' },
  { name: 'after', formula: 'slow * 2 m' },
];

describe('a session with cells evaluated off the page', () => {
  it('hands the slow cell to the worker; its value comes back and its readers compute on the page', async () => {
    const { session, workers } = harness(CELLS);
    await session.whenSettled();
    expect(session.current.state('after')).toEqual({ status: 'pending', waitsFor: 'slow' });
    expect(workers.length).toBe(1);
    expect(workers[0].requests.map((r) => r.name)).toEqual(['slow']);
    let complete = false;
    void session.whenComplete().then(() => (complete = true));
    await session.whenSettled();
    expect(complete).toBe(false); // slow is still evaluated off the page
    workers[0].answer();
    await session.whenComplete();
    const expected = oracle(CELLS);
    expect(session.current.value('slow')).toBe(5451);
    expect(session.current.value('slow')).toBe(expected.value('slow'));
    expect(String(session.current.value('after'))).toBe(String(expected.value('after')));
  });

  it('an edit of an input ends the worker and asks again; the late reply is dropped', async () => {
    const { session, workers, live } = harness(CELLS);
    await session.whenSettled();
    const first = workers[0];
    session.edit('edit n', (s) => s.updateCell('n', { formula: '2' }));
    await session.whenSettled();
    expect(first.terminated).toBe(true);
    expect(live().length).toBe(1);
    first.answer(); // the old request's reply: no longer listened to
    expect(session.current.state('slow').status).toBe('pending');
    live()[0].answer();
    await session.whenSettled();
    expect(session.current.value('slow')).toBe(5452);
  });

  it('an edit elsewhere leaves the evaluation running', async () => {
    const { session, workers } = harness([...CELLS, { name: 'other', formula: '3' }]);
    await session.whenSettled();
    session.edit('edit other', (s) => s.updateCell('other', { formula: '4' }));
    await session.whenSettled();
    expect(workers[0].terminated).toBe(false);
    workers[0].answer();
    await session.whenSettled();
    expect(session.current.value('slow')).toBe(5451);
  });

  it('Cancel gives the cell a limit error naming the cancel, and its readers an input error', async () => {
    const { session, workers } = harness(CELLS);
    await session.whenSettled();
    session.cancelOffPage('slow');
    await session.whenSettled();
    expect(workers[0].terminated).toBe(true);
    const st = session.current.state('slow');
    expect(st.status === 'error' && st.error.kind).toBe('limit');
    expect(st.status === 'error' && st.error.message).toMatch(/^slow: the evaluation off the page was cancelled after \d+\.\d s/);
    const after = session.current.state('after');
    expect(after.status === 'error' && after.error.kind).toBe('input');
  });

  it('undo and redo put a sheet with a slow cell in place without evaluating it on the page', async () => {
    const { session, live } = harness([{ name: 'n', formula: '1' }, { name: 'step', formula: 'step(x) = x + 1' }]);
    await session.whenSettled();
    session.edit('add steps', (s) => s.setCell({ name: 'steps', formula: 'steps(x) = step(step(step(step(x))))' }));
    session.edit('add slow', (s) => s.setCell({ name: 'slow', formula: 'sum(map(1:100, steps)) + n' }));
    await session.whenSettled();
    session.undo();
    await session.whenSettled();
    expect(session.current.has('slow')).toBe(false);
    expect(live().length).toBe(0); // the request for the cell that is gone was ended
    session.redo();
    // Put in place with its recalculation deferred: nothing is evaluated until the session's slices run.
    expect(session.current.state('slow').status).toBe('pending');
    await session.whenSettled();
    const st = session.current.state('slow');
    expect(st.status === 'pending' && st.offPage !== undefined).toBe(true);
    live()[0].answer();
    await session.whenSettled();
    expect(session.current.value('slow')).toBe(5451);
  });
});

describe('a sheet put back by undo while one of its cells was evaluated off the page', () => {
  it('asks for that cell again, and its value comes back', async () => {
    const { session, workers, live } = harness(CELLS);
    await session.whenSettled();
    session.load(new Sheet({ cells: [{ name: 'x', formula: '1' }], deferRecalculation: true }), 'new sheet');
    await session.whenSettled();
    expect(workers[0].terminated).toBe(true); // the replaced sheet's request was ended
    session.undo(); // the replaced sheet comes back as it was: slow still waits for its ticket
    // Put in place, its recalculation (nothing left to do) runs in the next task, which asks again.
    for (let i = 0; i < 200 && !live().length; i++) await new Promise((resolve) => setTimeout(resolve, 5));
    expect(live().map((w) => w.requests.map((r) => r.name))).toEqual([['slow']]);
    live()[0].answer();
    await session.whenComplete();
    expect(session.current.value('slow')).toBe(5451);
  });
});

describe('a spectrum held off the page', () => {
  it('is drawn from its JSON as the spectrum itself is', async () => {
    const { spectrumCurves } = await import('../../web/plots/sheetSpectrumModel');
    const { stateFromTransfer } = await import('../../src/sheet/valueTransfer');
    const demo = asCommandLine(() => Sheet.fromFile(readFileSync(new URL('../../examples/demo.json', import.meta.url), 'utf8')));
    const held = stateFromTransfer(structuredClone(stateToTransfer(demo.state('spectrum'))));
    expect(held.status === 'value' && (held.value as { kind: string }).kind).toBe('offPage');
    const cells = demo.cells().filter((c) => c.name === 'spectrum');
    const reader = (value: unknown) => ({ cells, valueOf: () => value, stateOf: () => ({ status: 'value', value }) as const });
    const direct = spectrumCurves(reader(demo.value('spectrum')));
    expect(direct.length).toBe(1);
    expect(spectrumCurves(reader(held.status === 'value' && held.value))).toEqual(direct);
  });
});
