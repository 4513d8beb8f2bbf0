// Formulas: parsing, the allow-list, errors as values, function cells.
// Expected numbers are hand arithmetic (independent method) unless a source is named.
import { describe, expect, it } from 'vitest';
import { Sheet } from '../../src/sheet/sheet';
import { compileFormula, MAX_ELEMENTS } from '../../src/sheet/formulaCompiler';
import type { CellError } from '../../src/sheet/cellError';
import { plain, sheetOf, si } from './helpers';

function errorOf(sheet: Sheet, name: string): CellError {
  const st = sheet.state(name);
  if (st.status !== 'error') throw new Error(`${name} has no error: ${JSON.stringify(st)}`);
  return st.error;
}

describe('parsing and evaluation', () => {
  it('evaluates arithmetic, units, conditionals, matrices and indexing', () => {
    const s = sheetOf({
      a: '2 + 3 * 4',
      bb: 'a > 10 ? 1 : 0',
      v: '[1, 2, 3]',
      v2: 'v[2]',
      r: '2:2:8',
      rsum: 'sum(r)',
      d: '(3 km + 500 m) to m',
      rel: '1 < 2 < 3',
      pw: '2^10',
      tail: 'v[end]',
      sl: 'sum(v[2:end])',
    });
    expect(s.value('a')).toBe(14);
    expect(s.value('bb')).toBe(1);
    expect(s.value('v2')).toBe(2);
    expect(s.value('rsum')).toBe(20); // 2+4+6+8
    expect(si(s.value('d'))).toBe(3500);
    expect(s.value('rel')).toBe(true);
    expect(s.value('pw')).toBe(1024);
    expect(s.value('tail')).toBe(3);
    expect(s.value('sl')).toBe(5);
  });

  it('reports a syntax error with its position', () => {
    const s = sheetOf({ x: '1 + (2 * 3' });
    const e = errorOf(s, 'x');
    expect(e.kind).toBe('syntax');
    expect(e.position).toBe(10); // the end of the 10-character text, where ) was expected
    expect(e.message).toMatch(/^x: /);
    const empty = sheetOf({ y: '   ' });
    expect(errorOf(empty, 'y').kind).toBe('syntax');
  });

  it('suggests the nearest existing name for an unknown one', () => {
    const s = sheetOf({ rate_norm: '2', y: 'rate_nrom * 3' });
    const e = errorOf(s, 'y');
    expect(e.kind).toBe('name');
    expect(e.message).toContain('rate_nrom');
    expect(e.message).toContain('did you mean rate_norm');
  });

  it('turns unit mismatches into plain messages', () => {
    const s = sheetOf({ a: '2 m + 3 s', bb: '3 m + 2', c: '(2 m) to s', d: 'sin(2 m)' });
    for (const n of ['a', 'bb', 'c', 'd']) expect(errorOf(s, n).kind).toBe('unit');
    expect(errorOf(s, 'c').message).toContain('cannot convert 2 m to s');
    expect(errorOf(s, 'bb').message).toBe('bb: cannot add 3 m and the plain number 2: one has a unit and the other is a plain number');
    expect(errorOf(s, 'a').message).toBe('a: cannot add 2 m and 3 s: their units have different dimensions');
  });

  it('names the innermost mismatched operands', () => {
    const s = sheetOf({ span: '10 yr', mixed: 'sqrt(span^2 + (1 Mpc)^2) * 2', cmp: 'span > 3' });
    expect(errorOf(s, 'mixed').message).toBe('mixed: cannot add 100 yr^2 and 1 Mpc^2: their units have different dimensions');
    expect(errorOf(s, 'cmp').message).toMatch(/^cmp: cannot compare 10 yr and the plain number 3/);
  });

  it('flags non-finite results, also inside lists', () => {
    const s = sheetOf({ a: '1/0', bb: '0/0', c: '[1, 1/0, 3]', d: '(1/0) * 1 m', ee: '-1/0' });
    for (const n of ['a', 'bb', 'c', 'd', 'ee']) expect(errorOf(s, n).kind).toBe('nonfinite');
    expect(errorOf(s, 'c').message).toContain('element 2');
  });

  it('passes a built-in error kind through with the cell name', () => {
    const s = sheetOf({ grid1: 'logGrid(1 nHz, 10 nHz, 1)', grid2: 'logGrid(1 nHz, 10 s, 4)' });
    const e = errorOf(s, 'grid1');
    expect(e.kind).toBe('domain');
    expect(e.message).toMatch(/^grid1: argument n of logGrid/);
    expect(errorOf(s, 'grid2').kind).toBe('unit');
  });

  it('names the failed input, and the original problem, down a chain', () => {
    const s = sheetOf({ a: '1 m + 1 s', bb: 'a * 2', c: 'bb + 1', ok: '5' });
    expect(errorOf(s, 'bb')).toMatchObject({ kind: 'input', inputs: ['a'] });
    const c = errorOf(s, 'c');
    expect(c).toMatchObject({ kind: 'input', inputs: ['bb'] });
    expect(c.message).toContain('(a: cannot add 1 m and 1 s: their units have different dimensions)');
    expect(s.value('ok')).toBe(5);
  });

  it('refuses constructs outside the allow-list', () => {
    const refused = ['a = 3', 'f(x) = x', '1; 2', '{a: 1}', 'x.y', 'v["length"]', 'sin.name', 'evaluate("1")', 'import({})'];
    for (const text of refused) {
      const c = compileFormula(text, 'cell1');
      expect(c.kind, text).toBe('error');
      if (c.kind === 'error') expect(['refused', 'name'], text).toContain(c.error.kind);
    }
  });

  it('limits ranges, nesting and length', () => {
    expect(compileFormula('1:2e6', 'r')).toMatchObject({ kind: 'error', error: { kind: 'limit' } });
    expect(compileFormula('1:n', 'r')).toMatchObject({ kind: 'error', error: { kind: 'refused' } });
    expect(compileFormula('('.repeat(100) + '1' + ')'.repeat(100), 'r')).toMatchObject({ kind: 'error', error: { kind: 'limit' } });
    expect(compileFormula('1+'.repeat(150_000) + '1', 'r')).toMatchObject({ kind: 'error', error: { kind: 'limit' } });
    expect(compileFormula(`1:${MAX_ELEMENTS}`, 'r').kind).toBe('expression');
  });

  it('refuses a list value larger than the element limit', () => {
    // 1e6 + 1 elements through concat (each range alone is within the limit).
    const s = sheetOf({ a: '1:1000000', bb: 'concat(a, [0])' });
    expect(errorOf(s, 'bb').kind).toBe('limit');
  });

  it('list arithmetic within the limits still works under the size guards', () => {
    // hand arithmetic: [[1,2],[3,4]] * [[1],[1]] = [[3],[7]]; a 300x1 plus a 1x300 broadcast
    const s = sheetOf({ product1: '[[1,2],[3,4]] * [[1],[1]]', grid1: 'transpose([1:300]) + [1:300]', both: '[true, false] and [true, true]', shortcut: 'false and (1/0 > 0)' });
    expect(String((s.value('product1') as { toArray(): unknown[] }).toArray())).toBe('3,7');
    expect((s.value('grid1') as { size(): number[] }).size()).toEqual([300, 300]);
    expect(String((s.value('both') as { toArray(): unknown[] }).toArray())).toBe('true,false');
    expect(s.value('shortcut')).toBe(false);
    const big = sheetOf({ outer: 'transpose([1:2000]) * [1:2000]' }); // 4e6 elements > 1e6
    expect(big.state('outer')).toMatchObject({ status: 'error', error: { kind: 'limit' } });
  });

  it('takes dependencies from the tree, not from called built-ins', () => {
    const s = sheetOf({ x: '2', y: 'sqrt(x) + logGrid(1, x, 2)[1] + pi' });
    expect(s.dependencies('y')).toEqual(['x']);
  });
});

