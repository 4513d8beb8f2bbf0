// Undo and redo by the change an edit made (web/state/sheetChange.ts, sheetHistory.ts): after any
// sequence of edits, undoing them one by one gives back each earlier sheet exactly (its file text)
// with the values of that sheet rebuilt from scratch (the oracle, as in properties.test.ts), and
// redoing them gives the later ones back. Edits are applied with recalculation deferred and left
// unfinished at random, as the app does.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { propertyRuns } from './helpers';
import { Sheet } from '../../src/sheet/sheet';
import type { CellState } from '../../src/sheet/types';
import { valueToJSON } from '../../src/sheet/formatValue';
import { applyChange, captureSheet, changeBetween, isEmptyChange } from '../../web/state/sheetChange';
import { SheetHistory } from '../../web/state/sheetHistory';

const NAMES = ['cell1', 'cell2', 'cell3', 'cell4', 'cell5', 'cell6'];

function values(sheet: Sheet): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const c of sheet.cells()) {
    const st: CellState = sheet.state(c.name);
    // Messages (cycle paths included) less the "did you mean" guess (it follows the order of edits).
    out[c.name] = st.status === 'value' ? { value: valueToJSON(st.value) } : st.status === 'error' ? { error: st.error.kind, message: st.error.message.replace(/ \(did you mean \w+\?\)/, '') } : 'pending';
  }
  return out;
}

/** Finishes the deferred work and checks the values against the same file rebuilt from scratch. */
function expectFromScratch(s: Sheet): void {
  s.recalculateSome(() => false);
  expect(values(s)).toEqual(values(Sheet.fromFile(s.toFileText())));
}

const formulaArb = fc
  .tuple(fc.integer({ min: -5, max: 9 }), fc.array(fc.tuple(fc.constantFrom(...NAMES, 'nowhere'), fc.constantFrom('+', '*', '-')), { maxLength: 3 }), fc.constantFrom('', '', ' m', ' / 0'))
  .map(([k, terms, tail]) => `${k}${terms.map(([n, op]) => ` ${op} ${n}`).join('')}${tail}`);

const editArb = fc.oneof(
  fc.record({ op: fc.constant('set' as const), name: fc.constantFrom(...NAMES), formula: formulaArb }),
  fc.record({ op: fc.constant('function' as const), name: fc.constantFrom(...NAMES), formula: formulaArb }),
  fc.record({ op: fc.constant('note' as const), name: fc.constantFrom(...NAMES), text: fc.constantFrom('', 'a note', 'other') }),
  fc.record({ op: fc.constant('move' as const), name: fc.constantFrom(...NAMES), to: fc.nat({ max: 6 }) }),
  fc.record({ op: fc.constant('remove' as const), name: fc.constantFrom(...NAMES) }),
  fc.record({ op: fc.constant('rename' as const), name: fc.constantFrom(...NAMES), to: fc.constantFrom(...NAMES) }),
  fc.record({ op: fc.constant('title' as const), text: fc.constantFrom('', 'T1', 'T2') }),
  fc.record({ op: fc.constant('two' as const), a: fc.constantFrom(...NAMES), b: fc.constantFrom(...NAMES), formula: formulaArb }),
);
type Edit = typeof editArb extends fc.Arbitrary<infer T> ? T : never;

function apply(s: Sheet, e: Edit): void {
  if (e.op === 'set') s.setCell({ name: e.name, formula: e.formula });
  else if (e.op === 'function') s.setCell({ name: e.name, formula: `${e.name}(v) = v + ${e.formula}` });
  else if (e.op === 'note' && s.has(e.name)) s.updateCell(e.name, { note: e.text });
  else if (e.op === 'move' && s.has(e.name)) s.moveCell(e.name, e.to);
  else if (e.op === 'remove' && s.has(e.name)) s.removeCell(e.name);
  else if (e.op === 'rename' && s.has(e.name) && !s.has(e.to)) s.renameCell(e.name, e.to);
  else if (e.op === 'title') s.title = e.text;
  else if (e.op === 'two') {
    s.setCell({ name: e.a, formula: e.formula });
    s.setCell({ name: e.b, formula: `${e.a} + 1` }, 0);
  }
}

