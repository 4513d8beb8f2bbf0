// Property tests (fast-check): the engine's answers do not depend on cell order or on the path
// of edits, files round-trip, and random formulas never escape as exceptions. The oracle for
// incremental recalculation is a sheet rebuilt from scratch from the same cells.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { propertyRuns } from './helpers';
import { Sheet } from '../../src/sheet/sheet';
import type { CellSpec, CellState } from '../../src/sheet/types';
import { valueToJSON } from '../../src/sheet/formatValue';

const NAMES = ['cell1', 'cell2', 'cell3', 'cell4', 'cell5', 'cell6', 'cell7', 'cell8'];

function snapshot(sheet: Sheet): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const c of sheet.cells()) {
    const st: CellState = sheet.state(c.name);
    out[c.name] = st.status === 'value' ? { value: valueToJSON(st.value) } : st.status === 'error' ? { error: st.error.kind } : 'pending';
  }
  return out;
}

/** A formula over some names: constants, sums and products, sometimes a unit or a bad part. */
const formulaArb = fc
  .tuple(
    fc.integer({ min: -5, max: 9 }),
    fc.array(fc.tuple(fc.constantFrom(...NAMES.slice(0, 4), 'nowhere'), fc.constantFrom('+', '*', '-')), { maxLength: 3 }),
    fc.constantFrom('', '', '', ' + 0 m', ' / 0', ' +'),
  )
  .map(([k, terms, tail]) => `${k}${terms.map(([n, op]) => ` ${op} ${n}`).join('')}${tail}`);

