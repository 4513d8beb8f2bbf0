// Evaluation off the page (issue 10, item 1, the app): with hand-off on, a cell that runs out of
// the page's short budget waits (its readers too) instead of failing, a replica with the command
// line's budget evaluates it, and the outcome supplied back gives the values of a sheet evaluated
// from scratch with that budget (the oracle, as in deferredRecalculation.test.ts).
import { afterEach, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { propertyRuns } from './helpers';
import { Sheet } from '../../src/sheet/sheet';
import { SheetReplica } from '../../src/sheet/sheetReplica';
import { stateFromTransfer, stateToTransfer } from '../../src/sheet/valueTransfer';
import { isOffPageValue } from '../../src/sheet/offPageValue';
import { DEFAULT_CELL_SECONDS, setCellBudget, setHandOffOnTimeout } from '../../src/sheet/evaluationBudget';
import { valueToJSON } from '../../src/sheet/formatValue';
import type { CellSpec, CellState } from '../../src/sheet/types';

/** The page's settings: hand-off on, a budget so short that any cell reaching two time checks runs out. */
function pageMode(): void {
  setHandOffOnTimeout(true);
  setCellBudget(1e-9);
}
function commandLineMode(): void {
  setHandOffOnTimeout(false);
  setCellBudget(DEFAULT_CELL_SECONDS);
}
afterEach(commandLineMode);

/** Evaluates off the page as the app's worker does: a replica, the command line's budget, the state sent as plain data. */
function offPage(replica: SheetReplica, sheet: Sheet, name: string): CellState {
  const text = sheet.closureText([name]);
  commandLineMode();
  try {
    return stateFromTransfer(structuredClone(stateToTransfer(replica.evaluate(text, name))));
  } finally {
    pageMode();
  }
}

function snapshot(sheet: Sheet): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const c of sheet.cells()) {
    const st = sheet.state(c.name);
    // As in deferredRecalculation.test.ts (cycle paths included), less the "did you mean" guess:
    // the replica holds fewer cells than the sheet.
    out[c.name] = st.status === 'value' ? { value: valueToJSON(st.value) } : st.status === 'error' ? { error: st.error.kind, message: st.error.message.replace(/ \(did you mean \w+\?\)/, '') } : 'pending';
  }
  return out;
}

/** From scratch, on the command line's settings. */
function oracle(cells: CellSpec[]): Record<string, unknown> {
  commandLineMode();
  try {
    return snapshot(new Sheet({ cells }));
  } finally {
    pageMode();
  }
}

// steps(x) = x + 4 through four calls; sum(map(1:100, steps)) = 100 * 101 / 2 + 400 (arithmetic series).
const SLOW = [
  { name: 'step', formula: 'step(x) = x + 1' },
  { name: 'steps', formula: 'steps(x) = step(step(step(step(x))))' },
  { name: 'n', formula: '100' },
  { name: 'slow', formula: 'sum(map(1:100, steps)) + n' },
  { name: 'after', formula: 'slow * 2 m' },
  { name: 'later', formula: 'after + 1 m' },
  { name: 'free', formula: 'n + 1' },
];