describe('undo and redo by the change an edit made', () => {
  it('undoing every edit gives back each earlier sheet with from-scratch values; redoing gives the later ones', () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(editArb, fc.integer({ min: 0, max: 3 })), { minLength: 1, maxLength: 25 }), (steps) => {
        const s = new Sheet({ cells: [{ name: 'cell1', formula: '2' }, { name: 'cell2', formula: 'cell1 * 3' }] });
        s.deferRecalculation = true;
        const history = new SheetHistory();
        const texts = [s.toFileText()];
        for (const [e, cellsOfWork] of steps) {
          let work = cellsOfWork;
          const before = captureSheet(s);
          try {
            apply(s, e);
          } catch {
            // A refused edit (a rename captured by a parameter): taken back as the session does.
            const back = changeBetween(before, captureSheet(s));
            if (!isEmptyChange(back)) applyChange(s, back, 'before');
            expect(s.toFileText()).toBe(texts.at(-1));
            continue;
          }
          history.recordEdit(`edit`, before, captureSheet(s));
          if (s.toFileText() !== texts.at(-1)) texts.push(s.toFileText());
          if (work > 0) s.recalculateSome(() => --work < 0);
        }
        expectFromScratch(s);
        for (let i = texts.length - 2; i >= 0; i--) {
          const step = history.takeUndo()!;
          expect(step.kind).toBe('cells');
          if (step.kind === 'cells') applyChange(s, step.change, 'before');
          expect(s.toFileText()).toBe(texts[i]);
          expectFromScratch(s);
        }
        expect(history.takeUndo()).toBeUndefined();
        for (let i = 1; i < texts.length; i++) {
          const step = history.takeRedo()!;
          if (step.kind === 'cells') applyChange(s, step.change, 'after');
          expect(s.toFileText()).toBe(texts[i]);
          expectFromScratch(s);
        }
      }),
      propertyRuns(300),
    );
  });

  it('edits of one group make one step, and none when they come back to where the group started', () => {
    const s = new Sheet({ cells: [{ name: 'x', formula: '1' }, { name: 'y', formula: 'x + 1' }] });
    const history = new SheetHistory();
    const start = s.toFileText();
    const edit = (formula: string) => {
      const before = captureSheet(s);
      s.updateCell('x', { formula });
      history.recordEdit('edit x', before, captureSheet(s), 'row x');
    };
    edit('2');
    edit('3');
    expect(history.undoLabel).toBe('edit x');
    const step = history.takeUndo()!;
    expect(history.undoLabel).toBeNull();
    if (step.kind === 'cells') applyChange(s, step.change, 'before');
    expect(s.toFileText()).toBe(start);
    expect(s.value('y')).toBe(2); // x = 1 again, y = x + 1 (by hand)
    // A new group (undo ended the last one) that comes back to where it started leaves no step.
    edit('4');
    expect(history.undoLabel).toBe('edit x');
    edit('1');
    expect(history.undoLabel).toBeNull();
    expect(history.redoLabel).toBeNull(); // the new edit dropped the redo step
  });

  it('the change of an edit in a long sheet holds only the cells between the unchanged ends', () => {
    const cells = Array.from({ length: 2000 }, (_, i) => ({ name: `c${i}`, formula: i === 0 ? '1' : `c${i - 1} + 1` }));
    const s = new Sheet({ cells });
    const before = captureSheet(s);
    s.updateCell('c1000', { formula: 'c999 + 2' });
    const change = changeBetween(before, captureSheet(s));
    expect(change.start).toBe(1000);
    expect(change.before.middle.map((c) => c.formula)).toEqual(['c999 + 1']);
    expect(change.after.middle.map((c) => c.formula)).toEqual(['c999 + 2']);
    applyChange(s, change, 'before');
    expect(s.value('c1999')).toBe(2000); // c_i = i + 1 (by hand)
  });
});
