// Cells wanted first (Sheet.firstCells; the app asks for A_yr): an unfinished deferred recalculation
// evaluates what they need before the rest. Checked against a sheet rebuilt and evaluated at once
// from the same cells (the oracle, as in properties.test.ts): the first cells are final once the
// cells they need have been evaluated, and finishing gives every cell the oracle's value.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { propertyRuns } from './helpers';
import { Sheet } from '../../src/sheet/sheet';
import type { CellSpec, CellState } from '../../src/sheet/types';
import { valueToJSON } from '../../src/sheet/formatValue';

const NAMES = ['cell1', 'cell2', 'cell3', 'cell4', 'cell5', 'cell6', 'cell7'];

function shown(st: CellState): unknown {
  return st.status === 'value' ? { value: valueToJSON(st.value) } : st.status === 'error' ? { error: st.error.kind, message: st.error.message } : 'pending';
}

function snapshot(sheet: Sheet): Record<string, unknown> {
  return Object.fromEntries(sheet.cells().map((c) => [c.name, shown(sheet.state(c.name))]));
}

/** Cells that read only cells before them (no cycles), in a shuffled sheet order. */
const sheetArb = fc
  .tuple(
    fc.array(fc.tuple(fc.integer({ min: -5, max: 9 }), fc.array(fc.tuple(fc.nat({ max: 6 }), fc.constantFrom('+', '*', '-')), { maxLength: 3 }), fc.constantFrom('', '', ' + 0 m', ' / 0')), {
      minLength: NAMES.length,
      maxLength: NAMES.length,
    }),
    fc.shuffledSubarray(NAMES, { minLength: NAMES.length, maxLength: NAMES.length }),
  )
  .map(([defs, order]) => {
    const formula = (i: number) => {
      const [k, terms, tail] = defs[i];
      const reads = terms.filter(([j]) => j < i).map(([j, op]) => ` ${op} ${NAMES[j]}`);
      return `${k}${reads.join('')}${tail}`;
    };
    return order.map((name) => ({ name, formula: formula(NAMES.indexOf(name)) }));
  });

/** Stops after `n` evaluated cells. */
function after(n: number): () => boolean {
  let k = 0;
  return () => ++k >= n;
}

/** The cells `names` read, directly or not, with themselves. */
function needed(sheet: Sheet, names: string[]): Set<string> {
  const out = new Set(names.filter((n) => sheet.has(n)));
  for (const n of out) for (const d of sheet.dependencies(n)) if (sheet.has(d)) out.add(d);
  return out;
}

describe('cells wanted first', () => {
  it('are final once the cells they need are evaluated, and finishing gives the values of an immediate evaluation', () => {
    fc.assert(
      fc.property(sheetArb, fc.subarray(NAMES, { minLength: 1, maxLength: 2 }), (cells: CellSpec[], first: string[]) => {
        const oracle = new Sheet({ cells });
        const s = new Sheet({ cells, deferRecalculation: true });
        s.firstCells = first;
        const count = needed(s, first).size;
        expect(s.firstCellsPending).toBe(true);
        if (count < cells.length) {
          expect(s.recalculateSome(after(count))).toBe(false);
          expect(s.firstCellsPending).toBe(false);
          for (const n of first) expect(shown(s.state(n))).toEqual(shown(oracle.state(n)));
        }
        expect(s.recalculateSome(() => false)).toBe(true);
        expect(snapshot(s)).toEqual(snapshot(oracle));
      }),
      propertyRuns(300),
    );
  });

  it('keep an unfinished recalculation right through edits that join it', () => {
    const editArb = fc.record({ name: fc.constantFrom(...NAMES), k: fc.integer({ min: -3, max: 3 }), cells: fc.integer({ min: 0, max: 3 }) });
    fc.assert(
      fc.property(sheetArb, fc.subarray(NAMES, { minLength: 1, maxLength: 2 }), fc.array(editArb, { maxLength: 8 }), (cells: CellSpec[], first, edits) => {
        const s = new Sheet({ cells, deferRecalculation: true });
        s.firstCells = first;
        for (const e of edits) {
          // A new constant term keeps the cell's inputs (and so the sheet acyclic).
          const f = s.get(e.name)!.formula;
          s.updateCell(e.name, { formula: f.replace(/^-?\d+/, String(e.k)) });
          if (e.cells > 0) s.recalculateSome(after(e.cells));
        }
        expect(s.recalculateSome(() => false)).toBe(true);
        expect(snapshot(s)).toEqual(snapshot(new Sheet({ cells: s.cells() })));
      }),
      propertyRuns(300),
    );
  });

  it('a sheet built with its recalculation deferred tells its observers each cell as it is evaluated', () => {
    const s = new Sheet({ cells: [{ name: 'x1', formula: '2' }, { name: 'x2', formula: 'x1 * 3' }, { name: 'x3', formula: 'x2 +' }], deferRecalculation: true });
    const heard: string[] = [];
    s.subscribe({ value: (n, v) => heard.push(`${n}=${String(v)}`), error: (n) => heard.push(`${n} error`) });
    expect(s.recalculateSome(() => false)).toBe(true);
    expect(heard.sort()).toEqual(['x1=2', 'x2=6', 'x3 error']);
  });

  it('on the demo, A_yr is final after its inputs only: a few of the sheet’s cells, not the eccentric, hardening or comparison cells', () => {
    const text = readFileSync(new URL('../../examples/demo.json', import.meta.url), 'utf8');
    const oracle = Sheet.fromFile(text);
    const s = Sheet.fromFile(text, { deferRecalculation: true });
    s.firstCells = ['A_yr'];
    const count = needed(s, ['A_yr']).size;
    expect(count).toBeLessThan(s.cells().length / 4);
    for (const slow of ['spectrum_eccentric', 'spectrum_stellar', 'comparison']) expect(needed(s, ['A_yr']).has(slow)).toBe(false);
    // A caller slicing the work stops when the first cells are final: after exactly those cells.
    let evaluated = 0;
    expect(s.recalculateSome(() => (++evaluated, !s.firstCellsPending))).toBe(false);
    expect(evaluated).toBe(count);
    expect(valueToJSON(s.value('A_yr'))).toEqual(valueToJSON(oracle.value('A_yr')));
    expect(s.state('comparison').status).toBe('pending');
  });
});
