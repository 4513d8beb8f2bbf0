// Sheets evaluated on read (SheetOptions.evaluateOnRead, used by the command line's jobs): whatever
// is read, in whatever order and between whatever edits, gives the state of a sheet evaluated in full
// from the same cells (the oracle, as in properties.test.ts), and cells nothing reads are not evaluated.
import { afterEach, describe, expect, it, vi } from 'vitest';
import fc from 'fast-check';
import { propertyRuns } from './helpers';
import { readFileSync } from 'node:fs';
import { Sheet } from '../../src/sheet/sheet';
import type { CellState } from '../../src/sheet/types';
import { valueToJSON } from '../../src/sheet/formatValue';

const NAMES = ['cell1', 'cell2', 'cell3', 'cell4', 'cell5', 'cell6'];

/** A state as plain data (cycle paths included); the "did you mean" guess (it follows the order cells were added) left out. */
function plain(st: CellState): unknown {
  if (st.status === 'value') return { value: valueToJSON(st.value) };
  if (st.status === 'error') return { error: st.error.kind, message: st.error.message.replace(/ \(did you mean \w+\?\)/, '') };
  return 'pending';
}

const formulaArb = fc
  .tuple(
    fc.integer({ min: -5, max: 9 }),
    fc.array(fc.tuple(fc.constantFrom(...NAMES, 'nowhere'), fc.constantFrom('+', '*', '-')), { maxLength: 3 }),
    fc.constantFrom('', '', '', ' + 0 m', ' / 0', ' +'),
  )
  .map(([k, terms, tail]) => `${k}${terms.map(([n, op]) => ` ${op} ${n}`).join('')}${tail}`);

afterEach(() => {
  vi.restoreAllMocks();
});

describe('a sheet evaluated on read', () => {
  it('reads between random edits give the states of a full evaluation', () => {
    const stepArb = fc.oneof(
      fc.record({ op: fc.constant('set' as const), name: fc.constantFrom(...NAMES), formula: formulaArb }),
      fc.record({ op: fc.constant('function' as const), name: fc.constantFrom(...NAMES), formula: formulaArb }),
      fc.record({ op: fc.constant('remove' as const), name: fc.constantFrom(...NAMES) }),
      fc.record({ op: fc.constant('rename' as const), name: fc.constantFrom(...NAMES), to: fc.constantFrom(...NAMES) }),
      fc.record({ op: fc.constant('read' as const), name: fc.constantFrom(...NAMES) }),
      fc.record({ op: fc.constant('with' as const), name: fc.constantFrom(...NAMES), output: fc.constantFrom(...NAMES) }),
    );
    fc.assert(
      fc.property(fc.array(fc.record({ name: fc.constantFrom(...NAMES), formula: formulaArb }), { maxLength: 6 }), fc.array(stepArb, { maxLength: 20 }), (initial, steps) => {
        const cells = initial.filter((c, i) => initial.findIndex((d) => d.name === c.name) === i);
        const s = new Sheet({ cells, evaluateOnRead: true });
        for (const e of steps) {
          if (e.op === 'set') s.setCell({ name: e.name, formula: e.formula });
          else if (e.op === 'function') s.setCell({ name: e.name, formula: `${e.name}(v) = v + ${e.formula}` });
          else if (e.op === 'remove' && s.has(e.name)) s.removeCell(e.name);
          else if (e.op === 'rename' && s.has(e.name) && !s.has(e.to)) s.renameCell(e.name, e.to);
          else if (e.op === 'read' && s.has(e.name)) expect(plain(s.state(e.name))).toEqual(plain(new Sheet({ cells: s.cells() }).state(e.name)));
          else if (e.op === 'with' && s.has(e.name) && s.has(e.output)) {
            const full = new Sheet({ cells: s.cells() });
            expect(plain(s.evaluateWith({ [e.name]: 4 }, [e.output])[e.output])).toEqual(plain(full.evaluateWith({ [e.name]: 4 }, [e.output])[e.output]));
          }
        }
        const full = new Sheet({ cells: s.cells() });
        for (const c of [...s.cells()].reverse()) expect(plain(s.state(c.name))).toEqual(plain(full.state(c.name)));
      }),
      propertyRuns(400),
    );
  });

  it('evaluates only the cells a read needs, and reports a broken input the read needs', () => {
    const evaluated: string[] = [];
    const proto = Sheet.prototype as unknown as { evaluateCompiled(name: string, ...rest: unknown[]): CellState };
    const original = proto.evaluateCompiled;
    vi.spyOn(proto, 'evaluateCompiled').mockImplementation(function (this: unknown, name: string, ...rest: unknown[]) {
      evaluated.push(name);
      return original.call(this, name, ...rest);
    });
    const s = new Sheet({
      evaluateOnRead: true,
      cells: [
        { name: 'side', formula: '2 m' },
        { name: 'broken', formula: 'side + 1 s' },
        { name: 'triple', formula: 'side * 3' },
        { name: 'total', formula: 'triple + side' },
        { name: 'reader', formula: 'broken * 2' },
        { name: 'unread', formula: 'total * 10' },
      ],
    });
    expect(evaluated).toEqual([]);
    // Read twice, evaluated once. Quantities by hand: total = 3 * 2 m + 2 m = 8 m.
    expect(valueToJSON(s.value('total'))).toEqual(valueToJSON(s.value('total')));
    expect(valueToJSON(s.value('total'))).toEqual({ value: 8, unit: 'm' });
    expect(evaluated).toEqual(['side', 'triple', 'total']);
    expect(s.state('reader')).toMatchObject({ status: 'error', error: { kind: 'input', message: expect.stringMatching(/^reader: input broken has an error \(broken: .*unit/) } });
    expect(evaluated).toEqual(['side', 'triple', 'total', 'broken', 'reader']);
    // side = 1 m: total = 3 m + 1 m = 4 m.
    const r = s.evaluateWith({ side: s.overridesFromFormulas({ side: '1 m' }).side }, ['total']).total;
    expect(r.status === 'value' && valueToJSON(r.value)).toEqual({ value: 4, unit: 'm' });
    expect(evaluated).not.toContain('unread');
  });

  it('the demo sheet: each cell read alone equals the full evaluation', () => {
    const text = readFileSync(new URL('../../examples/demo.json', import.meta.url), 'utf8');
    const full = Sheet.fromFile(text);
    for (const name of ['A_yr', 'spectrum', 'comparison_yr', 'mass_slope']) {
      const s = Sheet.fromFile(text, { evaluateOnRead: true });
      expect(plain(s.state(name))).toEqual(plain(full.state(name)));
      expect(s.recalculating).toBe(true); // the rest is left unevaluated
    }
  });
});
