// Dependency graphs: evaluation order, recomputation counts (through an observer), cycles.
// Each graph is drawn with inputs above the cells that read them.
import { describe, expect, it } from 'vitest';
import { Sheet } from '../../src/sheet/sheet';
import { countEvaluations, plain, sheetOf } from './helpers';

describe('evaluation order and counts', () => {
  /*
   *        a
   *       / \
   *      x   y
   *       \ /
   *        z      w (unrelated)
   */
  it('a diamond recomputes each downstream cell once, in dependency order', () => {
    const s = sheetOf({ z: 'x + y', x: 'a * 2', y: 'a + 1', a: '1', w: '7' });
    expect(s.value('z')).toBe(4); // 2 + 2
    const seen = countEvaluations(s);
    s.updateCell('a', { formula: '10' });
    expect(seen.order).toEqual(['a', 'x', 'y', 'z']); // x, y in sheet order; w untouched
    expect(s.value('z')).toBe(31); // 20 + 11
  });

  /*
   *   a -> b -> c -> d      (each reads the previous one)
   */
  it('an unchanged value stops propagation', () => {
    const s = sheetOf({ a: '3', bb: 'a > 0 ? 1 : 0', c: 'bb * 5', d: 'c + 1' });
    const seen = countEvaluations(s);
    s.updateCell('a', { formula: '4' }); // bb stays 1
    expect(seen.order).toEqual(['a', 'bb']);
    s.updateCell('a', { formula: '-4' }); // bb becomes 0
    expect(seen.order.slice(2)).toEqual(['a', 'bb', 'c', 'd']);
    expect(s.value('d')).toBe(1);
  });

  /*
   *   u (unit quantity) -> v (matrix) -> total
   */
  it('deep-equal quantities and matrices count as unchanged', () => {
    const s = sheetOf({ u: '1000 m', v: '[u, 2 u] to km', total: 'sum(v)' });
    const seen = countEvaluations(s);
    s.updateCell('u', { formula: '1000 m' }); // same text: nothing to do
    expect(seen.count()).toBe(0);
    s.updateCell('u', { formula: '1 km to m' }); // same quantity, new text
    expect(seen.order).toEqual(['u']);
  });

  /*
   *   a -> b -> a   (cycle)     c reads b     free is alone
   */
  it('marks every cell on a cycle, its dependents as input errors, and recovers', () => {
    const s = sheetOf({ a: 'bb + 1', bb: 'a + 1', c: 'bb * 2', free: '5' });
    const ea = s.state('a');
    expect(ea.status === 'error' && ea.error.kind).toBe('cycle');
    expect(ea.status === 'error' && ea.error.message).toContain('a -> bb -> a');
    const eb = s.state('bb');
    expect(eb.status === 'error' && eb.error.message).toContain('bb -> a -> bb');
    expect(plain(s.state('c'))).toEqual({ error: 'input' });
    expect(s.value('free')).toBe(5);
    s.updateCell('a', { formula: '1' });
    expect(s.value('bb')).toBe(2);
    expect(s.value('c')).toBe(4);
  });

  /*
   *   p -> q -> r -> p, with r also reading itself
   */
  it('finds self-loops and longer cycles', () => {
    const s = sheetOf({ selfish: 'selfish + 1', p: 'r', q: 'p', r: 'q' });
    const e = s.state('selfish');
    expect(e.status === 'error' && e.error.message).toContain('selfish -> selfish');
    const r = s.state('r');
    expect(r.status === 'error' && r.error.inputs).toEqual(['r', 'q', 'p', 'r']);
  });

  /*
   *   p1 -> p1 (self-loop), p1 -> p2 -> p3 -> p1 ; removing p2 leaves p3 below the self-loop
   *   (found by the incremental-equals-rebuild property test)
   */
  it('a cell that leaves a cycle loses its cycle error', () => {
    const s = sheetOf({ p1: 'p1 + p2', p3: 'p1', p2: 'p3' });
    expect(plain(s.state('p3'))).toEqual({ error: 'cycle' });
    s.removeCell('p2');
    expect(plain(s.state('p1'))).toEqual({ error: 'cycle' });
    expect(plain(s.state('p3'))).toEqual({ error: 'input' });
  });

  it('creating a cycle by an edit and removing a cell that others read', () => {
    const s = sheetOf({ a: '1', bb: 'a + 1', c: 'bb + 1' });
    s.updateCell('a', { formula: 'c' });
    for (const n of ['a', 'bb', 'c']) expect(plain(s.state(n))).toEqual({ error: 'cycle' });
    s.removeCell('a');
    const st = s.state('bb');
    expect(st.status === 'error' && st.error.kind).toBe('name');
    expect(s.value('c')).toBeUndefined();
    s.setCell({ name: 'a', formula: '40' });
    expect(s.value('c')).toBe(42);
  });

  it('a 10,000-cell chain evaluates without overflowing the stack, and edits are incremental', () => {
    const cells = [{ name: 'c0', formula: '0' }];
    for (let i = 1; i < 10_000; i++) cells.push({ name: `c${i}`, formula: `c${i - 1} + 1` });
    const s = new Sheet({ cells });
    expect(s.value('c9999')).toBe(9999);
    const seen = countEvaluations(s);
    s.updateCell('c5000', { formula: 'c4999 + 2' });
    expect(seen.count()).toBe(5000); // c5000 .. c9999
    expect(s.value('c9999')).toBe(10_000);
    // a cycle over the whole chain is found iteratively too
    s.updateCell('c0', { formula: 'c9999' });
    expect(plain(s.state('c1234'))).toEqual({ error: 'cycle' });
  });

  it('reports pending before each value and structure on edits', () => {
    const s = sheetOf({ a: '1', bb: 'a + 1' });
    const events: string[] = [];
    const stop = s.subscribe({
      pending: (n) => void events.push(`pending ${n}`),
      value: (n) => void events.push(`value ${n}`),
      error: (n) => void events.push(`error ${n}`),
      structure: () => void events.push('structure'),
    });
    s.updateCell('a', { formula: '2' });
    expect(events).toEqual(['structure', 'pending a', 'value a', 'pending bb', 'value bb']);
    events.length = 0;
    s.renameCell('bb', 'bnew');
    s.moveCell('a', 1);
    s.removeCell('bnew');
    expect(events.filter((e) => e === 'structure').length).toBe(3);
    stop();
    events.length = 0;
    s.updateCell('a', { formula: '3' });
    expect(events).toEqual([]);
  });

  it('updateCell changes display fields without recomputing, and keeps the formula when absent', () => {
    const s = sheetOf({ a: '1000 m', bb: 'a * 2' });
    const seen = countEvaluations(s);
    s.updateCell('a', { unit: 'km', note: 'a length' });
    expect(seen.count()).toBe(0);
    expect(s.get('a')).toEqual({ name: 'a', formula: '1000 m', unit: 'km', note: 'a length' });
    s.updateCell('a', { formula: undefined, note: undefined });
    expect(s.get('a')).toEqual({ name: 'a', formula: '1000 m', unit: 'km' });
  });

  it('lists direct dependencies and dependents', () => {
    const s = sheetOf({ a: '1', bb: 'a + missing_cell', c: 'a * bb' });
    expect(s.dependencies('c').sort()).toEqual(['a', 'bb']);
    expect(s.dependencies('bb').sort()).toEqual(['a', 'missing_cell']);
    expect(s.dependents('a')).toEqual(['bb', 'c']);
  });
});