describe('function cells', () => {
  it('gives a plain JS function with params and length', () => {
    const s = sheetOf({ k: '10', density: 'density(z, logM, q) = k * z + logM - q', use: 'density(1, 2, 3)' });
    const f = s.value('density') as ((...a: unknown[]) => unknown) & { params: string[] };
    expect(typeof f).toBe('function');
    expect(f.length).toBe(3);
    expect(f.params).toEqual(['z', 'logM', 'q']);
    expect(f(2, 3, 1)).toBe(22); // 10*2 + 3 - 1
    expect(s.value('use')).toBe(9); // 10*1 + 2 - 3
    expect(s.dependencies('density')).toEqual(['k']);
  });

  it('accepts quantities and follows its inputs', () => {
    const s = sheetOf({ v0: '2 km/s', travel: 'travel(duration) = v0 * duration', d: 'travel(3 s) to m' });
    expect(si(s.value('d'))).toBe(6000);
    s.updateCell('v0', { formula: '3 km/s' });
    expect(si(s.value('d'))).toBe(9000);
  });

  it('must carry the name of its function, and its parameters are checked', () => {
    const s = sheetOf({ gcell: 'h2(x) = x', p: 'p(m) = m * 2', q: 'q(x, x) = x' });
    expect(plain(s.state('gcell'))).toEqual({ error: 'refused' });
    expect(plain(s.state('p'))).toEqual({ error: 'refused' }); // m is the metre
    expect(plain(s.state('q'))).toEqual({ error: 'syntax' }); // mathjs refuses duplicate parameters while parsing
  });

  it('reports a wrong number of arguments and a value called like a function', () => {
    const s = sheetOf({ sq: 'sq(x) = x^2', a: 'sq(1, 2)', v: '3', bb: 'v(2)', c: 'map([1, 2, 3], sq)' });
    expect(errorOf(s, 'a').message).toContain('sq(x) takes 1 argument, got 2');
    expect(errorOf(s, 'bb').message).toContain('v is called like a function');
    expect(String((s.value('c') as { toArray(): unknown[] }).toArray())).toBe('1,4,9');
  });

  it('a function cell calling itself is a cycle, not endless recursion', () => {
    const s = sheetOf({ f: 'f(x) = f(x - 1)', y: 'f(3)' });
    expect(plain(s.state('f'))).toEqual({ error: 'cycle' });
    expect(plain(s.state('y'))).toEqual({ error: 'input' });
  });
});