describe('evaluation off the page', () => {
  it('hands a cell that runs out of the page budget off; its readers wait for it; others compute', () => {
    pageMode();
    const s = new Sheet({ cells: SLOW });
    const st = s.state('slow');
    expect(st.status === 'pending' && st.offPage?.ticket).toBeGreaterThan(0);
    expect(s.state('after')).toEqual({ status: 'pending', waitsFor: 'slow' });
    expect(s.state('later')).toEqual({ status: 'pending', waitsFor: 'slow' });
    expect(s.value('free')).toBe(101);
    expect(s.offPageCells().map((c) => c.name)).toEqual(['slow']);
    // The replica needs the cell and what it reads, nothing else.
    expect(JSON.parse(s.closureText(['slow'])).cells.map((c: CellSpec) => c.name)).toEqual(['step', 'steps', 'n', 'slow']);
    const ticket = s.offPageCells()[0].ticket;
    expect(s.supplyOffPage('slow', ticket, offPage(new SheetReplica(), s, 'slow'))).toBe(true);
    expect(s.value('slow')).toBe((100 * 101) / 2 + 400 + 100);
    expect(snapshot(s)).toEqual(oracle(s.cells()));
    expect(s.offPageCells()).toEqual([]);
  });

  it('a sheet built with its recalculation deferred tells its observers the values when it runs', () => {
    const s = Sheet.fromFile(JSON.stringify({ format: 'strainsheet', version: 2, title: '', notes: '', cells: [{ name: 'x', formula: '2' }, { name: 'y', formula: 'x * 3' }] }), { deferRecalculation: true });
    expect(s.state('y').status).toBe('pending');
    const heard: string[] = [];
    s.subscribe({ value: (name, v) => heard.push(`${name}=${String(v)}`) });
    expect(s.recalculateSome(() => false)).toBe(true);
    expect(heard).toEqual(['x=2', 'y=6']);
  });

  it('without hand-off (the command line) the short budget gives a limit error', () => {
    setCellBudget(1e-9);
    const s = new Sheet({ cells: SLOW });
    const st = s.state('slow');
    expect(st.status === 'error' && st.error.kind).toBe('limit');
  });

  it('refuses an outcome an edit made stale, and takes one an unrelated edit did not', () => {
    pageMode();
    const s = new Sheet({ cells: SLOW });
    s.deferRecalculation = true;
    const first = s.offPageCells()[0];
    const replica = new SheetReplica();
    const outcome = offPage(replica, s, 'slow');
    s.updateCell('free', { formula: 'n + 2' }); // not an input of slow
    s.recalculateSome(() => false);
    expect(s.offPageCells()[0].ticket).toBe(first.ticket);
    s.updateCell('n', { formula: '200' }); // an input: handed off again
    s.recalculateSome(() => false);
    const second = s.offPageCells()[0];
    expect(second.ticket).not.toBe(first.ticket);
    expect(s.supplyOffPage('slow', first.ticket, outcome)).toBe(false);
    expect(s.supplyOffPage('slow', second.ticket, offPage(replica, s, 'slow'))).toBe(true);
    s.recalculateSome(() => false);
    expect(s.value('slow')).toBe((100 * 101) / 2 + 400 + 200);
    expect(snapshot(s)).toEqual(oracle(s.cells()));
  });

  it('keeps an object computed off the page as a stand-in and evaluates its readers off the page too', () => {
    pageMode();
    const cells = [
      ...SLOW,
      // a cosmology that is slow itself (0 * sum(...) adds nothing)
      { name: 'cosmo', formula: 'flatCosmology(70 km/s/Mpc + 0 * sum(map(1:100, steps)) * 1 km/s/Mpc, 0.3)' },
      { name: 'dist', formula: 'comovingDistance(cosmo, 1)' },
      { name: 'twice', formula: 'dist * 2' },
    ];
    const s = new Sheet({ cells });
    const replica = new SheetReplica();
    const supplyAll = () => {
      for (let round = 0; round < 10 && s.offPageCells().length; round++) {
        for (const c of s.offPageCells()) s.supplyOffPage(c.name, c.ticket, offPage(replica, s, c.name));
      }
    };
    supplyAll();
    expect(isOffPageValue(s.value('cosmo'))).toBe(true);
    expect(String((s.value('cosmo') as { describe(): string }).describe())).toMatch(/held off the page/);
    // dist read the stand-in: it was evaluated off the page and its plain value came back; twice computed here.
    expect(snapshot(s)).toEqual(oracle(s.cells()));
    expect(s.offPageCells()).toEqual([]);
  });

  it('reaches the values of a from-scratch evaluation whatever the edits, partial recalculations and off-page answers', () => {
    const NAMES = ['cell1', 'cell2', 'cell3', 'cell4', 'cell5'];
    const formulaArb = fc
      .tuple(fc.integer({ min: -5, max: 9 }), fc.array(fc.tuple(fc.constantFrom(...NAMES, 'nowhere'), fc.constantFrom('+', '*', '-')), { maxLength: 3 }), fc.constantFrom('', '', ' + 0 m', ' / 0'))
      .map(([k, terms, tail]) => `${k}${terms.map(([n, op]) => ` ${op} ${n}`).join('')}${tail}`);
    const editArb = fc.oneof(
      fc.record({ op: fc.constant('set' as const), name: fc.constantFrom(...NAMES), formula: formulaArb }),
      fc.record({ op: fc.constant('function' as const), name: fc.constantFrom(...NAMES), formula: formulaArb }),
      // calls the function cell twice(v) 20 times: runs out of the page budget
      fc.record({ op: fc.constant('slow' as const), name: fc.constantFrom(...NAMES), callee: fc.constantFrom(...NAMES, '0') }),
      fc.record({ op: fc.constant('slow' as const), name: fc.constantFrom(...NAMES), callee: fc.constantFrom(...NAMES, '0') }),
      fc.record({ op: fc.constant('remove' as const), name: fc.constantFrom(...NAMES) }),
      fc.record({ op: fc.constant('rename' as const), name: fc.constantFrom(...NAMES), to: fc.constantFrom(...NAMES) }),
    );
    let handedOff = 0;
    fc.assert(
      fc.property(fc.array(fc.tuple(editArb, fc.integer({ min: 0, max: 3 }), fc.integer({ min: 0, max: 2 })), { minLength: 1, maxLength: 25 }), (steps) => {
        pageMode();
        const s = new Sheet({ deferRecalculation: true, cells: [{ name: 'twice', formula: 'twice(v) = 2 v' }] });
        const replica = new SheetReplica();
        for (const [e, cells, answers] of steps) {
          if (e.op === 'set') s.setCell({ name: e.name, formula: e.formula });
          else if (e.op === 'function') s.setCell({ name: e.name, formula: `${e.name}(v) = v + ${e.formula}` });
          else if (e.op === 'slow') s.setCell({ name: e.name, formula: `sum(map(1:20, twice)) + ${e.callee}` });
          else if (e.op === 'remove' && s.has(e.name)) s.removeCell(e.name);
          else if (e.op === 'rename' && s.has(e.name) && !s.has(e.to)) s.renameCell(e.name, e.to);
          let k = 0;
          if (cells > 0) s.recalculateSome(() => ++k >= cells);
          handedOff += s.offPageCells().length;
          // The worker answers some of the cells handed off (stale answers are refused).
          for (const c of s.offPageCells().slice(0, answers)) s.supplyOffPage(c.name, c.ticket, offPage(replica, s, c.name));
        }
        for (let round = 0; round < 20; round++) {
          s.recalculateSome(() => false);
          const waiting = s.offPageCells();
          handedOff += waiting.length;
          if (!waiting.length) break;
          for (const c of waiting) s.supplyOffPage(c.name, c.ticket, offPage(replica, s, c.name));
        }
        expect(s.offPageCells()).toEqual([]);
        expect(snapshot(s)).toEqual(oracle(s.cells()));
      }),
      propertyRuns(200),
    );
    expect(handedOff).toBeGreaterThan(20); // the runs did exercise the hand-off
  });
});

describe('cell values across threads', () => {
  it('rebuilds numbers, units, complex numbers, matrices and lists exactly, and describes the rest', () => {
    const s = new Sheet({
      cells: [
        { name: 'va', formula: '1/3' },
        { name: 'vb', formula: '(1/3) km/s' },
        { name: 'vc', formula: '2 + 3i' },
        { name: 'vd', formula: '[1, 2; 3, 4] * 1 kg' },
        { name: 've', formula: '"text"' },
        { name: 'f', formula: 'f(x) = x + 1' },
        { name: 'vg', formula: '5 Msun' },
        { name: 'vh', formula: 'true' },
      ],
    });
    for (const name of ['va', 'vb', 'vc', 'vd', 've', 'vg', 'vh']) {
      const st = s.state(name);
      const t = structuredClone(stateToTransfer(st));
      expect(t.status, name).toBe('value');
      const back = stateFromTransfer(t);
      // same content and class: the equality the engine stops propagation on (valueEquality.ts)
      expect(valueToJSON(back.status === 'value' && back.value), name).toEqual(valueToJSON(st.status === 'value' && st.value));
    }
    const f = stateToTransfer(s.state('f'));
    expect(f.status).toBe('held');
  });
});
