// Which cell names are refused, with a reason and a valid alternative.
import { describe, expect, it } from 'vitest';
import { checkCellName } from '../../src/sheet/cellName';
import { Sheet, SheetEditError, allFunctionNames, availableNames } from '../../src/sheet/sheet';

describe('cell names', () => {
  it('accepts identifiers of the trade', () => {
    for (const n of ['A_yr', 'rate_norm', 'gamma', 'T_span', 'f_low', 'logM', 'z0', 'alpha_M', 'q_min', 'Omega_gw']) {
      expect(checkCellName(n), n).toEqual({ ok: true });
    }
  });

  const refused: Array<[string, RegExp]> = [
    ['', /empty/],
    ['2fast', /digit/],
    ['a-b', /only letters/],
    ['__proto__', /JavaScript object property/],
    ['constructor', /JavaScript object property/],
    ['hasOwnProperty', /JavaScript object property/],
    ['toString', /JavaScript object property/],
    ['valueOf', /JavaScript object property/],
    ['prototype', /JavaScript object property/],
    ['to', /reserved/],
    ['end', /reserved/],
    ['function', /reserved/],
    ['pi', /constant/],
    ['e', /constant/],
    ['i', /constant/],
    ['Infinity', /constant/],
    ['NaN', /constant/],
    ['true', /constant/],
    ['null', /constant/],
    ['tau', /constant/],
    ['phi', /constant/],
    ['m', /unit/],
    ['s', /unit/],
    ['g', /unit/],
    ['h', /unit/],
    ['T', /unit/],
    ['A', /unit/],
    ['N', /unit/],
    ['K', /unit/],
    ['L', /unit/],
    ['J', /unit/],
    ['W', /unit/],
    ['km', /unit/],
    ['nHz', /unit/],
    ['Msun', /unit/],
    ['Mpc', /unit/],
    ['kpc', /unit/],
    ['Gyr', /unit/],
    ['sqrt', /function formulas can call/],
    ['logGrid', /built-in/],
    ['evaluate', /formula language/],
    ['import', /reserved/],
    ['x'.repeat(65), /at most 64/],
  ];
  for (const [name, reason] of refused) {
    it(`refuses ${JSON.stringify(name.length > 10 ? name.slice(0, 10) + '...' : name)}`, () => {
      const builtinNames = new Set(new Sheet().builtins().map((b) => b.name));
      const v = checkCellName(name, builtinNames);
      expect(v.ok).toBe(false);
      expect(v.reason).toMatch(reason);
      // the suggestion is itself a valid name
      expect(checkCellName(v.suggestion, builtinNames).ok).toBe(true);
    });
  }

  it('suggests trade alternatives for unit letters', () => {
    expect(checkCellName('T').suggestion).toBe('T_span');
    expect(checkCellName('e').suggestion).toBe('ecc');
  });

  it('the sheet throws SheetEditError with reason and suggestion', () => {
    const s = new Sheet();
    try {
      s.setCell({ name: 'Mpc', formula: '1' });
      throw new Error('accepted');
    } catch (e) {
      expect(e).toBeInstanceOf(SheetEditError);
      expect((e as SheetEditError).message).toMatch(/Mpc cannot be a cell name/);
      expect((e as SheetEditError).suggestion).toBeTruthy();
    }
    expect(s.cells()).toEqual([]);
  });

  it('lists function and available names for completion', () => {
    expect(allFunctionNames()).toContain('logGrid');
    expect(allFunctionNames()).toContain('sqrt');
    expect(allFunctionNames()).not.toContain('evaluate');
    const s = new Sheet({ cells: [{ name: 'rate_norm', formula: '1' }] });
    expect(availableNames(s)).toContain('rate_norm');
    expect(availableNames(s)).toContain('pi');
  });
});
