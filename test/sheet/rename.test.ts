// Renaming a cell rewrites references at their positions and keeps the rest of the user's text.
import { describe, expect, it } from 'vitest';
import { Sheet, SheetEditError } from '../../src/sheet/sheet';
import { identifierTokens, renameInFormula } from '../../src/sheet/renameReferences';
import { sheetOf } from './helpers';

describe('renameInFormula', () => {
  it('replaces only whole identifier tokens, keeping spacing and comments of the text', () => {
    expect(renameInFormula('rate*2 +  rate_2 + 2rate', 'rate', 'ndot')).toBe('ndot*2 +  rate_2 + 2ndot');
    expect(renameInFormula('x1e5 + 1e5 + x', 'x', 'y')).toBe('x1e5 + 1e5 + y');
    expect(renameInFormula('2e-3x + 0x1F', 'x', 'y')).toBe('2e-3y + 0x1F');
    expect(renameInFormula('concat("rate", "a") + rate', 'rate', 'r2')).toBe('concat("rate", "a") + r2');
  });

  it('finds tokens outside quotes and numbers', () => {
    expect(identifierTokens('a + "b c" + 3e2 d').map((t) => t.name)).toEqual(['a', 'd']);
  });

  it('leaves a formula that does not mention the name alone', () => {
    expect(renameInFormula('1 + other', 'x', 'y')).toBe('1 + other');
  });
});

describe('Sheet.renameCell', () => {
  it('rewrites every formula that refers to the cell and keeps values', () => {
    const s = sheetOf({ rate: '3', twice: 'rate*2   # note', f: 'f(z) = rate * z', use: 'f(2) + twice' });
    s.renameCell('rate', 'rate_norm');
    const formulas = Object.fromEntries(s.cells().map((c) => [c.name, c.formula]));
    expect(formulas).toEqual({ rate_norm: '3', twice: 'rate_norm*2   # note', f: 'f(z) = rate_norm * z', use: 'f(2) + twice' });
    expect(s.value('use')).toBe(12);
  });

  it('renames a function cell, its head and its callers', () => {
    const s = sheetOf({ sq: 'sq(x) = x^2', y: 'sq(3) + sq(1)' });
    s.renameCell('sq', 'square_of');
    expect(s.get('square_of')?.formula).toBe('square_of(x) = x^2');
    expect(s.get('y')?.formula).toBe('square_of(3) + square_of(1)');
    expect(s.value('y')).toBe(10);
  });

  it('does not touch a parameter that shadows the old name, and refuses a capturing new name', () => {
    const s = sheetOf({ k: '2', f: 'f(k) = k + 1', gfun: 'gfun(z) = z * k', use: 'f(1) + gfun(1)' });
    s.renameCell('k', 'k_factor');
    expect(s.get('f')?.formula).toBe('f(k) = k + 1');
    expect(s.get('gfun')?.formula).toBe('gfun(z) = z * k_factor');
    expect(() => s.renameCell('k_factor', 'z')).toThrow(SheetEditError);
    expect(s.value('use')).toBe(4);
  });

  it('resolves cells that were waiting for the new name', () => {
    const s = sheetOf({ a: '5', waits: 'later * 2' });
    s.renameCell('a', 'later');
    expect(s.value('waits')).toBe(10);
  });

  it('refuses invalid or taken names with a reason and suggestion', () => {
    const s = sheetOf({ a: '1', taken: '2' });
    expect(() => s.renameCell('a', 'taken')).toThrow(/already exists/);
    try {
      s.renameCell('a', 'T');
      throw new Error('no error');
    } catch (e) {
      expect(e).toBeInstanceOf(SheetEditError);
      expect((e as SheetEditError).reason).toMatch(/unit/);
      expect((e as SheetEditError).suggestion).toBe('T_span');
    }
    expect(() => s.renameCell('nothing', 'x2')).toThrow(/no cell named nothing/);
  });

  it('rewrites uncertainty formulas that name the cell', () => {
    const s = new Sheet({ cells: [{ name: 'width', formula: '0.3' }, { name: 'rate', formula: '1', uncertainty: 'lognormalSpread(1, width)' }] });
    s.renameCell('width', 'sigma_log');
    expect(s.get('rate')?.uncertainty).toBe('lognormalSpread(1, sigma_log)');
  });

  it('rewrites formulas in error too, so that fixing them finds the renamed cell', () => {
    const s = sheetOf({ rate: '2', broken: 'rate * (3', refusedCell: 'x = rate' });
    s.renameCell('rate', 'rate_norm');
    expect(s.get('broken')?.formula).toBe('rate_norm * (3');
    expect(s.get('refusedCell')?.formula).toBe('x = rate_norm');
    s.updateCell('broken', { formula: 'rate_norm * (3)' });
    expect(s.value('broken')).toBe(6);
  });

  it('updateCell with a new name renames', () => {
    const s = sheetOf({ a: '1', bb: 'a + 1' });
    s.updateCell('a', { name: 'a_new', formula: '2' });
    expect(s.get('bb')?.formula).toBe('a_new + 1');
    expect(s.value('bb')).toBe(3);
  });
});
