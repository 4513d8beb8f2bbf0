// Utility built-ins. Expected grids are computed here by an independent formula:
// log grid x_i = lo * (hi/lo)^(i/(n-1)), linear grid x_i = lo + i (hi-lo)/(n-1).
import { describe, expect, it } from 'vitest';
import type { Matrix, Unit } from 'mathjs';
import { sheetOf } from './helpers';

const siValues = (v: unknown) => ((v as Matrix).toArray() as unknown[]).map((x) => (typeof x === 'number' ? x : (x as Unit & { value: number }).value));

describe('logGrid and linGrid', () => {
  it('logGrid spaces points evenly in log and keeps the unit, ends exact', () => {
    const s = sheetOf({ lo_in: '1 nHz', hi_in: '100 nHz', grid1: 'logGrid(lo_in, hi_in, 7)' });
    const got = siValues(s.value('grid1'));
    const lo = (s.value('lo_in') as Unit & { value: number }).value; // the ends are the inputs themselves
    const hi = (s.value('hi_in') as Unit & { value: number }).value;
    expect(got[0]).toBe(lo);
    expect(got[6]).toBe(hi);
    got.forEach((x, i) => expect(Math.abs(x / (lo * Math.pow(hi / lo, i / 6)) - 1)).toBeLessThan(1e-14));
    const first = ((s.value("grid1") as Matrix).toArray() as unknown as Unit[])[0];
    expect(first.formatUnits()).toBe('nHz');
  });

  it('linGrid spaces points evenly, plain numbers and quantities', () => {
    const s = sheetOf({ grid1: 'linGrid(0, 1, 5)', grid2: 'linGrid(1 yr, 3 yr, 3)' });
    expect(siValues(s.value('grid1'))).toEqual([0, 0.25, 0.5, 0.75, 1]);
    expect(siValues(s.value('grid2'))).toEqual([1, 2, 3].map((k) => k * 31557600)); // Julian year
  });

  it('refuses bad arguments, naming the function and argument', () => {
    const s = sheetOf({
      bad1: 'logGrid(0 nHz, 1 nHz, 4)',
      bad2: 'logGrid(1 nHz, 1 Mpc, 4)',
      bad3: 'linGrid(0, 1, 2.5)',
      bad4: 'linGrid(0, 1, 1e9)',
      bad5: 'logGrid(1, 10 nHz, 3)',
    });
    const msg = (n: string) => {
      const st = s.state(n);
      return st.status === 'error' ? `${st.error.kind}: ${st.error.message}` : 'no error';
    };
    expect(msg('bad1')).toMatch(/^domain: bad1: argument lo of logGrid must be positive/);
    expect(msg('bad2')).toMatch(/^unit: bad2: argument hi of logGrid must have the same dimension/);
    expect(msg('bad3')).toMatch(/argument n of linGrid must be a whole number/);
    expect(msg('bad4')).toMatch(/argument n of linGrid/);
    expect(msg('bad5')).toMatch(/^unit: /);
  });
});

describe('inUnit', () => {
  it('gives the plain number of a quantity in a unit (pc = 648000/pi au, IAU 2015 B2)', () => {
    const s = sheetOf({ x1: 'inUnit(1 Mpc, pc)', x2: 'inUnit(3 km, 1 m)', x3: 'inUnit(1 pc, au)', bad1: 'inUnit(1 Mpc, s)', bad2: 'inUnit(3, m)' });
    expect(s.value('x1')).toBeCloseTo(1e6, 6);
    expect(s.value('x2')).toBe(3000);
    expect(s.value('x3')).toBeCloseTo(648000 / Math.PI, 6);
    expect(s.state('bad1').status).toBe('error');
    expect(s.state('bad2').status).toBe('error');
  });
});