describe('properties', () => {
  it('shuffling the cells gives the same results', () => {
    // An acyclic sheet: each cell reads only cells before it in NAMES.
    const dagArb = fc.tuple(...NAMES.map((_, i) =>
      fc.tuple(fc.integer({ min: 0, max: 9 }), fc.subarray(NAMES.slice(0, i), { maxLength: Math.min(3, i) })),
    ));
    fc.assert(
      fc.property(dagArb, fc.infiniteStream(fc.nat()), (spec, randoms) => {
        const cells: CellSpec[] = spec.map(([k, reads], i) => ({ name: NAMES[i], formula: [String(k), ...reads].join(' + ') }));
        const shuffled = [...cells];
        for (let i = shuffled.length - 1; i > 0; i--) {
          const j = randoms.next().value % (i + 1);
          [shuffled[i], shuffled[j]] = [shuffled[j], shuffled[i]];
        }
        const a = snapshot(new Sheet({ cells }));
        const b = snapshot(new Sheet({ cells: shuffled }));
        for (const n of NAMES) expect(b[n]).toEqual(a[n]);
      }),
      propertyRuns(60),
    );
  });

  it('incremental recalculation after random edits equals a full rebuild', () => {
    // Few names, so that edits often meet: cells waiting for a name, renames onto it, cycles.
    const few = NAMES.slice(0, 4);
    const editArb = fc.oneof(
      fc.record({ op: fc.constant('set' as const), name: fc.constantFrom(...few), formula: formulaArb }),
      fc.record({ op: fc.constant('function' as const), name: fc.constantFrom(...few), formula: formulaArb }),
      fc.record({ op: fc.constant('call' as const), name: fc.constantFrom(...few), callee: fc.constantFrom(...few) }),
      fc.record({ op: fc.constant('move' as const), name: fc.constantFrom(...few), to: fc.nat({ max: 4 }) }),
      fc.record({ op: fc.constant('remove' as const), name: fc.constantFrom(...few) }),
      fc.record({ op: fc.constant('rename' as const), name: fc.constantFrom(...few), to: fc.constantFrom(...few) }),
    );
    fc.assert(
      fc.property(fc.array(editArb, { minLength: 1, maxLength: 25 }), (edits) => {
        const s = new Sheet();
        for (const e of edits) {
          if (e.op === 'set') s.setCell({ name: e.name, formula: e.formula });
          else if (e.op === 'function') s.setCell({ name: e.name, formula: `${e.name}(v) = v + ${e.formula}` });
          else if (e.op === 'call') s.setCell({ name: e.name, formula: `${e.callee}(2) * 3` });
          else if (e.op === 'move' && s.has(e.name)) s.moveCell(e.name, e.to);
          else if (e.op === 'remove' && s.has(e.name)) s.removeCell(e.name);
          else if (e.op === 'rename' && s.has(e.name) && !s.has(e.to)) s.renameCell(e.name, e.to);
          const rebuilt = new Sheet({ cells: s.cells() });
          expect(snapshot(s)).toEqual(snapshot(rebuilt));
        }
      }),
      propertyRuns(400),
    );
  });

  it('evaluateWith equals a sheet where the overridden cells hold the values', () => {
    const few = NAMES.slice(0, 5);
    const sheetArb = fc.array(fc.tuple(fc.constantFrom(...few), formulaArb), { minLength: 1, maxLength: 6 });
    fc.assert(
      fc.property(sheetArb, fc.constantFrom(...few), fc.integer({ min: -3, max: 3 }), (specs, target, k) => {
        const s = new Sheet();
        for (const [name, formula] of specs) s.setCell({ name, formula });
        if (!s.has(target)) return;
        const before = snapshot(s);
        const names = s.cells().map((c) => c.name);
        const got = s.evaluateWith({ [target]: k }, names);
        const oracle = new Sheet({ cells: s.cells().map((c) => (c.name === target ? { ...c, formula: String(k) } : c)) });
        for (const n of names) {
          const st = got[n];
          const want = oracle.state(n);
          expect(st.status, n).toBe(want.status);
          if (st.status === 'value' && want.status === 'value') expect(valueToJSON(st.value)).toEqual(valueToJSON(want.value));
          if (st.status === 'error' && want.status === 'error' && want.error.kind !== 'cycle') expect(st.error.kind, n).toBe(want.error.kind);
        }
        expect(snapshot(s)).toEqual(before); // the sheet itself is untouched
      }),
      propertyRuns(300),
    );
  });

  it('files round-trip byte for byte and give an equal sheet', () => {
    const textArb = fc.string({ maxLength: 12, unit: fc.constantFrom('a', 'Z', ' ', '"', '\\', 'é', '\n', '{', '1', '×') });
    const cellArb = fc.record(
      {
        formula: fc.oneof(formulaArb, textArb),
        unit: fc.constantFrom('', 'Mpc', 'nHz', 'km/s'),
        note: textArb,
        source: textArb,
        section: fc.constantFrom('', 'array', 'results'),
        uncertainty: fc.constantFrom('', 'spread(1, 0.3)'),
      },
      { requiredKeys: ['formula'] },
    );
    fc.assert(
      fc.property(fc.array(cellArb, { maxLength: NAMES.length }), textArb, textArb, (cells, title, notes) => {
        const s = new Sheet({ title, notes, cells: cells.map((c, i) => ({ ...c, name: NAMES[i] }) as CellSpec) });
        const text = s.toFileText();
        const back = Sheet.fromFile(text);
        expect(back.toFileText()).toBe(text);
        expect(back.cells()).toEqual(s.cells());
        expect(back.title).toBe(s.title);
        expect(snapshot(back)).toEqual(snapshot(s));
      }),
      propertyRuns(80),
    );
  });

  it('any file text gives a sheet or a SheetFileError, never another exception', () => {
    const cellLike = fc.dictionary(fc.constantFrom('name', 'formula', 'unit', 'note', 'extra', '__proto__', 'constructor'), fc.jsonValue(), { maxKeys: 4 });
    const fileLike = fc.record(
      {
        format: fc.oneof(fc.constant('strainsheet'), fc.string()),
        version: fc.oneof(fc.constantFrom(0, 1, 2), fc.jsonValue()),
        title: fc.jsonValue(),
        notes: fc.jsonValue(),
        cells: fc.oneof(fc.array(cellLike, { maxLength: 4 }), fc.jsonValue()),
      },
      { requiredKeys: [] },
    );
    const texts = fc.oneof(
      fileLike.map((f) => JSON.stringify(f)),
      fileLike.map((f) => JSON.stringify(f).slice(0, 20)), // truncated
      fc.string({ maxLength: 40 }),
      fc.jsonValue().map((v) => JSON.stringify(v) ?? ''),
    );
    fc.assert(
      fc.property(texts, (text) => {
        try {
          Sheet.fromFile(text);
        } catch (e) {
          expect((e as Error).name).toBe('SheetFileError');
        }
      }),
      propertyRuns(400),
    );
  });

  it('random formulas give values or cell errors, never exceptions or prototype changes', () => {
    const pieces = [
      '1', '2.5e3', 'cell1', 'cell2', '(', ')', '[', ']', ',', '+', '-', '*', '/', '^', '!', ' ', 'm', 'km', 'Mpc', ':',
      '=', ';', '.', '?', 'sqrt', 'sin', 'logGrid', 'map', 'constructor', '__proto__', 'toString', 'evaluate',
      'import', 'end', '"', "'", '{', '}', 'x', 'f(x)', 'to', 'e', 'pi', '1:5', '[1,2,3]', 'prototype', 'cos.constructor',
    ];
    const before = Object.getOwnPropertyNames(Object.prototype).sort();
    const fnBefore = Object.getOwnPropertyNames(Function.prototype).sort();
    fc.assert(
      fc.property(fc.array(fc.constantFrom(...pieces), { minLength: 1, maxLength: 14 }), (parts) => {
        const s = new Sheet({ cells: [{ name: 'cell1', formula: '3' }, { name: 'cell2', formula: '[1, 2]' }] });
        const formula = parts.join('');
        s.setCell({ name: 'cell3', formula });
        const st = s.state('cell3');
        expect(['value', 'error']).toContain(st.status);
        s.evaluateWith({ cell1: 4 }, ['cell3']);
      }),
      propertyRuns(400),
    );
    expect(Object.getOwnPropertyNames(Object.prototype).sort()).toEqual(before);
    expect(Object.getOwnPropertyNames(Function.prototype).sort()).toEqual(fnBefore);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });
});
